/**
 * The interval around each cylinder's figure: a bootstrap over its compression events. Each resample draws every
 * cylinder's per-event estimates with replacement, takes their means, and recomputes the reference (the median
 * of the healthy cylinders) from the same resample, so the reference's own uncertainty is in every interval.
 * The 5th–95th percentiles of the resampled relative figures, taken on their logarithm (a ratio) and moved onto
 * the fit's figure, give the 90 % interval: asymmetric for a weak cylinder, never below 0 %. Few events make percentile bootstraps too narrow, so the half-widths are scaled by Student's t over
 * the normal quantile for the events used; a floor stands for what the events cannot show (the torque model's
 * own error, measured on the recovery sweep; more for the electrical methods, whose starter model is cruder),
 * a leaking cylinder's interval reaches further down (the leak-shape mapping), and a disagreement between two methods widens the interval to
 * reach halfway to the other method's figure.
 */
import { seededRandom } from '../dsp/random';
import { quantile } from '../dsp/stats';
import { healthyReference, round1 } from '../steps/summarize';

/** 95th percentile of Student's t by degrees of freedom 1…30 (two-sided 90 %); the normal's is 1.645. */
const T95 = [6.314, 2.92, 2.353, 2.132, 2.015, 1.943, 1.895, 1.86, 1.833, 1.812, 1.796, 1.782, 1.771, 1.761, 1.753, 1.746, 1.74, 1.734, 1.729, 1.725, 1.721, 1.717, 1.714, 1.711, 1.708, 1.706, 1.703, 1.701, 1.699, 1.697];
const RESAMPLES = 400;

export interface IntervalOptions {
  lowLimitPercent: number;
  /** Smallest half-width, percentage points: the torque model's own error. @default 3 */
  floorPoints?: number;
  /** Cylinders that took a leaky torque shape: the mapping from that shape to peak pressure can overstate them. */
  leaky?: boolean[];
}

/**
 * Share of a leaky cylinder's distance below 100 % by which its figure may overstate it (the leak-shape
 * mapping; measured on the recovery sweep, where leaking cylinders read up to about 10 % of that distance high).
 */
const LEAK_MAPPING_SHARE = 0.12;

/** Resampled figures below this (percent) count as this in log space: a cylinder with nothing left. */
const LOG_FLOOR_PERCENT = 1;

/**
 * 90 % intervals [low, high] for each cylinder's relative figure (percent), from its per-event estimates
 * (percent of the reference) and the fit's figure. Null for a cylinder without events or figure.
 */
export function cylinderIntervals(perEvent: number[][], figures: (number | null)[], o: IntervalOptions): ([number, number] | null)[] {
  const n = perEvent.length;
  const rnd = seededRandom(20_261_202);
  const floor = o.floorPoints ?? 3;
  const samples: number[][] = Array.from({ length: n }, () => []);
  const means = new Float64Array(n);
  for (let b = 0; b < RESAMPLES; b++) {
    for (let c = 0; c < n; c++) {
      const ev = perEvent[c];
      if (!ev.length) {
        means[c] = NaN;
        continue;
      }
      let s = 0;
      for (let k = 0; k < ev.length; k++) s += ev[Math.floor(rnd.next() * ev.length)];
      means[c] = s / ev.length;
    }
    const ref = healthyReference(Array.from(means), o.lowLimitPercent);
    for (let c = 0; c < n; c++) if (Number.isFinite(means[c]) && ref > 0) samples[c].push((100 * means[c]) / ref);
  }
  return figures.map((fig, c) => {
    const s = samples[c];
    if (fig === null || s.length < 10) return null;
    const k = perEvent[c].length;
    const t = k >= 2 ? T95[Math.min(T95.length, k - 1) - 1] / 1.645 : T95[0] / 1.645;
    const mapping = o.leaky?.[c] && fig < 97 ? LEAK_MAPPING_SHARE * (100 - fig) : 0;
    // On the ratio: the resampled figures' percentiles in log space, so a weak cylinder's interval reaches
    // further up than down and never through zero.
    const logs = s.map((v) => Math.log(Math.max(v, LOG_FLOOR_PERCENT)));
    const centre = quantile(logs, 0.5);
    const base = Math.max(fig, LOG_FLOOR_PERCENT);
    const lowBoot = base * Math.exp(-t * (centre - quantile(logs, 0.05)));
    const highBoot = base * Math.exp(t * (quantile(logs, 0.95) - centre));
    const below = Math.max(floor, fig - lowBoot) + mapping;
    const above = Math.max(floor, highBoot - fig);
    // No cylinder holds less than no compression: the interval stops at 0 %.
    return [round1(Math.max(0, fig - below)), round1(Math.max(0, fig + above))];
  });
}

/** Widens an interval to reach halfway to another method's figure. */
export function widenToward(interval: [number, number], other: number): [number, number] {
  const mid = (interval[0] + interval[1]) / 2;
  const half = (other - mid) / 2;
  return [round1(Math.min(interval[0], mid + half)), round1(Math.max(interval[1], mid + half))];
}

/** Widens an interval by `points` on each side, never below 0 %. */
export function widenBy(interval: [number, number], points: number): [number, number] {
  return [round1(Math.max(0, interval[0] - points)), round1(interval[1] + points)];
}
