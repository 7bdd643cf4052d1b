'use client';
/**
 * An owner removes a job for good: its captures (and their stored files), analyses, report revisions and share
 * links. Typing the repair-order number confirms it, so a slip of the finger removes nothing.
 */
import { useRouter } from 'next/navigation';
import { useId, useState } from 'react';
import { Button } from '@/components/ui/button';
import { useRemoveJob } from '@/components/data/jobs/remove-job-mutation';

/** A report revision on another job that includes one of this job's analyses. */
export interface CitingRevision {
  jobId: string;
  repairOrder: string;
  revision: number;
  status: 'draft' | 'signed';
}

export function RemoveJob({ jobId, repairOrder, captures, citedBy }: { jobId: string; repairOrder: string; captures: number; citedBy: CitingRevision[] }) {
  const signed = citedBy.filter((r) => r.status === 'signed');
  const drafts = citedBy.filter((r) => r.status === 'draft');
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
      {citedBy.length > 0 && (
        <div data-testid="removal-citations" className="flex flex-col gap-1">
          {signed.length > 0 && (
            <p>
              Signed reports that include its analyses keep them exactly as signed: <Revisions list={signed} />.
            </p>
          )}
          {drafts.length > 0 && (
            <p>
              Draft reports that include its analyses will no longer show them: <Revisions list={drafts} />.
            </p>
          )}
        </div>
      )}
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

function Revisions({ list }: { list: CitingRevision[] }) {
  return (
    <>
      {list.map((r, i) => (
        <span key={`${r.jobId}:${r.revision}`}>
          {i > 0 ? ', ' : ''}
          <a className="figures font-bold underline" href={`/jobs/${r.jobId}/report`}>
            {r.repairOrder}
          </a>{' '}
          revision {r.revision}
        </span>
      ))}
    </>
  );
}
