/**
 * Tooth period (ms) at the mid-time of each tooth interval, from crank edge times. A gap (missing teeth) spans
 * several pitches, so it is divided by the pitches it spans and reads as speed rather than a spike; the typical
 * pitch is the median interval of an even sample of the wheel.
 */
export function toothPeriods(times: Float64Array | undefined): { t: Float64Array; v: Float64Array } | null {
  if (!times || times.length < 3) return null;
  const n = times.length - 1;
  const sample: number[] = [];
  for (let k = 0; k < n; k += Math.max(1, Math.floor(n / 500))) sample.push(times[k + 1] - times[k]);
  sample.sort((a, b) => a - b);
  const typical = sample[sample.length >> 1];
  const t = new Float64Array(n);
  const v = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const d = times[k + 1] - times[k];
    t[k] = (times[k] + times[k + 1]) / 2;
    v[k] = (1000 * d) / Math.max(1, Math.round(d / typical));
  }
  return { t, v };
}
