'use client';
/**
 * The cautions, before anything is recorded or analysed for a job: on the job page before its first capture, and
 * in a capture's workspace reached directly. Read once per job by each member on each device (kept in this
 * browser's storage under the member and the job), so every new job shows them again.
 */
import { useEffect, useState } from 'react';
import { Button } from '@/components/ui/button';
import { CAUTIONS } from '@/domain/cautions';

export function CautionsGate({ userId, jobId, children }: { userId: string; jobId: string; children: React.ReactNode }) {
  const key = `crankprint-cautions-read-${userId}-${jobId}`;
  const [read, setRead] = useState<boolean | null>(null);
  useEffect(() => setRead(localStorage.getItem(key) === '1'), [key]);
  if (read === null) return null;
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
      <Button
        className="mt-4"
        onClick={() => {
          localStorage.setItem(key, '1');
          setRead(true);
        }}
      >
        I have read this — go on
      </Button>
    </div>
  );
}
