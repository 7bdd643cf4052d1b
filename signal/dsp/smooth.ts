/** Moving-average smoothing and decimation by block means, allocation-free in the loop. */

/** Centred moving average over `width` samples (odd widths are centred exactly). */
export function movingAverage(x: Float64Array, width: number, out = new Float64Array(x.length)): Float64Array {
  const w = Math.max(1, Math.floor(width));
  if (w === 1) {
    out.set(x);
    return out;
  }
  const half = w >> 1;
  const n = x.length;
  let sum = 0;
  let count = 0;
  let lo = 0;
  let hi = 0;
  for (let i = 0; i < n; i++) {
    const wantHi = Math.min(n, i + half + 1);
    const wantLo = Math.max(0, i - half);
    while (hi < wantHi) {
      sum += x[hi++];
      count++;
    }
    while (lo < wantLo) {
      sum -= x[lo++];
      count--;
    }
    out[i] = sum / count;
  }
  return out;
}

/** Block means of `factor` samples: a cheap low-pass and down-sample in one pass. */
export function blockMean(x: Float64Array, factor: number, from = 0, to = x.length): Float64Array {
  const f = Math.max(1, Math.floor(factor));
  const m = Math.floor((to - from) / f);
  const out = new Float64Array(m);
  for (let j = 0; j < m; j++) {
    let s = 0;
    const base = from + j * f;
    for (let k = 0; k < f; k++) s += x[base + k];
    out[j] = s / f;
  }
  return out;
}
