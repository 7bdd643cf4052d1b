/**
 * Cylinder identity without sync: which rotations of the firing order the crank cannot tell apart, and the
 * relabelling that makes the first complete event cylinder 1 (then stepped by the user's rotation).
 */
import type { FitEvent } from '../fit/torque-fit';

/**
 * Smallest number of firing positions k > 0 whose shift maps the TDC pattern onto itself (1 for even fire,
 * 2 for the 90°/150° V6); N when no shift does.
 */
export function symmetryStep(intervalsDeg: number[]): number {
  const n = intervalsDeg.length;
  for (let k = 1; k < n; k++) {
    let same = true;
    for (let j = 0; j < n && same; j++) same = Math.abs(intervalsDeg[j] - intervalsDeg[(j + k) % n]) < 0.5;
    if (same) return k;
  }
  return n;
}

/** Crank degrees spanned by `k` firing positions from the start of the order. */
export function degreesOfPositions(intervalsDeg: number[], k: number): number {
  let s = 0;
  for (let j = 0; j < k; j++) s += intervalsDeg[j % intervalsDeg.length];
  return s;
}

/**
 * New firing position for each old one so that the first complete event is firing position 0 (as far as the
 * symmetry allows), then `rotation` symmetry steps on.
 */
export function assumedRelabel(events: FitEvent[], n: number, step: number, rotation: number): Int32Array {
  const first = events.find((e) => e.complete)?.position ?? 0;
  const shift = first - (first % step) - rotation * step;
  const map = new Int32Array(n);
  for (let p = 0; p < n; p++) map[p] = (((p - shift) % n) + n) % n;
  return map;
}
