/**
 * How long a shop keeps the captures and analyses of a job once it is done. Signed reports (their snapshots, from
 * which the PDF and the customer's page are drawn) and the activity trail are kept whatever the setting: they are
 * the shop's record. Unset keeps everything for ever.
 */
import { z } from 'zod';

export const RETENTION_DAYS = { min: 30, max: 3650 } as const;

export const retentionInput = z.object({
  retentionDays: z
    .number({ message: 'Give the number of days, or choose to keep everything.' })
    .int('Give a whole number of days.')
    .min(RETENTION_DAYS.min, `Keep captures at least ${RETENTION_DAYS.min} days after a job is done: a shorter time would remove them before a comeback or a question about the bill.`)
    .max(RETENTION_DAYS.max, `Keep captures at most ${RETENTION_DAYS.max} days (ten years); to keep them longer, choose to keep everything.`)
    .nullable(),
});
export type RetentionValues = z.output<typeof retentionInput>;

/** The setting in words, for the shop page and the activity line. */
export function retentionWords(days: number | null): string {
  if (days === null) return 'kept for ever';
  if (days % 365 === 0) return `kept ${days / 365} year${days === 365 ? '' : 's'} after a job is done`;
  return `kept ${days} days after a job is done`;
}
