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
  if (values.length <= maxSamples) return quantile(values, q);
  const step = values.length / maxSamples;
  const probe = new Float64Array(maxSamples);
  for (let i = 0; i < maxSamples; i++) probe[i] = values[Math.floor(i * step)];
  return quantile(probe, q);
}
