/**
 * Route inputs that are not an entity's schema (those live in db/validators and domain/): one zod schema per
 * route, declared in the routes' contracts (server/api/routes/).
 */
import { z } from 'zod';
import { reportContentSchema } from '@/domain/report';
import { analysisSettingsSchema } from '@/domain/analysis-settings';
import { engineSchema } from '@/domain/engine';
import { timeZoneSchema } from '@/domain/shop-settings';
import { ROLE_NAMES } from '@/server/permissions';

const role = z.enum(ROLE_NAMES, { message: 'Choose owner, technician or advisor.' });

export const saveAnalysisInput = z.object({ settings: analysisSettingsSchema });
/** The revision and version an editor loaded (0 and 0 before the job had a report). */
export const draftBaseInput = z.object({ revision: z.number().int().min(0).max(1_000_000), version: z.number().int().min(0).max(1_000_000_000) });
/** A draft save: the content, and `base` (what the editor loaded) so that a save on a revision changed meanwhile is a 409. */
export const saveReportInput = reportContentSchema.extend({ base: draftBaseInput.optional() });
export const signReportInput = z.object({ reportId: z.string(), version: z.number().int().min(0).max(1_000_000_000).optional() });
export const createProfileInput = z.object({ label: z.string().trim().min(2, 'Name the profile, for example "Shop V8 bank-by-bank".').max(80), engine: engineSchema });
export const createShopInput = z.object({
  name: z.string().trim().min(2, 'Enter the shop name.').max(80, 'Keep the shop name under 80 characters.'),
  timeZone: timeZoneSchema.optional(),
});
export const memberRoleInput = z.object({ role });
export const inviteInput = z.object({ email: z.string().trim().toLowerCase().email('Enter an e-mail address such as name@example.com.'), role });
export const shareInput = z.object({ days: z.coerce.number().int().min(1, 'A link lasts at least a day.').max(60, 'A link lasts at most 60 days.').default(14) });
export const sendReportInput = z.object({
  to: z.string().trim().toLowerCase().email('Enter the e-mail address to send the report to.'),
  note: z.string().trim().max(1000, 'Keep the note under 1,000 characters.').optional(),
  /** With a new customer link (14 days) in the e-mail, for the customer to read the result and answer. */
  link: z.boolean().default(false),
});
export const decisionInput = z.object({
  token: z.string().max(100),
  decision: z.enum(['approve', 'decline'], { message: 'Choose approve or decline.' }),
  typedName: z
    .string()
    .trim()
    .max(120)
    // At least two letters you can see: spaces, zero-width and other invisible characters do not sign.
    .refine((t) => (t.match(/\p{L}/gu) ?? []).length >= 2, 'Type your name to sign your answer.'),
});

/** Route parameters: a record id from the path. */
export const idParam = <N extends string>(name: N) => z.object({ [name]: z.string() } as Record<N, z.ZodString>);
