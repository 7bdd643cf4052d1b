/** One zod schema per entity, shared by the form, the route handler and the seed. */
import { z } from 'zod';
import { firingIntervalsProblem, firingOrderProblem } from '@/signal';
import { vinProblem } from './vin';

const firingOrderText = z
  .string()
  .trim()
  .regex(/^\d{1,2}([\s,-]+\d{1,2})*$/, 'Write the firing order as cylinder numbers, for example 1-3-4-2.')
  .transform((s) => s.split(/[\s,-]+/).map(Number));

export const engineSchema = z
  .object({
    cylinders: z.coerce.number().int('The cylinder count is a whole number.').min(1, 'An engine has at least 1 cylinder.').max(16, 'Crankprint handles up to 16 cylinders.'),
    layout: z.enum(['inline', 'v', 'flat'], { message: 'Choose inline, V or flat.' }),
    numbering: z.enum(['along-crank', 'bank-by-bank']).default('along-crank'),
    firingOrder: z.union([firingOrderText, z.array(z.number().int())]),
    intervalsDeg: z.array(z.number().positive()).optional(),
    displacementL: z.coerce.number().min(0.05, 'Displacement is in litres, for example 2.0.').max(20, 'Displacement is in litres, for example 2.0.').optional(),
  })
  .superRefine((e, ctx) => {
    const order = firingOrderProblem(e.firingOrder, e.cylinders);
    if (order) ctx.addIssue({ code: 'custom', path: ['firingOrder'], message: order });
    const intervals = e.intervalsDeg && firingIntervalsProblem(e.intervalsDeg, e.cylinders);
    if (intervals) ctx.addIssue({ code: 'custom', path: ['intervalsDeg'], message: intervals });
  });

const currentYear = new Date().getFullYear();

export const vehicleSchema = z.object({
  vin: z
    .string()
    .trim()
    .toUpperCase()
    .optional()
    .transform((v) => (v ? v : undefined))
    .superRefine((v, ctx) => {
      const problem = v ? vinProblem(v) : null;
      if (problem) ctx.addIssue({ code: 'custom', message: problem });
    }),
  year: z.preprocess(
    (v) => (v === '' || v === null ? undefined : v),
    z.coerce.number().int('The year is a whole number.').min(1950, 'Enter a model year from 1950 on.').max(currentYear + 2, `Enter a model year up to ${currentYear + 2}.`).optional(),
  ),
  make: z.string().trim().min(1, 'Enter the make.').max(60, 'Keep the make under 60 characters.'),
  model: z.string().trim().min(1, 'Enter the model.').max(60, 'Keep the model under 60 characters.'),
  engine: engineSchema,
});

export type VehicleInput = z.input<typeof vehicleSchema>;
export type VehicleValues = z.output<typeof vehicleSchema>;
