/** The job (repair order) schema, shared by the new-job form and the jobs route. */
import { z } from 'zod';
import { withoutDigitGroups } from './typed-number';
import { vehicleSchema } from './vehicle';
import { DISTANCE_UNITS } from './shop-settings';

/**
 * Where a job stands: open (being worked on) → waiting (a signed report went to the customer) → approved or
 * declined (the customer answered) → done (closed by a member, with a reason); a done job can be reopened.
 */
export const JOB_STATUSES = ['open', 'waiting', 'approved', 'declined', 'done'] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];

/** A member moves a job: done (with a reason) or back to open. */
export const jobStatusInput = z.object({
  status: z.enum(['open', 'done'], { message: 'A job is set to done or reopened.' }),
  reason: z.string().trim().max(500, 'Keep the reason under 500 characters.').optional(),
});

export const jobSchema = z
  .object({
    repairOrder: z
      .string()
      .trim()
      .min(1, 'Enter the repair-order number.')
      .max(30, 'Keep the repair-order number under 30 characters.')
      .refine((v) => ![...v].some((ch) => ch.charCodeAt(0) < 32 || ch.charCodeAt(0) === 127), 'Write the repair-order number on one line, without tabs or line breaks.'),
    odometer: z.preprocess(
      (v) => (v === '' || v === null ? undefined : withoutDigitGroups(v)),
      z.coerce.number().int('The odometer reading is a whole number.').min(0, 'The odometer cannot be negative.').max(3_000_000, 'That odometer reading is too large.').optional(),
    ),
    odometerUnit: z.enum(DISTANCE_UNITS).default('km'),
    concern: z.string().trim().min(3, "Write the customer's concern in their words.").max(2000, 'Keep the concern under 2,000 characters.'),
    vehicleId: z.string().optional(),
    vehicle: vehicleSchema.optional(),
  })
  .refine((j) => !!j.vehicleId !== !!j.vehicle, { message: 'Choose a vehicle from the list or enter a new one.', path: ['vehicle'] });

export const jobUpdateSchema = z.object({
  status: z.enum(JOB_STATUSES, { message: 'The status is open, waiting, approved, declined or done.' }).optional(),
  concern: z.string().trim().min(3).max(2000).optional(),
  odometer: z.coerce.number().int().min(0).max(3_000_000).optional(),
});

export const listQuerySchema = z.object({
  q: z.string().trim().max(100).optional(),
  status: z.enum([...JOB_STATUSES, 'all']).default('all'),
});

export type JobInput = z.input<typeof jobSchema>;
export type JobValues = z.output<typeof jobSchema>;
