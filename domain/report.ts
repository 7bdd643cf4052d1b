/** The report's editable content: which analyses, the test conditions, interpretation, next steps, sign-off name. */
import { z } from 'zod';
import { gaugeSchema } from './gauge-pressures';

const optionalNumber = (min: number, max: number, message: string) =>
  z.preprocess((v) => (v === '' || v === null || v === undefined ? undefined : v), z.coerce.number({ message }).min(min, message).max(max, message).optional());
const optionalText = (max: number) =>
  z.preprocess((v) => (typeof v === 'string' && v.trim() === '' ? undefined : v), z.string().trim().max(max, `Keep this under ${max} characters.`).optional());

export const THROTTLE = ['closed', 'wide-open'] as const;

export const conditionsSchema = z.object({
  coolantTempC: optionalNumber(-40, 150, 'Coolant temperature must be between −40 and 150 °C (−40 and 302 °F).'),
  batteryRestV: optionalNumber(0, 30, 'Battery rest voltage is in volts, for example 12.6.'),
  lowestCrankingV: optionalNumber(0, 30, 'Lowest cranking voltage is in volts, for example 10.2.'),
  throttle: z.preprocess((v) => (v === '' ? undefined : v), z.enum(THROTTLE, { message: 'Choose closed or wide open.' }).optional()),
  fuelDisabledBy: optionalText(200),
  syncSource: optionalText(200),
  numbering: optionalText(200),
});

export const reportContentSchema = z.object({
  analysisIds: z.array(z.string()).max(4, 'Include at most four analyses.').default([]),
  conditions: conditionsSchema.default({}),
  interpretation: z.string().max(5000, 'Keep the interpretation under 5,000 characters.').default(''),
  nextSteps: z.array(z.string().trim().min(1).max(300)).max(10).default([]),
  technicianName: optionalText(120),
  /** One cylinder's gauge reading and the specification, for gauge-equivalent pressures (domain/gauge-pressures.ts). */
  gauge: gaugeSchema.optional(),
});

export type ReportContent = z.output<typeof reportContentSchema>;
export type ReportContentInput = z.input<typeof reportContentSchema>;
export type Conditions = z.output<typeof conditionsSchema>;
