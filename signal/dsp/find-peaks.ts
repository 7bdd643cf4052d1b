/** Local maxima at least `minGap` samples apart, the highest winning where two are closer. */

export function findPeaks(x: Float64Array, minGap: number, from = 0, to = x.length): number[] {
  const peaks: number[] = [];
  for (let i = Math.max(1, from); i < Math.min(x.length - 1, to); i++) {
    if (x[i] < x[i - 1] || x[i] < x[i + 1]) continue;
    const last = peaks[peaks.length - 1];
    if (last !== undefined && i - last < minGap) {
      if (x[i] > x[last]) peaks[peaks.length - 1] = i;
    } else {
      peaks.push(i);
    }
  }
  return peaks;
}
