/**
 * Crank angle on a wheel known only by its repetition: the number of teeth per engine cycle (from a cam's
 * once-per-cycle pattern, a learned wheel, or the tooth pattern's own repeat and the cylinder count) spreads each
 * cycle's teeth evenly over 720°. On an unevenly spaced wheel the angle of a tooth inside its event is then only
 * approximate, but a run of whole events' teeth always spans whole firing intervals.
 */

/** Teeth and their crank angles, degrees, unwrapped. */
export interface ToothAngles {
  times: Float64Array;
  angleDeg: Float64Array;
}

/** Tooth k at 720° × (k − ref) / teethPerCycle. */
export function uniformAngles(times: Float64Array, teethPerCycle: number, refIndex: number): ToothAngles {
  const step = 720 / teethPerCycle;
  return { times, angleDeg: Float64Array.from(times, (_, k) => (k - refIndex) * step) };
}

/**
 * The period, in teeth, of the pattern of tooth periods: the smallest lag at which a period matches the one that
 * many teeth later (median of |log ratio|) within 30 % of the best lag's mismatch plus 0.01. Compression and an
 * uneven wheel both repeat once an event on an engine whose events see the same teeth, so this is the teeth per
 * compression event there.
 */
export function toothPatternPeriod(times: Float64Array, maxLag = 24): number {
  const n = times.length - 1;
  if (n < 8) return 1;
  const logd = new Float64Array(n);
  for (let k = 0; k < n; k++) logd[k] = Math.log(Math.max(1e-12, times[k + 1] - times[k]));
  const mismatch: number[] = [];
  for (let L = 1; L <= Math.min(maxLag, Math.floor(n / 3)); L++) {
    const d: number[] = [];
    for (let k = 0; k + L < n; k++) d.push(Math.abs(logd[k + L] - logd[k]));
    d.sort((a, b) => a - b);
    mismatch[L] = d[d.length >> 1];
  }
  const best = Math.min(...mismatch.filter(Number.isFinite));
  for (let L = 1; L < mismatch.length; L++) if (mismatch[L] <= 1.3 * best + 0.01) return L;
  return 1;
}
