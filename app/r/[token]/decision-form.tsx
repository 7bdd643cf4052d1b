'use client';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice } from '@/components/ui/field';
import { ApiError, call } from '@/components/data/api';
import { answerDecision } from '@/server/api/routes/reports';

export function DecisionForm({ token, revision }: { token: string; revision: number }) {
  const [name, setName] = useState('');
  const [done, setDone] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const send = async (decision: 'approve' | 'decline') => {
    setError(null);
    try {
      // This page sends no Referer elsewhere; to our own server it names itself, for the origin check.
      await call(answerDecision, { json: { token, decision, typedName: name }, referrerPolicy: 'same-origin' });
      setDone(decision === 'approve' ? 'Thank you: you approved the recommended next step. The shop has been told.' : 'Thank you: you declined for now. The shop has been told.');
    } catch (e) {
      setError(e instanceof ApiError ? (e.fields.typedName ?? e.message) : 'That did not go through; try again.');
    }
  };
  if (done) return <Notice tone="ok">{done}</Notice>;
  return (
    <div className="mt-4 flex flex-col gap-2">
      <Field id="typed-name" label="Your name" error={error ?? undefined} hint={`Your answer is recorded against revision ${revision} of the report.`}>
        <Input id="typed-name" autoComplete="name" value={name} onChange={(e) => setName(e.target.value)} />
      </Field>
      <div className="flex flex-wrap gap-2">
        <Button onClick={() => send('approve')}>Approve the next step</Button>
        <Button variant="secondary" onClick={() => send('decline')}>
          Not now
        </Button>
      </div>
    </div>
  );
}
