/**
 * Does the capture hold as many compression events per engine cycle as the engine set up has cylinders? When
 * the cycle is known without the cylinder count (crank teeth, an engine-speed channel, or cylinder 1 sync
 * pulses), the strength of the signal's component at N events per cycle against the components other
 * cylinder counts would give says whether N cylinders compressed. A wrong cylinder count otherwise fits
 * "well" and reads some cylinders near zero, which would look like a confident finding.
 *
 * Leaky cylinders put power at every order, so the test is a ratio with margin. Measured on the simulator
 * (3, 4, 5, 6, odd-fire 6 and 8 cylinders; healthy, one leak, two leaks, one severe leak; starter current with
 * sync, tooth times, Hall with sync, engine speed; 3 seeds): the right count's component was never below 0.75
 * of the strongest other count's (288 captures); a wrong count's was below 0.5 in 1206 of 1344.
 */
import { orderAmplitude } from '../dsp/event-rate';
import { type QualityWarning, warning } from '../warnings';
import { type EngineSetup, firingIntervals } from '../engine/firing';
import { symmetryStep } from './identity';

const GRID_DEG = 4;
/** Cylinder counts the signal is compared with. */
const COUNTS = [3, 4, 5, 6, 8];
/**
 * On crank speed, another count's component must be at least this share of the mean speed to contradict the
 * setup: a real engine's compression swings its speed by 10 % at the firing order (the V6 in captures-real/:
 * 1.72 rad/s at 17 rad/s), the simulator's by 3 % or more; a trace whose every order is below 1.5 % shows no
 * cylinder count at all.
 */
export const MIN_SPEED_ORDER_SHARE = 0.015;
/** Below this share of the setup's own order, another order is absent (a trace that repeats purely at one rate). */
const PURE_SHARE = 0.1;
/** The right count's component is at least this fraction of the strongest other count's. */
const MIN_RATIO = 0.5;

/** `signal` at increasing crank angles `thetaDeg`, resampled every 4°; null when under three cycles. */
export function resampleByAngle(thetaDeg: Float64Array, signal: Float64Array): { x: Float64Array; samplesPerCycle: number } | null {
  if (thetaDeg.length < 8) return null;
  const start = thetaDeg[0];
  const span = thetaDeg[thetaDeg.length - 1] - start;
  if (!(span >= 3 * 720)) return null;
  const n = Math.floor(span / GRID_DEG);
  const x = new Float64Array(n);
  let j = 1;
  for (let k = 0; k < n; k++) {
    const a = start + k * GRID_DEG;
    while (j < thetaDeg.length - 1 && thetaDeg[j] < a) j++;
    const f = (a - thetaDeg[j - 1]) / Math.max(1e-9, thetaDeg[j] - thetaDeg[j - 1]);
    x[k] = signal[j - 1] + Math.min(1, Math.max(0, f)) * (signal[j] - signal[j - 1]);
  }
  return { x, samplesPerCycle: 720 / GRID_DEG };
}

/**
 * A FIRING_ORDER_MISMATCH warning when another cylinder count explains `x` far better than the setup's. An
 * engine whose intervals repeat fewer times a cycle than it has cylinders (an odd-firing V6's 90°, 150°, …
 * repeat three times) makes those lower orders itself, the more so with a weak cylinder, which also
 * puts power at every other order. Such an order contradicts the setup only in a trace that repeats purely at it
 * (every other order below a tenth of the setup's own): then the capture holds fewer cylinders, or half of them
 * show no compression at all, and the two cannot be told apart.
 */
export function eventCountWarning(x: Float64Array, samplesPerCycle: number, setup: EngineSetup, where: string, minShare = 0): QualityWarning | null {
  if (x.length < 3 * samplesPerCycle || samplesPerCycle < 2 * 2 * Math.max(...COUNTS)) return null;
  const cylinders = setup.cylinders;
  const own = orderAmplitude(x, samplesPerCycle, cylinders);
  // How many times a cycle the firing intervals repeat: every event on an even-firing engine.
  const repeats = cylinders / symmetryStep(firingIntervals(setup));
  const natural = (c: number) => repeats < cylinders && c % repeats === 0;
  const others = COUNTS.filter((c) => c !== cylinders).map((c) => ({ c, a: orderAmplitude(x, samplesPerCycle, c) }));
  const pure = others.every(({ c, a }) => natural(c) || a < PURE_SHARE * own);
  let best = 0;
  let bestCount = cylinders;
  for (const { c, a } of others) {
    if (natural(c) && !pure) continue;
    if (a > best) {
      best = a;
      bestCount = c;
    }
  }
  if (!(best > 0) || own >= MIN_RATIO * best) return null;
  // Another count's component must itself be a compression signature, not noise on a flat trace.
  if (minShare > 0 && best < minShare * meanAbs(x)) return null;
  return countMismatch(`The ${where} repeats like ${bestCount} compression events per engine cycle, not ${cylinders}`, bestCount);
}

/** Mean of |x|. */
export function meanAbs(x: Float64Array): number {
  let s = 0;
  for (let i = 0; i < x.length; i++) s += Math.abs(x[i]);
  return x.length ? s / x.length : 0;
}

/** The warning for a capture whose events per cycle contradict the cylinder count: check the setup, not the capture. */
export function countMismatch(what: string, seen: number): QualityWarning {
  return warning(
    'FIRING_ORDER_MISMATCH',
    `${what}: is this a ${seen}-cylinder engine? Check the cylinder count and firing order set up for this job against the vehicle and its service information; the capture itself need not be recorded again.`,
    seen,
  );
}
