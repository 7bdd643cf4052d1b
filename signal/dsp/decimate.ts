/** Min/max decimation for drawing: one pass, two values per pixel column, so spikes are never lost. */

export interface MinMaxView {
  /** Time at the start of each column. */
  x: Float64Array;
  min: Float64Array;
  max: Float64Array;
}

/**
 * Decimates samples [from, to) of `y` (times in `t`) to at most `columns` min/max pairs.
 * When the range holds fewer samples than columns, the samples are returned as they are (min = max).
 */
export function decimateMinMax(t: Float64Array, y: Float64Array, from: number, to: number, columns: number): MinMaxView {
  const start = Math.max(0, from);
  const end = Math.min(y.length, to);
  const count = Math.max(0, end - start);
  if (count <= columns) {
    const x = t.slice(start, end);
    const v = y.slice(start, end);
    return { x, min: v, max: v.slice() };
  }
  const x = new Float64Array(columns);
  const min = new Float64Array(columns);
  const max = new Float64Array(columns);
  const per = count / columns;
  for (let c = 0; c < columns; c++) {
    const a = start + Math.floor(c * per);
    const b = start + Math.floor((c + 1) * per);
    let lo = y[a];
    let hi = lo;
    for (let i = a + 1; i < b; i++) {
      const v = y[i];
      if (v < lo) lo = v;
      else if (v > hi) hi = v;
    }
    x[c] = t[a];
    min[c] = lo;
    max[c] = hi;
  }
  return { x, min, max };
}

/** Index of the first sample at or after time `time` (binary search over ascending `t`). */
export function indexAtTime(t: Float64Array, time: number): number {
  let lo = 0;
  let hi = t.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (t[mid] < time) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
