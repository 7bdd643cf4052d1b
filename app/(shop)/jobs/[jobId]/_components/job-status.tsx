'use client';
/** Closing a job (done, with a reason) or reopening it; the other moves follow the report on their own. */
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { call, errorText } from '@/components/data/api';
import { jobKeys } from '@/components/data/jobs/keys';
import { Button } from '@/components/ui/button';
import { Field, Input } from '@/components/ui/field';
import { moveJob } from '@/server/api/routes/jobs';

export function JobStatusControl({ jobId, status }: { jobId: string; status: string }) {
  const [reason, setReason] = useState('');
  const router = useRouter();
  const qc = useQueryClient();
  const move = useMutation({
    mutationFn: (body: { status: 'open' | 'done'; reason?: string }) => call(moveJob, { params: { jobId }, json: body }),
    onSuccess: async () => {
      setReason('');
      await qc.invalidateQueries({ queryKey: jobKeys.all });
      router.refresh();
    },
  });
  const error = move.error ? errorText(move.error) : undefined;
  if (status === 'done') {
    return (
      <div className="flex flex-col items-start gap-2">
        <Button variant="secondary" onClick={() => move.mutate({ status: 'open' })} disabled={move.isPending}>
          Reopen the job
        </Button>
        {error && <p className="text-sm font-bold text-danger">{error}</p>}
      </div>
    );
  }
  return (
    <form
      className="flex flex-wrap items-end gap-2"
      onSubmit={(ev) => {
        ev.preventDefault();
        move.mutate({ status: 'done', reason });
      }}
    >
      <div className="min-w-64 flex-1">
        <Field id="done-reason" label="Why the job is done" error={error}>
          <Input id="done-reason" value={reason} maxLength={500} placeholder="Repaired and retested" onChange={(ev) => setReason(ev.target.value)} />
        </Field>
      </div>
      <Button type="submit" className="mb-6" disabled={reason.trim().length < 3 || move.isPending}>
        Mark the job done
      </Button>
    </form>
  );
}
