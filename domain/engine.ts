/**
 * The engine, declared once: what a vehicle or profile stores, what the vehicle form takes (typed text), and what
 * an analysis runs with. Built on the analysis engine's own names (signal: layouts, numberings, the cylinder limit
 * and the firing-order rules); the vehicle, profile and analysis-settings schemas, the routes' answers and the
 * pages derive from here.
 */
import { z } from 'zod';
import { BANK_LAYOUTS, firingIntervalsProblem, firingOrderProblem, MAX_CYLINDERS, NUMBERINGS } from '@/signal';

const cylinders = z.number().int('The cylinder count is a whole number.').min(1, 'An engine has at least 1 cylinder.').max(MAX_CYLINDERS, `Crankprint handles up to ${MAX_CYLINDERS} cylinders.`);
const layout = z.enum(BANK_LAYOUTS, { message: 'Choose inline, V or flat.' });
const numbering = z.enum(NUMBERINGS).default('along-crank');
const intervalsDeg = z.array(z.number().positive()).optional();
const litres = z.number().min(0.05, 'Displacement is in litres, for example 2.0.').max(20, 'Displacement is in litres, for example 2.0.');
const displacementL = litres.optional();

/** The firing order and intervals against the cylinder count: one sentence each, on their own fields. */
function checkOrder(e: { cylinders: number; firingOrder: number[]; intervalsDeg?: number[] }, ctx: z.RefinementCtx): void {
  const order = firingOrderProblem(e.firingOrder, e.cylinders);
  if (order) ctx.addIssue({ code: 'custom', path: ['firingOrder'], message: order });
  const intervals = e.intervalsDeg && firingIntervalsProblem(e.intervalsDeg, e.cylinders);
  if (intervals) ctx.addIssue({ code: 'custom', path: ['intervalsDeg'], message: intervals });
}

/** The engine as stored with a vehicle or profile, and as the routes answer it: a record stored without a numbering is along the crank. */
export const engineRecordSchema = z
  .object({ cylinders, layout, numbering: z.enum(NUMBERINGS).optional(), firingOrder: z.array(z.number().int()), intervalsDeg, displacementL })
  .superRefine(checkOrder);

export type EngineSpec = z.input<typeof engineRecordSchema>;

/** The engine as the vehicle form and the API take it: numbers may come as text, the firing order as "1-3-4-2". */
export const engineSchema = z
  .object({
    cylinders: z.coerce.number().pipe(cylinders),
    layout,
    numbering,
    firingOrder: z.union([
      z
        .string()
        .trim()
        .regex(/^\d{1,2}([\s,-]+\d{1,2})*$/, 'Write the firing order as cylinder numbers, for example 1-3-4-2.')
        .transform((s) => s.split(/[\s,-]+/).map(Number)),
      z.array(z.number().int()),
    ]),
    intervalsDeg,
    displacementL: z.coerce.number().pipe(litres).optional(),
  })
  .superRefine(checkOrder);

/** The engine an analysis runs with (analysis settings): the layout defaults to inline. */
export const engineSettingsSchema = z
  .object({ cylinders, firingOrder: z.array(z.number().int().min(1).max(MAX_CYLINDERS)), intervalsDeg, layout: layout.default('inline'), numbering })
  .superRefine(checkOrder);

/** What a vehicle or profile stores of a parsed engine (nothing the form adds). */
export function engineSpec(e: z.output<typeof engineSchema>): EngineSpec {
  return { cylinders: e.cylinders, layout: e.layout, numbering: e.numbering, firingOrder: e.firingOrder, intervalsDeg: e.intervalsDeg, displacementL: e.displacementL };
}

