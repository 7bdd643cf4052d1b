/**
 * From the torque fit to per-cylinder results: events placed in time, malformed events found, the
 * reference (median of the healthy cylinders), relative compression, cycle spread and the plain index.
 */
import { median, stdDev } from '../dsp/stats';
import type { CylinderResult, CylinderStatus, EventMark } from '../types';
import type { CrankMotion } from './crank-motion';
import { eventKey, type FitEvent, type TorqueFit } from '../fit/torque-fit';

export interface Summary {
  cylinders: CylinderResult[];
  events: EventMark[];
  spreadPercent: number;
  /** Events whose estimate sits far from their cylinder's: malformed (spikes, dropouts). */
  rejectedKeys: Set<string>;
}

/** Time at crank angle `theta` by interpolation over the motion rows. */
export function timeAtAngle(m: CrankMotion, theta: number): number {
  const a = m.thetaDeg;
  let lo = 0;
  let hi = a.length - 1;
  if (theta <= a[0]) return m.t[0];
  if (theta >= a[hi]) return m.t[hi];
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (a[mid] <= theta) lo = mid;
    else hi = mid;
  }
  const f = a[hi] > a[lo] ? (theta - a[lo]) / (a[hi] - a[lo]) : 0;
  return m.t[lo] + f * (m.t[hi] - m.t[lo]);
}

/** Plain index of one event: the speed-like term's swing over ± half a firing interval around TDC. */
function plainIndex(m: CrankMotion, e: FitEvent, halfDeg: number, isCurrent: boolean): { index: number; raw: number } {
  let lo = Infinity;
  let hi = -Infinity;
  for (let r = 0; r < m.thetaDeg.length; r++) {
    const d = m.thetaDeg[r] - e.tdcDeg;
    if (d < -halfDeg) continue;
    if (d > halfDeg) break;
    const v = m.s[r];
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (!Number.isFinite(lo)) return { index: NaN, raw: NaN };
  if (isCurrent) return { index: hi - lo, raw: hi - lo };
  return { index: hi * hi - lo * lo, raw: ((hi - lo) * 60) / (2 * Math.PI) };
}

export function summarize(
  m: CrankMotion,
  fit: TorqueFit,
  cylinderCount: number,
  halfIntervalDeg: number,
  isCurrent: boolean,
  lowLimitPercent: number,
  /** Events to show but leave out of the figures (combustion), as the fit's exclude keys. */
  skip: ReadonlySet<string> = new Set(),
): Summary {
  const n = cylinderCount;
  const est = Array.from(fit.pressure);
  const ref = healthyReference(est, lowLimitPercent);

  const perEvent: number[][] = Array.from({ length: n }, () => []);
  const plain: number[][] = Array.from({ length: n }, () => []);
  const raw: number[][] = Array.from({ length: n }, () => []);
  const rejectedKeys = new Set<string>();
  const rejectedCount = new Int32Array(n);
  const stroke: number[][] = Array.from({ length: n }, () => []);
  const events: EventMark[] = [];
  for (let e = 0; e < fit.events.length; e++) {
    const ev = fit.events[e];
    const c = ev.cylinder - 1;
    const value = fit.perEvent[e];
    const timeS = timeAtAngle(m, ev.tdcDeg);
    if (!ev.complete || !Number.isFinite(value) || skip.has(eventKey(ev))) {
      events.push({ timeS, cylinder: ev.cylinder, used: false });
      continue;
    }
    const pct = (100 * value) / ref;
    // Far from the cylinder's own figure by more than 40 points: a spike or dropout, not compression.
    const own = (100 * est[c]) / ref;
    if (Math.abs(pct - own) > 40) {
      rejectedKeys.add(eventKey(ev));
      rejectedCount[c]++;
      events.push({ timeS, cylinder: ev.cylinder, used: false });
      continue;
    }
    perEvent[c].push(pct);
    if (!isCurrent) stroke[c].push(timeAtAngle(m, ev.tdcDeg + halfIntervalDeg) - timeAtAngle(m, ev.tdcDeg - halfIntervalDeg));
    const p = plainIndex(m, ev, halfIntervalDeg, isCurrent);
    if (Number.isFinite(p.index)) {
      plain[c].push(p.index);
      raw[c].push(p.raw);
    }
    events.push({ timeS, cylinder: ev.cylinder, used: true });
  }
  const plainMeans = plain.map((v) => (v.length ? v.reduce((a, b) => a + b, 0) / v.length : NaN));
  const plainMax = Math.max(...plainMeans.filter(Number.isFinite));
  const ratios = est.map((v) => (100 * v) / ref);
  const cylinders: CylinderResult[] = [];
  for (let c = 0; c < n; c++) {
    const r = ratios[c];
    cylinders.push({
      cylinder: c + 1,
      relativePercent: Number.isFinite(r) ? round1(Math.max(0, r)) : null,
      interval: null,
      strokeMs: isCurrent || !stroke[c].length ? undefined : round1((1000 * stroke[c].reduce((a, b) => a + b, 0)) / stroke[c].length),
      status: 'ok' as CylinderStatus,
      events: perEvent[c].length,
      rejected: rejectedCount[c],
      spreadPercent: round1(stdDev(perEvent[c])),
      plainPercent: Number.isFinite(plainMeans[c]) ? round1((100 * plainMeans[c]) / plainMax) : 0,
      raw: raw[c].length ? round1(raw[c].reduce((a, b) => a + b, 0) / raw[c].length) : 0,
      perCycle: perEvent[c].map((v) => round1(Math.max(0, v))),
    });
  }
  const valid = ratios.filter(Number.isFinite);
  const spreadPercent = valid.length ? round1(Math.max(...valid) - Math.min(...valid)) : 0;
  return { cylinders, events, spreadPercent, rejectedKeys };
}

/**
 * The reference: the median of the healthy cylinders. Healthy is the largest group of figures within 6 % of
 * one another (on a tie, the stronger group), so one cylinder reading above the rest (carbon build-up) does not
 * drag the healthy ones below 100 %. Nothing raises compression 30 % above the rest; when the strongest is that
 * far above the group, the group is the weak one, and the healthy are those within the low limit of the strongest.
 */
export function healthyReference(figures: number[], lowLimitPercent: number): number {
  const finite = figures.filter(Number.isFinite).sort((a, b) => a - b);
  if (!finite.length) return NaN;
  let best: number[] = [];
  for (const v of finite) {
    const group = finite.filter((x) => x >= v && x <= v * 1.06);
    if (group.length > best.length || (group.length === best.length && median(group) > median(best))) best = group;
  }
  const strongest = finite[finite.length - 1];
  if (strongest > 1.3 * median(best)) return median(finite.filter((v) => v >= (lowLimitPercent / 100) * strongest));
  return median(best);
}

export function round1(v: number): number {
  return Math.round(v * 10) / 10;
}
