/** One zod schema per entity, shared by the form, the route handler and the seed (the engine's: domain/engine.ts). */
import { z } from 'zod';
import { engineSchema } from './engine';
import { vinProblem } from './vin';

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

/** A vehicle as people say it: year, make and model, whichever are known (on pages, in e-mail and in the PDF). */
export function vehicleTitle(v: { year: number | null; make: string; model: string }): string {
  return [v.year, v.make, v.model].filter(Boolean).join(' ');
}

/** An engine in one line, the same on pages and in the PDF: "4 cylinders, inline, 2 L, firing order 1-3-4-2". */
export function engineLine(e: { cylinders: number; layout: string; firingOrder: number[]; displacementL?: number }): string {
  return `${e.cylinders} cylinders, ${e.layout === 'v' ? 'V' : e.layout}${e.displacementL ? `, ${e.displacementL} L` : ''}, firing order ${e.firingOrder.join('-')}`;
}
