/** Analysis settings as the workspace sends them and the server re-runs them. */
import { z } from 'zod';
import { type AnalysisSettings, type ImportOptions, LIMITS, type LimitKey, limitSentence, METHOD_CHOICES, parseWheel } from '@/signal';
import { engineSettingsSchema, type EngineSpec } from './engine';
import { type StartingLimits, startingLimitsSchema } from './starting-limits';

export const CHANNEL_ROLES = ['time', 'current', 'crank', 'sync', 'rpm', 'battery', 'level', 'toothTimes', 'toothPeriod', 'ignore'] as const;

/** A limit with its range, default and sentences (signal/limits.ts). */
const limit = (key: LimitKey) => z.number().gt(LIMITS[key].above, limitSentence(key, 'above')).lt(LIMITS[key].below, limitSentence(key, 'below')).default(LIMITS[key].default);

export const analysisSettingsSchema = z
  .object({
    engine: engineSettingsSchema,
    method: z.enum(METHOD_CHOICES, { error: `The method is one of ${METHOD_CHOICES.join(', ')}.` }).default('auto'),
    teeth: z
      .string()
      .max(200, 'A wheel is written in at most 200 characters.')
      .refine((t) => parseWheel(t) !== null, 'Write the wheel like 60-2, or as runs and gaps such as 36:15/2,14/1,3/1.')
      .optional(),
    lowLimitPercent: limit('lowLimitPercent'),
    spreadLimitPercent: limit('spreadLimitPercent'),
    highLimitPercent: limit('highLimitPercent'),
    window: z.object({ startS: z.number(), endS: z.number() }).refine((w) => w.endS > w.startS, 'The cranking window must end after it starts.').optional(),
    rotation: z.number().int('The rotation is a whole number of steps.').min(-16, 'The rotation is at most 16 steps either way.').max(16, 'The rotation is at most 16 steps either way.').default(0),
    sensor: z.enum(['auto', 'hall', 'vr']).default('auto'),
    mapping: z.array(z.enum(CHANNEL_ROLES)).optional(),
    /** The starting-system check: the shop's limits and the conditions it needs. */
    starting: z
      .object({
        temperatureC: z.number().min(-50, 'The air temperature is between −50 and 60 °C.').max(60, 'The air temperature is between −50 and 60 °C.').optional(),
        displacementL: z.number().gt(0, 'The displacement is above 0 litres.').max(30, 'The displacement is at most 30 litres.').optional(),
        diesel: z.boolean().optional(),
        limits: startingLimitsSchema.partial().optional(),
      })
      .optional(),
    sampleRateHz: z.number().positive().optional(),
  });

export type AnalysisSettingsInput = z.input<typeof analysisSettingsSchema>;
export type AnalysisSettingsValues = z.output<typeof analysisSettingsSchema>;

/** The settings an analysis starts from for a vehicle's engine and the shop's starting limits (the schema's defaults for the rest). */
export function settingsForEngine(e: EngineSpec, startingLimits?: StartingLimits): AnalysisSettingsValues {
  return analysisSettingsSchema.parse({
    engine: { cylinders: e.cylinders, firingOrder: e.firingOrder, intervalsDeg: e.intervalsDeg, layout: e.layout, numbering: e.numbering ?? 'along-crank' },
    starting: e.displacementL || startingLimits ? { displacementL: e.displacementL, limits: startingLimits } : undefined,
  });
}

/** How to read the file, from stored settings (kept apart from the analysis settings by the engine). */
export function importOptions(s: AnalysisSettingsValues): ImportOptions {
  return { mapping: s.mapping, sampleRateHz: s.sampleRateHz };
}

/** The engine's own settings from stored ones: the same call in the worker, on the server and in the seed. */
export function engineSettings(s: AnalysisSettingsValues): AnalysisSettings {
  return {
    engine: s.engine,
    method: s.method,
    teeth: s.teeth ? (parseWheel(s.teeth) ?? undefined) : undefined,
    lowLimitPercent: s.lowLimitPercent,
    spreadLimitPercent: s.spreadLimitPercent,
    highLimitPercent: s.highLimitPercent,
    window: s.window,
    rotation: s.rotation,
    sensor: s.sensor,
    starting: s.starting,
  };
}
