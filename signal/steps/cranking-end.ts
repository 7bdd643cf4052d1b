/**
 * Where cranking ends because the engine started: the crank's speed, averaged over each firing interval (so
 * compression's swing within an event cancels), leaves the cranking band for good. Cranking speed drifts slowly
 * with the battery; a start multiplies it within a few events and it stays up (a single fired event, which
 * falls back, is combustion, not a start).
 */
import { median } from '../dsp/stats';
import type { ToothAngles } from '../teeth/coarse-angles';
import { eventSegments } from './event-durations';

/** Speed this many times the cranking speed before it is no longer cranking. */
export const STARTED_FACTOR = 1.4;
/**
 * A started engine runs at least this fast, rpm (cranking is 100–300 rpm, common practice; the real recordings in
 * captures-real/ that start run 280 rpm and more just after it): a noisy trigger's early dips cannot fake a start.
 */
const MIN_RUNNING_RPM = 250;
/** Share of the events after the start that must stay above the cranking band (this many times its speed). */
const STAYS_UP = 0.8;
const STAYS_FACTOR = 1.2;

export interface EngineStart {
  /** Index of the first event that is no longer cranking. */
  index: number;
  /** Its time, s. */
  timeS: number;
}

/**
 * `timeS` and `speed` hold one value per firing interval, in order, rpm. Null when the speed
 * never leaves the cranking band for good. The cranking band is the median speed of the events before, left
 * of any slow engagement (below half that median), and at least three recent events must sit near it.
 */
export function findEngineStart(timeS: ArrayLike<number>, speed: ArrayLike<number>, minRunningRpm = MIN_RUNNING_RPM): EngineStart | null {
  const n = speed.length;
  if (n < 4) return null;
  // The speeds before each event, kept sorted as they come (the medians in O(log n), not a sort per event).
  const sorted = new Float64Array(n);
  let count = 0;
  const recent: number[] = [];
  const add = (v: number) => {
    const at = lowerBound(sorted, count, v);
    sorted.copyWithin(at + 1, at, count);
    sorted[at] = v;
    count++;
    recent.push(v);
    if (recent.length > 6) recent.shift();
  };
  if (speed[0] > 0) add(speed[0]);
  for (let i = 1; i < n; i++) {
    if (!(speed[i] > 0)) continue;
    if (count === 0) {
      add(speed[i]);
      continue;
    }
    const rough = medianOfSorted(sorted, 0, count);
    const band = medianOfSorted(sorted, lowerBound(sorted, count, 0.5 * rough), count);
    const limit = STARTED_FACTOR * band;
    if (speed[i] > limit && recent.filter((v) => Math.abs(v / band - 1) < 0.2).length >= 3) {
      // The band is cranking (at least three recent events near it; a starter still engaging is not).
      let up = 0;
      const after: number[] = [];
      for (let k = i; k < n; k++) {
        after.push(speed[k]);
        if (speed[k] > STAYS_FACTOR * band) up++;
      }
      const running = median(after);
      if (up >= STAYS_UP * (n - i) && running > 1.5 * band && running >= minRunningRpm && (n - i >= 3 || speed[n - 1] > 2 * band)) return { index: i, timeS: timeS[i] };
    }
    add(speed[i]);
  }
  return null;
}

/** First index in sorted[0, count) whose value is not below v. */
function lowerBound(sorted: Float64Array, count: number, v: number): number {
  let lo = 0;
  let hi = count;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (sorted[mid] < v) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** The median of sorted[from, to). */
function medianOfSorted(sorted: Float64Array, from: number, to: number): number {
  const m = to - from;
  if (m <= 0) return NaN;
  const mid = from + (m >> 1);
  return m % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

/** Where the engine started on teeth with known angles: one speed per firing interval, from the segments' durations. */
export function engineStartOnTeeth(a: ToothAngles, intervalsDeg: number[], maxStepDeg: number): EngineStart | null {
  const events = eventSegments(a, a.angleDeg[0], intervalsDeg, maxStepDeg).filter((e) => e.durationS > 0 && Number.isFinite(e.timeS));
  return findEngineStart(
    events.map((e) => e.timeS),
    events.map((e) => e.spanDeg / e.durationS / 6),
  );
}

/** The refusal when the engine started before any steady cranking was recorded. */
export function startedTooSoon(start: EngineStart): string {
  return `The engine started at ${start.timeS.toFixed(1)} s, before any steady cranking was recorded; disable fuel as the service information directs and record again.`;
}

/** What was used of a capture in which the engine started. */
export function startedSentence(startS: number, crankingS: number, eventsPerCylinder: number): string {
  return `The engine started at ${startS.toFixed(1)} s; ${crankingS.toFixed(1)} s of cranking before it (${eventsPerCylinder} event${eventsPerCylinder === 1 ? '' : 's'} per cylinder) were used.`;
}
