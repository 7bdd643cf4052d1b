/**
 * A shop's own starting-system limits, checked the same way in the shop's form and on the server; the defaults
 * and their sources are the engine's (signal/starting/limits.ts).
 */
import { z } from 'zod';
import type { StartingLimits } from '@/signal';
export { DEFAULT_STARTING_LIMITS, LIMIT_SOURCES } from '@/signal';
export type { StartingLimits };

export const startingLimitsSchema = z.object({
  restingMinV: z.number({ message: 'Enter the lowest resting voltage, for example 12.4.' }).min(10, 'The resting voltage limit must be between 10 and 14 V.').max(14, 'The resting voltage limit must be between 10 and 14 V.'),
  crankingMinV: z.number({ message: 'Enter the lowest cranking voltage, for example 9.6.' }).min(6, 'The cranking voltage limit must be between 6 and 12 V.').max(12, 'The cranking voltage limit must be between 6 and 12 V.'),
  internalMaxMilliOhm: z.number({ message: 'Enter the highest battery resistance, for example 20.' }).min(2, 'The battery resistance limit must be between 2 and 100 mΩ.').max(100, 'The battery resistance limit must be between 2 and 100 mΩ.'),
  currentBaseA: z.number({ message: 'Enter the cranking current’s base, for example 80.' }).min(0, 'The cranking current base must be between 0 and 1000 A.').max(1000, 'The cranking current base must be between 0 and 1000 A.'),
  currentPerLitreA: z.number({ message: 'Enter the cranking current per litre, for example 50.' }).min(0, 'The cranking current per litre must be between 0 and 500 A.').max(500, 'The cranking current per litre must be between 0 and 500 A.'),
  crankingMinRpm: z.number({ message: 'Enter the slowest cranking speed, for example 150.' }).min(50, 'The cranking speed limit must be between 50 and 400 rpm.').max(400, 'The cranking speed limit must be between 50 and 400 rpm.'),
});

