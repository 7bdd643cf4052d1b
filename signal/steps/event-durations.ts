/**
 * Compression events as segments of crank angle: each cylinder's segment runs from half a firing interval before
 * its compression TDC to half one after it (or to TDC), and its duration is the time the crank takes to turn
 * through it.
 * Times at segment edges are interpolated between teeth, or taken at the nearest tooth on a coarse wheel.
 */
import { indexAtTime } from '../dsp/decimate';
import type { ToothAngles } from '../teeth/coarse-angles';

export interface DurationEvent {
  /** Firing position, 0-based. */
  position: number;
  tdcDeg: number;
  /** Time of TDC, s. */
  timeS: number;
  startS: number;
  endS: number;
  /** Crank angle the segment spans, degrees. */
  spanDeg: number;
  /** Segment duration, s; NaN when the segment is not wholly inside the teeth or crosses a left-out stretch. */
  durationS: number;
}

/** Index of the last tooth at or before angle `theta`, or −1. */
function toothBefore(a: ToothAngles, theta: number): number {
  if (!(theta >= a.angleDeg[0])) return -1;
  const i = indexAtTime(a.angleDeg, theta);
  return i < a.angleDeg.length && a.angleDeg[i] === theta ? i : i - 1;
}

/** Time at crank angle `theta` (linear between teeth); NaN outside the teeth or across a step over `maxStepDeg`. */
export function timeAtAngle(a: ToothAngles, theta: number, maxStepDeg: number): number {
  const k = toothBefore(a, theta);
  if (k < 0) return NaN;
  if (a.angleDeg[k] === theta) return a.times[k];
  if (k + 1 >= a.times.length) return NaN;
  const span = a.angleDeg[k + 1] - a.angleDeg[k];
  if (!(span > 0) || span > maxStepDeg) return NaN;
  return a.times[k] + ((theta - a.angleDeg[k]) / span) * (a.times[k + 1] - a.times[k]);
}

/**
 * Every event whose TDC lies on the teeth, given cylinder 1's TDC angle `tdc1Deg` on the teeth's scale and the
 * firing intervals. `snapDeg` (a coarse wheel's pitch) moves each segment edge to the nearest tooth angle;
 * `compressionHalf` ends each segment at TDC (a fine wheel: the half that compression alone slows).
 */
export function eventSegments(a: ToothAngles, tdc1Deg: number, intervalsDeg: number[], maxStepDeg: number, snapDeg = 0, compressionHalf = false): DurationEvent[] {
  const n = intervalsDeg.length;
  const cum = [0];
  for (let p = 0; p < n; p++) cum.push(cum[p] + intervalsDeg[p]);
  const first = a.angleDeg[0];
  const last = a.angleDeg[a.angleDeg.length - 1];
  const out: DurationEvent[] = [];
  const snap = (x: number) => (snapDeg > 0 ? first + Math.round((x - first) / snapDeg) * snapDeg : x);
  for (let c = Math.floor((first - tdc1Deg) / 720) - 1; tdc1Deg + 720 * c <= last; c++) {
    for (let p = 0; p < n; p++) {
      const tdc = tdc1Deg + 720 * c + cum[p];
      if (tdc < first || tdc > last) continue;
      const before = intervalsDeg[(p - 1 + n) % n] / 2;
      const after = intervalsDeg[p] / 2;
      const from = snap(tdc - before);
      const to = compressionHalf ? tdc : snap(tdc + after);
      const startS = timeAtAngle(a, from, maxStepDeg);
      const endS = timeAtAngle(a, to, maxStepDeg);
      const timeS = timeAtAngle(a, tdc, maxStepDeg);
      out.push({ position: p, tdcDeg: tdc, timeS, startS, endS, spanDeg: to - from, durationS: endS - startS });
    }
  }
  return out;
}

/**
 * Each duration over the mean of the whole engine cycle around it (n consecutive events, centred where the
 * events allow), so a slow drift in cranking speed cancels. NaN where a full cycle of durations is not at hand.
 */
export function detrendedDurations(durations: number[], n: number): number[] {
  const out = durations.map(() => NaN);
  const half = Math.floor(n / 2);
  for (let j = 0; j < durations.length; j++) {
    if (!Number.isFinite(durations[j])) continue;
    // The cycle window nearest to centring on j that holds n finite durations.
    for (const shift of shifts(half, n)) {
      const from = j - shift;
      if (from < 0 || from + n > durations.length) continue;
      let sum = 0;
      let ok = true;
      for (let k = from; k < from + n; k++) {
        if (!Number.isFinite(durations[k])) {
          ok = false;
          break;
        }
        sum += durations[k];
      }
      if (ok) {
        out[j] = (durations[j] * n) / sum;
        break;
      }
    }
  }
  return out;
}

/** Window starts relative to j, nearest to centred first. */
function shifts(half: number, n: number): number[] {
  const s: number[] = [];
  for (let d = 0; d < n; d++) {
    if (half + d < n) s.push(half + d);
    if (d > 0 && half - d >= 0) s.push(half - d);
  }
  return s;
}
