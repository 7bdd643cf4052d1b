'use client';
/**
 * The cautions, before anything is recorded or analysed for a job: on the job page before its first capture, and
 * in a capture's workspace reached directly. Read once per job by each member: the server records the reading
 * (in the job's activity), so another device does not ask again and every new job asks once more.
 */
import { useEffect, useState } from 'react';
import { useMutation } from '@tanstack/react-query';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/field';
import { call, errorText } from '@/components/data/api';
import { CAUTIONS } from '@/domain/cautions';
import { readCautions } from '@/server/api/routes/jobs';

export function CautionsGate({ jobId, read: readBefore, children }: { jobId: string; read: boolean; children: React.ReactNode }) {
  const [read, setRead] = useState(readBefore);
  // The gate is drawn by the server: until the page can act on a press, the button says so by being disabled
  // (a press before that would be lost, leaving the cautions on screen).
  const [live, setLive] = useState(false);
  useEffect(() => setLive(true), []);
  const record = useMutation({
    mutationFn: () => call(readCautions, { params: { jobId } }),
    onSuccess: () => setRead(true),
  });
  if (read) return <>{children}</>;
  return (
    <div role="dialog" aria-modal="true" aria-labelledby="cautions-title" className="rounded-2xl border-2 border-brand bg-surface p-6">
      <h2 id="cautions-title" className="text-xl font-bold">
        Before you crank
      </h2>
      <ul className="mt-3 flex list-disc flex-col gap-2 pl-6">
        {CAUTIONS.map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ul>
      <Button className="mt-4" disabled={!live || record.isPending} onClick={() => record.mutate()}>
        I have read this — go on
      </Button>
      {record.isError && (
        <Notice tone="error">{errorText(record.error, 'Could not record that you read the cautions; check the connection and press the button again.')}</Notice>
      )}
    </div>
  );
}
