/** Robust statistics over numeric arrays. */

/** Median of the values (copies; NaN ignored). Returns NaN for an empty input. */
export function median(values: ArrayLike<number>): number {
  return quantile(values, 0.5);
}

/** The q-quantile (0…1) with linear interpolation; NaN ignored. */
export function quantile(values: ArrayLike<number>, q: number): number {
  let count = 0;
  for (let i = 0; i < values.length; i++) if (!Number.isNaN(values[i])) count++;
  if (count === 0) return NaN;
  // A typed array sorts numerically in native code, far faster than an array with a comparator.
  const a = new Float64Array(count);
  for (let i = 0, j = 0; i < values.length; i++) if (!Number.isNaN(values[i])) a[j++] = values[i];
  a.sort();
  const pos = (a.length - 1) * q;
  const lo = Math.floor(pos);
  const hi = Math.min(a.length - 1, lo + 1);
  return a[lo] + (a[hi] - a[lo]) * (pos - lo);
}

export function mean(values: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < values.length; i++) s += values[i];
  return values.length ? s / values.length : NaN;
}

/** Sample standard deviation. */
export function stdDev(values: ArrayLike<number>): number {
  if (values.length < 2) return 0;
  const m = mean(values);
  let s = 0;
  for (let i = 0; i < values.length; i++) s += (values[i] - m) * (values[i] - m);
  return Math.sqrt(s / (values.length - 1));
}

/** The q-quantile of at most `maxSamples` evenly spaced values: cheap on long channels, no full copy or sort. */
export function quantileProbe(values: ArrayLike<number>, q: number, maxSamples = 100_000): number {
  return quantilesProbe(values, [q], maxSamples)[0];
}

/** Several quantiles from one sorted probe of at most `maxSamples` evenly spaced values. */
export function quantilesProbe(values: ArrayLike<number>, qs: number[], maxSamples = 100_000): number[] {
  const m = Math.min(values.length, maxSamples);
  const step = values.length / Math.max(1, m);
  let count = 0;
  const probe = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    const v = values[Math.floor(i * step)];
    if (v === v) probe[count++] = v;
  }
  if (count === 0) return qs.map(() => NaN);
  const a = probe.subarray(0, count).sort();
  return qs.map((q) => {
    const pos = (count - 1) * q;
    const lo = Math.floor(pos);
    const hi = Math.min(count - 1, lo + 1);
    return a[lo] + (a[hi] - a[lo]) * (pos - lo);
  });
}

/** The smallest value, by a loop: a long array spread into Math.min overflows the call stack. */
export function minOf(values: ArrayLike<number>): number {
  let m = Infinity;
  for (let i = 0; i < values.length; i++) if (values[i] < m) m = values[i];
  return m;
}

/** The largest value, by a loop (see minOf). */
export function maxOf(values: ArrayLike<number>): number {
  let m = -Infinity;
  for (let i = 0; i < values.length; i++) if (values[i] > m) m = values[i];
  return m;
}

/**
 * The least-squares line y ≈ a + b·x over the pairs `keep` accepts (all by default); a flat line through the mean
 * when x does not vary, and 0 with nothing to fit.
 */
export function lineFit(x: ArrayLike<number>, y: ArrayLike<number>, keep?: (k: number) => boolean): { a: number; b: number } {
  let n = 0;
  let sx = 0;
  let sy = 0;
  let sxx = 0;
  let sxy = 0;
  for (let k = 0; k < x.length; k++) {
    if (keep && !keep(k)) continue;
    n++;
    sx += x[k];
    sy += y[k];
    sxx += x[k] * x[k];
    sxy += x[k] * y[k];
  }
  const d = n * sxx - sx * sx;
  const b = d > 0 ? (n * sxy - sx * sy) / d : 0;
  return { a: n > 0 ? (sy - b * sx) / n : 0, b };
}
