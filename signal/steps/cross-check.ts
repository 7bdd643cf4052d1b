/**
 * Two methods read from one capture, checked against each other. A cylinder disagrees when the figures differ by
 * more than MAX_DIFFERENCE points and their 90 % intervals do not overlap (a coarser method's wider interval is its
 * own measure of how far it may be off), or when one calls it low and the other ok. Where the two disagree, the
 * leading method's interval reaches halfway to the other figure.
 */
import type { AnalysisResult, CylinderResult, EventMark, MethodResult } from '../types';
import { widenToward } from '../grade/interval';

/** Figures this close agree whatever their intervals (points). */
const MAX_DIFFERENCE = 8;

/** Two 90 % intervals that share at least one value (the rule for "no clear difference" between two readings). */
export function intervalsOverlap(a: [number, number], b: [number, number]): boolean {
  return a[0] <= b[1] && b[0] <= a[1];
}

/**
 * Compares `mine` with `other` cylinder by cylinder, widens `mine`'s intervals where they disagree; null when either
 * lacks figures. An `other` whose cylinder numbers are assumed is first renumbered to `mine`'s events.
 */
export function crossCheck(mine: MethodResult, other: MethodResult, firingOrder: number[]): NonNullable<AnalysisResult['crossCheck']> | null {
  if (other.identity === 'assumed') other = { ...other, cylinders: renumbered(other, mine, firingOrder) };
  if (!mine.cylinders.every((c) => c.relativePercent !== null) || !other.cylinders.every((c) => c.relativePercent !== null)) return null;
  let maxDifference = 0;
  let agree = true;
  for (const [i, a] of mine.cylinders.entries()) {
    const b = other.cylinders[i];
    const difference = Math.abs(a.relativePercent! - b.relativePercent!);
    maxDifference = Math.max(maxDifference, difference);
    const apart = difference > MAX_DIFFERENCE && !(a.interval && b.interval && intervalsOverlap(a.interval, b.interval));
    const contrary = (a.status === 'low' && b.status === 'ok') || (a.status === 'ok' && b.status === 'low');
    if (!apart && !contrary) continue;
    agree = false;
    if (a.interval) a.interval = widenToward(a.interval, b.relativePercent!);
  }
  return {
    method: other.method,
    cylinders: other.cylinders.map((c) => ({ cylinder: c.cylinder, relativePercent: c.relativePercent, status: c.status })),
    agree,
    maxDifference: Math.round(maxDifference * 10) / 10,
  };
}

/**
 * `other`'s cylinders renumbered so its events fall on `mine`'s: each of its events votes for the firing-order
 * step between its cylinder and that of `mine`'s event nearest in time; the step most events agree on is taken.
 */
function renumbered(other: MethodResult, mine: MethodResult, order: number[]): CylinderResult[] {
  const n = order.length;
  const position = new Map(order.map((c, p) => [c, p]));
  const mineEvents = [...mine.events].sort((a, b) => a.timeS - b.timeS);
  const votes = new Array<number>(n).fill(0);
  for (const e of other.events) {
    const near = nearest(mineEvents, e.timeS);
    if (near === undefined) continue;
    votes[(position.get(near.cylinder)! - position.get(e.cylinder)! + n) % n]++;
  }
  const step = votes.indexOf(Math.max(...votes));
  if (step === 0) return other.cylinders;
  const out = [...other.cylinders];
  for (let p = 0; p < n; p++) {
    const from = other.cylinders[order[p] - 1];
    const to = order[(p + step) % n];
    out[to - 1] = { ...from, cylinder: to };
  }
  return out;
}

function nearest(events: EventMark[], t: number): EventMark | undefined {
  let lo = 0;
  let hi = events.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (events[mid].timeS < t) lo = mid + 1;
    else hi = mid;
  }
  const candidates = [events[lo - 1], events[lo]].filter((e): e is EventMark => e !== undefined);
  return candidates.sort((a, b) => Math.abs(a.timeS - t) - Math.abs(b.timeS - t))[0];
}
