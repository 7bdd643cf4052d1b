'use client';
/**
 * An owner removes a job for good: its captures (and their stored files), analyses, report revisions and share
 * links. Typing the repair-order number confirms it, so a slip of the finger removes nothing.
 */
import { useRouter } from 'next/navigation';
import { useId, useState } from 'react';
import { Button } from '@/components/ui/button';
import { useRemoveJob } from '@/components/data/jobs/remove-job-mutation';

export function RemoveJob({ jobId, repairOrder, captures }: { jobId: string; repairOrder: string; captures: number }) {
  const [open, setOpen] = useState(false);
  const [typed, setTyped] = useState('');
  const remove = useRemoveJob();
  const router = useRouter();
  const inputId = useId();
  if (!open) {
    return (
      <Button variant="secondary" onClick={() => setOpen(true)}>
        Remove this job…
      </Button>
    );
  }
  return (
    <form
      className="flex flex-col gap-3 rounded-xl border border-danger p-4"
      onSubmit={(e) => {
        e.preventDefault();
        remove.mutate(jobId, { onSuccess: () => router.push('/jobs') });
      }}
    >
      <p>
        This removes the job{captures === 0 ? '' : captures === 1 ? ', its capture and the file' : `, its ${captures} captures and their files`}, every saved
        analysis, every report revision and every customer link. It cannot be undone; the shop activity keeps a line saying who removed it. A report already sent to the customer
        stays in their inbox.
      </p>
      <label htmlFor={inputId} className="font-bold">
        Type the repair-order number <span className="figures">{repairOrder}</span> to confirm
      </label>
      <input id={inputId} className="min-h-touch rounded-lg border border-line bg-paper px-3" value={typed} onChange={(e) => setTyped(e.target.value)} autoComplete="off" />
      {remove.error && (
        <p role="alert" className="text-danger">
          {remove.error.message}
        </p>
      )}
      <div className="flex gap-2">
        <Button type="submit" variant="danger" disabled={typed.trim() !== repairOrder.trim() || remove.isPending}>
          {remove.isPending ? 'Removing…' : 'Remove the job'}
        </Button>
        <Button type="button" variant="ghost" onClick={() => (setOpen(false), setTyped(''))}>
          Keep it
        </Button>
      </div>
    </form>
  );
}
