/**
 * The analysis's limits, written once: each one's default and the open range it must lie in, with the sentences
 * that say so. The engine (analyze.ts), the settings schema (domain/analysis-settings.ts) and the command line
 * (scripts/analyze.ts) read them from here.
 */
export interface LimitRule {
  /** As people say it: "low limit". */
  name: string;
  /** What kind of number: "a percentage", "a number of points". */
  kind: string;
  default: number;
  /** The value must be above this and below `below`. */
  above: number;
  below: number;
  /** The command line's flag. */
  flag: string;
}

export const LIMITS = {
  lowLimitPercent: { name: 'low limit', kind: 'a percentage', default: 90, above: 0, below: 100, flag: '--low-limit' },
  spreadLimitPercent: { name: 'spread limit', kind: 'a number of points', default: 10, above: 0, below: 100, flag: '--spread-limit' },
  highLimitPercent: { name: 'upper limit', kind: 'a percentage', default: 110, above: 100, below: 300, flag: '--high-limit' },
} as const satisfies Record<string, LimitRule>;

export type LimitKey = keyof typeof LIMITS;

/** "The low limit is a percentage above 0." / "… below 100." */
export function limitSentence(key: LimitKey, side: 'above' | 'below'): string {
  const r = LIMITS[key];
  return `The ${r.name} is ${r.kind} ${side} ${r[side]}.`;
}

/** What is wrong with a value for a limit, in a sentence, or null when it is inside its range. */
export function limitProblem(key: LimitKey, value: number): string | null {
  const r = LIMITS[key];
  if (!(value > r.above)) return limitSentence(key, 'above');
  if (!(value < r.below)) return limitSentence(key, 'below');
  return null;
}
