/**
 * Tooth logs: one row a tooth holding its period, in buffers separated by marker rows (a word and a number, read as
 * a missing period). With an absolute time column each tooth is at its time (a counter that wraps or restarts is
 * carried on by the periods); without one the periods are summed, and the unknown time between buffers becomes a
 * break the wheel reader leaves out, never a slow tooth.
 */
import { median } from '../dsp/stats';
import { timeScale } from './header';

/** Seconds between two buffers whose real gap is unknown: long enough that no wheel reads it as a tooth. */
const BREAK_S = 2;

export function toothTimesFromPeriods(period: Float64Array, unit: string | null, time: Float64Array | undefined, timeScaleS: number): { toothTimes: Float64Array; notes: string[] } {
  const notes: string[] = [];
  const finite = Array.from(period).filter((v) => v > 0);
  const typical = median(finite);
  // The period's unit: from the header, else from its size (cranking teeth last 0.5–200 ms).
  const named = timeScale(unit);
  const scale = named ?? (typical > 50 ? 1e-6 : typical > 0.2 ? 1e-3 : 1);
  if (named === null) notes.push(`Tooth periods read as ${scale === 1e-6 ? 'µs' : scale === 1e-3 ? 'ms' : 's'} from their size (a typical tooth ${typical.toPrecision(3)}).`);
  const out: number[] = [];
  let buffers = 1;
  let unwrapped = 0;
  let broken = false;
  for (let i = 0; i < period.length; i++) {
    const p = period[i];
    if (!(p > 0)) {
      broken = true;
      continue;
    }
    const dt = p * scale;
    let at: number;
    if (time && time[i] === time[i]) {
      at = time[i] * timeScaleS;
      // A counter that wrapped or restarted: the period carries the time on.
      if (out.length && !broken && !(at > out[out.length - 1])) {
        at = out[out.length - 1] + dt;
        unwrapped++;
      } else if (out.length && broken && !(at > out[out.length - 1])) at = out[out.length - 1] + BREAK_S;
    } else at = out.length ? out[out.length - 1] + (broken ? BREAK_S : dt) : dt;
    if (broken && out.length) buffers++;
    broken = false;
    out.push(at);
  }
  if (buffers > 1) notes.push(`${buffers} buffers of the tooth log were joined; ${time ? 'the time column places each one' : 'the time between them is not known and is left out'}.`);
  if (unwrapped > 0) notes.push(`The time column wrapped or restarted; ${unwrapped} tooth time(s) were carried on from their periods.`);
  return { toothTimes: Float64Array.from(out), notes };
}
