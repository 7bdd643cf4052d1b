/** The job (repair order) schema, shared by the new-job form and the jobs route. */
import { z } from 'zod';
import { vehicleSchema } from './vehicle';

export const JOB_STATUSES = ['open', 'waiting', 'done'] as const;

export const jobSchema = z
  .object({
    repairOrder: z
      .string()
      .trim()
      .min(1, 'Enter the repair-order number.')
      .max(30, 'Keep the repair-order number under 30 characters.')
      .refine((v) => ![...v].some((ch) => ch.charCodeAt(0) < 32 || ch.charCodeAt(0) === 127), 'Write the repair-order number on one line, without tabs or line breaks.'),
    odometer: z.preprocess(
      (v) => (v === '' || v === null ? undefined : v),
      z.coerce.number().int('The odometer reading is a whole number.').min(0, 'The odometer cannot be negative.').max(3_000_000, 'That odometer reading is too large.').optional(),
    ),
    odometerUnit: z.enum(['km', 'mi']).default('km'),
    concern: z.string().trim().min(3, "Write the customer's concern in their words.").max(2000, 'Keep the concern under 2,000 characters.'),
    vehicleId: z.string().optional(),
    vehicle: vehicleSchema.optional(),
  })
  .refine((j) => !!j.vehicleId !== !!j.vehicle, { message: 'Choose a vehicle from the list or enter a new one.', path: ['vehicle'] });

export const jobUpdateSchema = z.object({
  status: z.enum(JOB_STATUSES, { message: 'The status is open, waiting or done.' }).optional(),
  concern: z.string().trim().min(3).max(2000).optional(),
  odometer: z.coerce.number().int().min(0).max(3_000_000).optional(),
});

export const listQuerySchema = z.object({
  q: z.string().trim().max(100).optional(),
  status: z.enum([...JOB_STATUSES, 'all']).default('all'),
});

export type JobInput = z.input<typeof jobSchema>;
export type JobValues = z.output<typeof jobSchema>;
