/**
 * The battery-voltage method. The battery's voltage falls by its internal resistance times the starter
 * current, so a voltage channel is the starter current upside down: (V_rest − V) / R. Sampled steadily, it goes
 * through the starter-current method. Sampled only at crank-tooth edges (an engine computer's tooth log), each
 * compression event's voltage swing is read along the crank-speed method's events, as a plain index.
 */
import { indexAtTime } from '../dsp/decimate';
import { quantileProbe, stdDev } from '../dsp/stats';
import type { EngineSetup } from '../engine/firing';
import { firingIntervals } from '../engine/firing';
import type { CrankingWindow } from '../steps/cranking-window';
import { healthyReference, round1, type Summary, timeAtAngle } from '../steps/summarize';
import { eventKey } from '../fit/torque-fit';
import type { CaptureColumns, CylinderResult, EventMark } from '../types';
import { type MethodOutcome, runCurrentMethod } from './current';
import type { CrankSpeedTrace } from '../steps/clutch-overrun';

/** Equivalent series resistance used to turn volts into amps, Ω (a typical battery and cable; only ratios matter). */
const R_EQUIVALENT = 0.01;

/** A battery channel logged at each edge rather than at a steady rate. */
export function isEdgeSampled(c: CaptureColumns): boolean {
  if (!c.battery || !c.time || !c.toothTimes) return false;
  const t = c.time;
  const rate = (t.length - 1) / (t[t.length - 1] - t[0]);
  return rate < 200;
}

/** A steadily sampled battery voltage through the starter-current method. */
export function runBatteryMethod(
  time: Float64Array,
  battery: Float64Array,
  sync: Float64Array | undefined,
  setup: EngineSetup,
  rotation: number,
  window?: CrankingWindow,
  crankSpeed?: CrankSpeedTrace,
): MethodOutcome {
  const rest = quantileProbe(battery, 0.99, 50_000);
  const current = battery.map((v) => (rest - v) / R_EQUIVALENT);
  const outcome = runCurrentMethod(time, current, sync, setup, rotation, window, crankSpeed);
  return outcome.ok ? { ok: true, run: { ...outcome.run, rawScale: R_EQUIVALENT } } : outcome;
}

/** The battery's swing within each compression event found by the crank-speed method, per cylinder. */
export function batteryAtTeeth(c: CaptureColumns, crank: MethodOutcome, setup: EngineSetup, lowLimitPercent: number): MethodOutcome {
  if (!crank.ok) return crank;
  const run = crank.run;
  const time = c.time!;
  const v = c.battery!;
  const n = setup.cylinders;
  const half = Math.min(...firingIntervals(setup)) / 2;
  const skip = run.excluded ?? new Set<string>();
  const per: number[][] = Array.from({ length: n }, () => []);
  const events: EventMark[] = [];
  for (const ev of run.fit.events) {
    const timeS = timeAtAngle(run.motion, ev.tdcDeg);
    const t0 = timeAtAngle(run.motion, ev.tdcDeg - half);
    const t1 = timeAtAngle(run.motion, ev.tdcDeg + half);
    const swing = ev.complete && !skip.has(eventKey(ev)) ? swingBetween(time, v, t0, t1) : NaN;
    if (Number.isFinite(swing)) per[ev.cylinder - 1].push(swing);
    events.push({ timeS, cylinder: ev.cylinder, used: Number.isFinite(swing) });
  }
  const means = per.map((p) => (p.length ? p.reduce((a, b) => a + b, 0) / p.length : NaN));
  const ref = healthyReference(means, lowLimitPercent);
  const cylinders: CylinderResult[] = means.map((m, i) => {
    const pct = per[i].map((x) => (100 * x) / ref);
    return {
      cylinder: i + 1,
      relativePercent: Number.isFinite(m) ? round1((100 * m) / ref) : null,
      interval: null,
      status: 'ok',
      events: per[i].length,
      rejected: 0,
      spreadPercent: round1(stdDev(pct)),
      plainPercent: Number.isFinite(m) ? round1((100 * m) / Math.max(...means.filter(Number.isFinite))) : 0,
      raw: Number.isFinite(m) ? Math.round(m * 100) / 100 : 0,
      perCycle: pct.map(round1),
    };
  });
  const valid = cylinders.map((x) => x.relativePercent ?? NaN).filter(Number.isFinite);
  const figures: Summary = { cylinders, events, spreadPercent: valid.length ? round1(Math.max(...valid) - Math.min(...valid)) : 0, rejectedKeys: new Set() };
  return { ok: true, run: { ...run, figures } };
}

/** Max − min of a sample-and-hold channel over [t0, t1]: the value held at t0, then every row inside. */
function swingBetween(time: Float64Array, v: Float64Array, t0: number, t1: number): number {
  // The last row at or before t0 holds the value at t0.
  const at = indexAtTime(time, t0);
  const lo = Math.max(0, at < time.length && time[at] === t0 ? at : at - 1);
  let min = v[lo];
  let max = v[lo];
  for (let i = lo + 1; i < time.length && time[i] <= t1; i++) {
    if (v[i] < min) min = v[i];
    if (v[i] > max) max = v[i];
  }
  return max - min;
}
