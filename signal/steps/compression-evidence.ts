/**
 * Does the crank show compression at all, and did the engine fire? Within each compression event the crank
 * slows into TDC and speeds up after it: the event's max/min speed is about 2–2.8 on real engines with
 * compression and 1.01–1.03 with the plugs out (the recordings in captures-real/). An event whose speed after TDC runs far above the others' is combustion.
 */
import { median } from '../dsp/stats';
import { type QualityWarning, warning } from '../warnings';
import type { CrankMotion } from './crank-motion';
import { eventKey, type TorqueFit } from '../fit/torque-fit';

/**
 * Below this median max/min speed within an event, no compression signature is seen. Measured on the six
 * recordings in captures-real/ (second-highest over second-lowest speed per event): plugs out 1.01 (V6), 1.03
 * (I3), 1.02 (I4, 12 teeth and one extra); plugs in 1.98 (V6), 1.99 (small I4), 2.82 (I3). The simulator swings
 * less than real engines (a healthy V8 1.14, every cylinder of a V8 leaking 1.08), so the limit sits at 1.08:
 * over twice the largest plugs-out ripple above 1.
 */
export const MIN_COMPRESSION_SWING = 1.08;
/** The warning when the crank speed shows no compression signature (its median max/min within an event is `swing`). */
export function noCompressionOnSpeed(swing: number): QualityWarning {
  return warning(
    'NO_COMPRESSION',
    `No compression signature: the crank speed varies only ${((swing - 1) * 100).toFixed(0)} % within each event (an engine with compression swings 2× or more; below ${Math.round((MIN_COMPRESSION_SWING - 1) * 100)} % nothing can be compared). Spark plugs out, a decompression device or the wrong channel give this; refit the plugs and record again.`,
  );
}

/** An event whose peak speed after TDC exceeds the median event's by this factor fired. */
const FIRED_FACTOR = 1.45;

export interface CompressionEvidence {
  /** Median over complete events of max/min crank speed within ± half a firing interval of TDC. */
  swing: number;
  /** Events (keys as the fit's `exclude`) whose speed after TDC shows combustion. */
  fired: Set<string>;
}

export function compressionEvidence(m: CrankMotion, fit: TorqueFit, halfDeg: number): CompressionEvidence {
  const swings: number[] = [];
  const peaks: { key: string; peak: number }[] = [];
  for (const e of fit.events) {
    if (!e.complete) continue;
    const speeds: number[] = [];
    let after = -Infinity;
    for (let r = 0; r < m.thetaDeg.length; r++) {
      const d = m.thetaDeg[r] - e.tdcDeg;
      if (d < -halfDeg) continue;
      if (d > halfDeg) break;
      speeds.push(m.s[r]);
      if (d >= 0 && m.s[r] > after) after = m.s[r];
    }
    // The second-highest over the second-lowest: one mis-spaced tooth (next to a wheel's extra tooth, say)
    // does not make a swing.
    speeds.sort((a, b) => a - b);
    const k = speeds.length >= 5 ? 1 : 0;
    if (speeds.length >= 2 && speeds[k] > 0) swings.push(speeds[speeds.length - 1 - k] / speeds[k]);
    if (Number.isFinite(after)) peaks.push({ key: eventKey(e), peak: after });
  }
  const typical = median(peaks.map((p) => p.peak));
  const fired = new Set(peaks.filter((p) => p.peak > FIRED_FACTOR * typical).map((p) => p.key));
  return { swing: swings.length ? median(swings) : 1, fired };
}
