/**
 * Gauge-equivalent pressures from one gauge reading: each cylinder's relative figure (a share of the healthy
 * cylinders' peak gauge pressure) scaled by the gauged cylinder's reading. The interval combines, on the ratio, the
 * cylinder's own 90 % interval, the gauged cylinder's, and the gauge's stated accuracy. Checked against the
 * specification typed with it: a minimum, and the largest allowed difference between cylinders as a share of the
 * highest (gauge tests: lowest ≥ 75 % of highest, or ≥ 70 % and ≥ 100 psi: factory service information, several
 * makes). Always an estimate: a gauge test on any cylinder that matters confirms it.
 */
import { z } from 'zod';
import type { AnalysisResult } from '@/signal';

export const gaugeSchema = z.object({
  cylinder: z.coerce.number({ message: 'Choose the cylinder the gauge was on.' }).int('Choose the cylinder the gauge was on.').min(1, 'Choose the cylinder the gauge was on.').max(16, 'Choose the cylinder the gauge was on.'),
  /** The reading, kPa (typed in the shop's unit). */
  readingKpa: z.coerce.number({ message: 'Enter the gauge reading.' }).gt(0, 'The gauge reading is above 0.').max(10_000, 'The gauge reading is at most 10,000 kPa (1,450 psi).'),
  /** The gauge's stated accuracy, ± percent of the reading. */
  accuracyPercent: z.coerce.number({ message: 'Enter the gauge’s accuracy, for example 2.' }).min(0, 'The gauge’s accuracy is between 0 and 20 %.').max(20, 'The gauge’s accuracy is between 0 and 20 %.').default(2),
  /** The specification's minimum, kPa. */
  minimumKpa: z.coerce.number({ message: 'Enter the minimum as a number.' }).gt(0, 'The minimum is above 0.').max(10_000, 'The minimum is at most 10,000 kPa.').optional(),
  /** The largest allowed difference between cylinders, percent of the highest. */
  maxDifferencePercent: z.coerce.number({ message: 'Enter the largest difference as a number.' }).gt(0, 'The largest difference is between 0 and 60 %.').max(60, 'The largest difference is between 0 and 60 %.').optional(),
});
export type GaugeReading = z.output<typeof gaugeSchema>;

export type PressureStatus = 'ok' | 'below minimum' | 'uncertain' | 'no figure';

export interface PressureEstimate {
  cylinder: number;
  kpa: number | null;
  interval: [number, number] | null;
  gauged: boolean;
  status: PressureStatus;
}

export interface GaugePressures {
  cylinders: PressureEstimate[];
  /** Lowest over highest estimate, percent, and the check against the largest allowed difference. */
  spread: { lowestShare: number; allowedShare: number; status: 'within' | 'beyond' | 'uncertain' } | null;
  /** One sentence on the whole, for the report and the customer. */
  sentence: string;
}

export const ESTIMATE_CAUTION = 'Estimated from one gauge reading and the relative figures; a gauge test on any cylinder that matters confirms it.';

type Result = Pick<AnalysisResult, 'cylinders' | 'identity'>;

/** The estimates, or a sentence saying why none can be given. */
export function gaugePressures(r: Result, g: GaugeReading): GaugePressures | { problem: string } {
  if (r.identity === 'assumed') {
    return { problem: 'This analysis has no cylinder 1 signal, so its cylinder numbers are assumed and the gauged cylinder cannot be found among them: record with sync, or gauge every cylinder.' };
  }
  const ref = r.cylinders.find((c) => c.cylinder === g.cylinder);
  if (!ref || ref.relativePercent === null || !ref.interval || ref.relativePercent <= 0) {
    return { problem: `Cylinder ${g.cylinder} has no figure on this analysis to scale by; gauge a cylinder that has one.` };
  }
  const refPercent = ref.relativePercent;
  const accuracy = Math.log(1 + g.accuracyPercent / 100);
  // Half-widths on the log of the ratio: the gauged cylinder's below and above its figure.
  const refBelow = Math.log(refPercent / Math.max(ref.interval[0], 0.5));
  const refAbove = Math.log(ref.interval[1] / refPercent);
  const cylinders: PressureEstimate[] = r.cylinders.map((c) => {
    const gauged = c.cylinder === g.cylinder;
    if (c.relativePercent === null || !c.interval) return { cylinder: c.cylinder, kpa: null, interval: null, gauged, status: 'no figure' };
    const kpa = gauged ? g.readingKpa : (g.readingKpa * c.relativePercent) / refPercent;
    const below = gauged ? accuracy : Math.hypot(Math.log(c.relativePercent / Math.max(c.interval[0], 0.5)), refAbove, accuracy);
    const above = gauged ? accuracy : Math.hypot(Math.log(c.interval[1] / Math.max(c.relativePercent, 0.5)), refBelow, accuracy);
    const interval: [number, number] = [Math.max(0, kpa * Math.exp(-below)), kpa * Math.exp(above)];
    const status: PressureStatus = g.minimumKpa === undefined ? 'ok' : interval[1] < g.minimumKpa ? 'below minimum' : interval[0] >= g.minimumKpa ? 'ok' : 'uncertain';
    return { cylinder: c.cylinder, kpa: round(kpa), interval: [round(interval[0]), round(interval[1])], gauged, status };
  });
  const read = cylinders.filter((c) => c.kpa !== null);
  let spread: GaugePressures['spread'] = null;
  if (g.maxDifferencePercent !== undefined && read.length >= 2) {
    const lowest = read.reduce((a, b) => (b.kpa! < a.kpa! ? b : a));
    const highest = read.reduce((a, b) => (b.kpa! > a.kpa! ? b : a));
    const allowed = 100 - g.maxDifferencePercent;
    const share = (100 * lowest.kpa!) / highest.kpa!;
    // On the relative figures alone (the gauge's own error cancels in a ratio of two estimates).
    const rel = (n: number) => r.cylinders.find((c) => c.cylinder === n)!;
    const lo = rel(lowest.cylinder).interval!;
    const hi = rel(highest.cylinder).interval!;
    const best = (100 * lo[1]) / hi[0];
    const worst = (100 * lo[0]) / hi[1];
    spread = { lowestShare: Math.round(share * 10) / 10, allowedShare: allowed, status: best < allowed ? 'beyond' : worst >= allowed ? 'within' : 'uncertain' };
  }
  const low = cylinders.filter((c) => c.status === 'below minimum').map((c) => c.cylinder);
  const sentence =
    low.length > 0
      ? `Cylinder${low.length > 1 ? 's' : ''} ${low.join(', ')} ${low.length > 1 ? 'are' : 'is'} estimated below the minimum pressure.`
      : spread?.status === 'beyond'
        ? `The weakest cylinder is estimated at ${spread.lowestShare.toFixed(0)} % of the strongest, below the ${allowed(spread)} % allowed.`
        : cylinders.some((c) => c.status === 'uncertain') || spread?.status === 'uncertain'
          ? 'Some estimated pressures are too close to the specification to call.'
          : g.minimumKpa !== undefined || spread
            ? 'Every cylinder’s estimated pressure meets the specification entered.'
            : 'Estimated pressures are shown for every cylinder with a figure.';
  return { cylinders, spread, sentence };
}

/** The sentence with the weakest cylinder's share beside the share allowed, for the report editor and the PDF. */
export function gaugeSummary(p: GaugePressures): string {
  return p.spread ? `${p.sentence} Weakest at ${p.spread.lowestShare} % of the strongest (at least ${p.spread.allowedShare} % allowed).` : p.sentence;
}

function allowed(s: NonNullable<GaugePressures['spread']>): string {
  return s.allowedShare.toFixed(0);
}

function round(v: number): number {
  return Math.round(v * 10) / 10;
}
