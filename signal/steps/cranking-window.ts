/**
 * The cranking window: where the starter is engaged (current) or the crank turns (speed), without the
 * engagement surge and the first unsteady cycle, and ending where cranking stops.
 */
import { movingAverage } from '../dsp/smooth';
import { quantile } from '../dsp/stats';

/** The sentence when no steady cranking is found on the crank's speed. */
export const NOT_STEADY = 'The crank never turned steadily; record 5–10 s of cranking.';

/** The sentence when the crank channel holds no teeth to read. */
export const NO_TEETH = 'No crank teeth were found: the crank did not turn, or the crank sensor channel is not connected. Check the probe and record while cranking.';

export interface CrankingWindow {
  startS: number;
  endS: number;
}

/**
 * From smoothed starter current sampled at `t`: the longest run above a threshold, starting once the inrush
 * has fallen back to the cranking level, plus `skipS` for the first unsteady cycle.
 */
export function windowFromCurrent(t: Float64Array, current: Float64Array, skipS = 0.25): CrankingWindow | null {
  // Between compression events the current can fall close to zero (the starter's clutch overruns), so the
  // engagement is found on a 0.5 s moving average.
  const rate = (t.length - 1) / Math.max(1e-9, t[t.length - 1] - t[0]);
  const envelope = movingAverage(current, Math.max(1, Math.round(0.5 * rate)));
  const hi = quantile(envelope, 0.98);
  const lo = quantile(envelope, 0.02);
  if (!(hi - lo > 5)) return null;
  const run = longestRun(t, envelope, lo + 0.25 * (hi - lo), 0.2);
  if (!run) return null;
  const [a, b] = run;
  // The inrush: from engagement until the current first falls below its level while cranking.
  const level = quantile(current.subarray(a, b), 0.75);
  let i = a;
  while (i < b && current[i] < level) i++;
  while (i < b && current[i] >= level) i++;
  const startS = t[Math.min(b - 1, i)] + skipS;
  const endS = t[b - 1] - 0.3;
  return endS - startS > 0.3 ? { startS, endS } : null;
}

/** From crank speed samples (rad/s) at `t`: where speed stays above 70 % of its median while turning. */
export function windowFromSpeed(t: Float64Array, omega: Float64Array, skipS = 0.25): CrankingWindow | null {
  const turning: number[] = [];
  for (let i = 0; i < omega.length; i++) if (omega[i] > 5) turning.push(omega[i]);
  if (turning.length < 10) return null;
  const level = 0.6 * quantile(turning, 0.5);
  const run = longestRun(t, omega, level, 0.4);
  if (!run) return null;
  const startS = t[run[0]] + skipS;
  const endS = t[run[1] - 1];
  return endS - startS > 0.3 ? { startS, endS } : null;
}

/** Longest index run [a, b) above `threshold`, bridging dips shorter than `bridgeS`. */
function longestRun(t: Float64Array, x: Float64Array, threshold: number, bridgeS: number): [number, number] | null {
  let best: [number, number] | null = null;
  let start = -1;
  let lastAbove = -1;
  for (let i = 0; i <= x.length; i++) {
    const above = i < x.length && x[i] > threshold;
    if (above) {
      if (start < 0) start = i;
      else if (lastAbove >= 0 && t[i] - t[lastAbove] > bridgeS) {
        if (!best || lastAbove + 1 - start > best[1] - best[0]) best = [start, lastAbove + 1];
        start = i;
      }
      lastAbove = i;
    } else if (i === x.length && start >= 0) {
      if (!best || lastAbove + 1 - start > best[1] - best[0]) best = [start, lastAbove + 1];
    }
  }
  return best;
}
