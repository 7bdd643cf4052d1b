/**
 * The starter-current method: smooth and down-sample the current, find the cranking window and the event
 * rate, place crank-angle marks (sync pulses 720° apart, or current peaks one firing interval apart), build the
 * crank angle from the DC-motor relation ω ∝ (I_stall − I), and fit the torque balance.
 */
import { type EngineSetup, firingIntervals } from '../engine/firing';
import { indexAtTime } from '../dsp/decimate';
import { estimateRate } from '../dsp/event-rate';
import { blockMean, movingAverage } from '../dsp/smooth';
import { median, quantile, quantileProbe } from '../dsp/stats';
import { windowFromCurrent, type CrankingWindow } from '../steps/cranking-window';
import { type CrankMotion, keepRows, motionFromCurrent } from '../steps/crank-motion';
import { type CrankSpeedTrace, findClutchOverrun, inSpans } from '../steps/clutch-overrun';
import { findPeaks } from '../dsp/find-peaks';
import { symmetryStep } from '../steps/identity';
import { runFit } from '../fit/run-fit';
import { eventCountWarning } from '../steps/event-count';
import { findSyncPulses, SYNC_PULSE_MISSING } from '../steps/sync-pulses';
import type { TorqueFit } from '../fit/torque-fit';
import type { Summary } from '../steps/summarize';
import type { IdentitySource, WheelInfo } from '../types';
import { type QualityWarning, warning } from '../warnings';

export interface MethodRun {
  motion: CrankMotion;
  fit: TorqueFit;
  window: CrankingWindow;
  rpm: number;
  identity: IdentitySource;
  identityNote?: string;
  warnings: QualityWarning[];
  wheel?: WheelInfo;
  speedSwing?: number;
  /** Events left out of the figures from the start (combustion), as the fit's exclude keys. */
  excluded?: Set<string>;
  /** Figures made by the method itself (an electrical channel read along the crank's events). */
  figures?: Summary;
  /** When the engine started (the window ends before it), s. */
  startedAtS?: number;
  /** Multiplies the raw figure into its unit (battery volts from equivalent amps). @default 1 */
  rawScale?: number;
}

export type MethodOutcome = { ok: true; run: MethodRun } | { ok: false; warnings: QualityWarning[] };

/** Target rate of the down-sampled current, Hz. */
const ANALYSIS_RATE_HZ = 500;

export function runCurrentMethod(
  time: Float64Array,
  current: Float64Array,
  sync: Float64Array | undefined,
  setup: EngineSetup,
  rotation: number,
  windowOverride?: CrankingWindow,
  crankSpeed?: CrankSpeedTrace,
): MethodOutcome {
  const warnings: QualityWarning[] = [];
  const n = setup.cylinders;
  const fs = (time.length - 1) / (time[time.length - 1] - time[0]);
  const factor = Math.max(1, Math.round(fs / ANALYSIS_RATE_HZ));
  const rate = fs / factor;
  if (rate < 200) {
    return fail('SAMPLE_RATE_TOO_LOW', `The current was sampled at ${Math.round(fs)} samples/s; record at 1,000 samples/s or more (5,000–10,000 is best).`);
  }
  // Block means down-sample to about 500 Hz (a 2 ms boxcar), then a 5 ms moving average removes commutator ripple.
  const it = blockMean(time, factor);
  const smoothSamples = Math.max(1, Math.round(rate * 0.005));
  const ic = movingAverage(blockMean(current, factor), smoothSamples);
  const window = windowOverride ?? windowFromCurrent(it, ic);
  if (!window) {
    return fail('NO_CRANKING', 'No cranking was found in the current: it never rose and settled at a cranking level. Check the clamp is on the starter cable, its direction and range, and record 5–10 s of cranking.');
  }
  const a = indexAtTime(it, window.startS);
  const b = indexAtTime(it, window.endS);
  const slice = ic.subarray(a, b);
  const iv = firingIntervals(setup);
  // The crank repeats its pattern N/step times a cycle (every event on an even-fire engine, every second on a
  // 90°/150° V6): search for that rate so the strongest component is the fundamental.
  const step = symmetryStep(iv);
  const perCycle = n / step;
  const est = estimateRate(slice, rate, (perCycle * 60) / 120, (perCycle * 600) / 120);
  if (!est) return fail('NO_CRANKING', 'The cranking window is too short to find compression events; record 5–10 s of cranking.');
  let rpm = (120 * est.frequencyHz) / perCycle;
  const swing = currentSwing(slice, (120 / rpm / n) * rate);
  if (swing < MIN_CURRENT_SWING) {
    warnings.push(
      warning(
        'NO_COMPRESSION',
        `No compression signature: the starter current varies only ${(swing * 100).toFixed(0)} % of its level within each event (with compression it rises and falls by half its level or more). Spark plugs out, a decompression device or the wrong channel give this; refit the plugs and record again.`,
      ),
    );
  }

  // Marks: sync pulses (720° apart) when there are enough, else current peaks (one firing interval apart).
  let marks: number[] = [];
  let markAngles: number[] = [];
  let identity: 'sync' | 'assumed' = 'assumed';
  if (sync) {
    // The sync pulses' own spacing gives the cycle when they are regular (the current's strongest component can
    // sit at a fraction of the event rate when the starter's clutch overruns); else the event rate's.
    const all = findSyncPulses(time, sync, 0.03).filter((s) => s >= window.startS && s <= window.endS);
    const spacing = all.length >= 3 ? median(all.slice(1).map((s, k) => s - all[k])) : NaN;
    const cycleS = spacing > 120 / 600 && spacing < 120 / 40 ? spacing : 120 / rpm;
    const pulses = findSyncPulses(time, sync, 0.6 * cycleS).filter((s) => s >= window.startS && s <= window.endS);
    if (pulses.length >= 3) {
      marks = pulses;
      markAngles = pulses.map(() => 720);
      identity = 'sync';
      rpm = (120 * (pulses.length - 1)) / (pulses[pulses.length - 1] - pulses[0]);
      // Sync gives the cycle without the cylinder count, so the current's repeat rate checks the engine set up.
      const mismatch = eventCountWarning(slice, (rate * 120) / rpm, setup, 'starter current between cylinder 1 sync pulses');
      if (mismatch) warnings.push(mismatch);
    } else {
      warnings.push(warning('SYNC_NOT_FOUND', SYNC_PULSE_MISSING));
    }
  }
  if (identity === 'assumed') {
    const shortestS = Math.min(...iv) / (6 * rpm);
    const peaks = findPeaks(ic, Math.max(2, Math.round(0.6 * shortestS * rate)), a, b);
    marks = peaks.map((i) => it[i]);
    markAngles = alignIntervals(marks, iv);
    if (marks.length < 2 * n) return fail('TOO_FEW_CYCLES', 'Fewer than two engine cycles were found in the current; crank for 5–10 s.');
  }

  // With the crank's speed beside it, the stretches where the starter's clutch ran free (the current then says
  // nothing of the crank) are found and left out of the fit, with their count in a sentence.
  const overrun = crankSpeed ? findClutchOverrun(it, ic, crankSpeed, window.startS, window.endS, 120 / rpm / n, smoothSamples) : null;
  const free = overrun?.spans ?? [];
  const rowMarginS = 2 / rate;
  if (overrun && overrun.events > 0) {
    warnings.push(
      warning(
        'CLUTCH_OVERRUN',
        `The starter's one-way clutch ran free in ${overrun.events} of ${overrun.of} compression events: the crank ran ahead of the starter, whose draw fell to its no-load level and says nothing of the crank there. Those stretches are left out of the electrical figures.`,
      ),
    );
  }

  const hi = quantile(slice, 0.99);
  // The starter's stall current, fitted per capture: the value whose motion the sealed shapes fit best (a coarse
  // scan, then a golden-section search on its logarithm), then the full fit (leak shapes) at that value.
  const tryStall = (k: number) => {
    const all = motionFromCurrent(it, ic, marks, markAngles, k * hi);
    const motion = free.length ? keepRows(all, (t) => !inSpans(free, t, rowMarginS)) : all;
    const quick = runFit(motion, setup, identity === 'sync', rotation, undefined, false);
    return { motion, score: quick ? quick.r2 : -Infinity };
  };
  const best = bestStall(tryStall);
  const fit = best.score > -Infinity ? runFit(best.motion, setup, identity === 'sync', rotation) : null;
  if (!fit) return fail('TOO_FEW_CYCLES', 'The current holds too little cranking to fit; crank for 5–10 s.');
  return { ok: true, run: { motion: best.motion, fit, window, rpm, identity, warnings } };

  function fail(code: Parameters<typeof warning>[0], message: string): MethodOutcome {
    return { ok: false, warnings: [...warnings, warning(code, message)] };
  }
}

/** Stall current over the cranking current's 99th percentile: the range searched. */
const STALL_SCAN = [1.15, 1.3, 1.5, 1.75, 2, 2.5, 3, 4, 5];
const GOLDEN_STEPS = 5;

/**
 * The stall current (as a multiple of the cranking peak) whose fit scores best: a coarse scan, then a
 * golden-section search on its logarithm between the coarse best's neighbours. On the ensemble of starters (battery
 * 5–25 mΩ, cable drop, light armatures) searching it this finely took the mean error from 3.7 to 1.5 points.
 */
function bestStall<T extends { score: number }>(tryStall: (k: number) => T): T {
  const coarse = STALL_SCAN.map(tryStall);
  let i = 0;
  for (let j = 1; j < coarse.length; j++) if (coarse[j].score > coarse[i].score) i = j;
  let best = coarse[i];
  let a = Math.log(STALL_SCAN[Math.max(0, i - 1)]);
  let b = Math.log(STALL_SCAN[Math.min(STALL_SCAN.length - 1, i + 1)]);
  const g = (Math.sqrt(5) - 1) / 2;
  let x1 = b - g * (b - a);
  let x2 = a + g * (b - a);
  let f1 = tryStall(Math.exp(x1));
  let f2 = tryStall(Math.exp(x2));
  for (let step = 0; step < GOLDEN_STEPS; step++) {
    if (f1.score >= f2.score) {
      b = x2;
      x2 = x1;
      f2 = f1;
      x1 = b - g * (b - a);
      f1 = tryStall(Math.exp(x1));
    } else {
      a = x1;
      x1 = x2;
      f1 = f2;
      x2 = a + g * (b - a);
      f2 = tryStall(Math.exp(x2));
    }
  }
  for (const f of [f1, f2]) if (f.score > best.score) best = f;
  return best;
}

/**
 * Below this median swing of the current within one event (5th to 95th percentile, over the cranking level) there
 * is no compression: on the simulator, plugs out swing 0.017–0.021 and every cylinder worn to half its
 * compression 0.17–0.47 (V8 to I3), healthy engines 1.0–3.2.
 */
const MIN_CURRENT_SWING = 0.08;

/** Median over event-long blocks of the current's 5th–95th percentile range, over its median level. */
function currentSwing(slice: Float64Array, eventSamples: number): number {
  const n = Math.max(4, Math.round(eventSamples));
  const level = median(slice);
  const swings: number[] = [];
  for (let k = 0; k + n <= slice.length; k += n) {
    const block = slice.subarray(k, k + n);
    swings.push(quantile(block, 0.95) - quantile(block, 0.05));
  }
  return swings.length && level > 0 ? median(swings) / level : Infinity;
}

/** Angles between consecutive peaks: the firing intervals, aligned to the measured pattern for uneven fire. */
function alignIntervals(marks: number[], iv: number[]): number[] {
  const n = iv.length;
  const d: number[] = [];
  for (let k = 1; k < marks.length; k++) d.push(marks[k] - marks[k - 1]);
  let bestShift = 0;
  let bestErr = Infinity;
  for (let s = 0; s < n; s++) {
    let err = 0;
    for (let k = 0; k + 1 < d.length; k++) {
      // Compare each gap with its neighbour's: the ratio is speed-independent.
      const want = iv[(s + k) % n] / iv[(s + k + 1) % n];
      err += (Math.log(d[k] / d[k + 1]) - Math.log(want)) ** 2;
    }
    if (err < bestErr) {
      bestErr = err;
      bestShift = s;
    }
  }
  return d.map((_, k) => iv[(bestShift + k) % n]);
}

/** A current that reads strongly negative while cranking: the clamp is on backwards. */
export function clampReversed(current: Float64Array): boolean {
  const lo = quantileProbe(current, 0.02, 50_000);
  const hi = quantileProbe(current, 0.98, 50_000);
  return lo < -20 && -lo > 2 * Math.max(0, hi);
}
