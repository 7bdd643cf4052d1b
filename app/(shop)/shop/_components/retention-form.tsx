'use client';
/**
 * Owners choose how long a done job keeps its captures and analyses: for ever, or a number of days. The number
 * is a draft while typed; the one rule (domain/retention.ts) says what is wrong, here and on the server.
 */
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice } from '@/components/ui/field';
import { call, errorText } from '@/components/data/api';
import { RETENTION_DAYS, retentionInput, retentionWords } from '@/domain/retention';
import { withoutDigitGroups } from '@/domain/typed-number';
import { setRetention } from '@/server/api/routes/shop';

interface Draft {
  keep: 'forever' | 'days';
  days: string;
}

export function RetentionForm({ days, lastSweep }: { days: number | null; lastSweep: string | null }) {
  const router = useRouter();
  const [note, setNote] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const { register, handleSubmit, formState, watch, setError } = useForm<Draft>({ defaultValues: { keep: days === null ? 'forever' : 'days', days: days === null ? '730' : String(days) } });
  const keep = watch('keep');
  return (
    <form
      className="flex flex-col gap-3"
      onSubmit={handleSubmit(async (draft) => {
        setNote(null);
        const typed = draft.days.trim();
        const parsed = retentionInput.safeParse({ retentionDays: draft.keep === 'forever' ? null : typed === '' ? Number.NaN : Number(withoutDigitGroups(typed)) });
        if (!parsed.success) return setError('days', { message: parsed.error.issues[0]?.message });
        try {
          await call(setRetention, { json: parsed.data });
          setNote({ tone: 'ok', text: `Saved: captures and analyses are ${retentionWords(parsed.data.retentionDays)}.` });
          router.refresh();
        } catch (e) {
          setNote({ tone: 'error', text: errorText(e, 'That did not save; try again.') });
        }
      })}
    >
      <p className="text-sm text-muted">
        Signed reports (the PDF and the customer’s page) and this shop’s activity are always kept. Now: {retentionWords(days)}.
        {lastSweep ? ` The last sweep ran ${lastSweep}.` : ' No sweep has run yet; one runs each day.'}
      </p>
      <fieldset className="flex flex-col gap-2">
        <legend className="font-bold">Captures and analyses of done jobs</legend>
        <label className="flex items-center gap-2">
          <input type="radio" value="forever" {...register('keep')} /> Keep them for ever
        </label>
        <label className="flex items-center gap-2">
          <input type="radio" value="days" {...register('keep')} /> Remove them a number of days after the job is done
        </label>
      </fieldset>
      {keep === 'days' && (
        <Field id="retention-days" label="Days after the job is done" error={formState.errors.days?.message} hint={`${RETENTION_DAYS.min} to ${RETENTION_DAYS.max} days; 730 is two years.`}>
          <Input id="retention-days" inputMode="numeric" invalid={!!formState.errors.days} {...register('days')} />
        </Field>
      )}
      {note && <Notice tone={note.tone}>{note.text}</Notice>}
      <Button type="submit" disabled={formState.isSubmitting}>
        Save retention
      </Button>
    </form>
  );
}
