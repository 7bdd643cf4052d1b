/**
 * Shapes real captures come in, made from a simulated one: an engine that starts part-way (its teeth then come
 * several times faster), a trigger that is noisy for its first second or two (bursts, dips, spurious and missing
 * edges), and a tooth logger's period log with firmware lines and marker rows between its buffers.
 */
import { seededRandom } from '../dsp/random';
import type { SimResult } from './simulate';

/** The teeth up to `fromS`, then the engine running: the last revolution's pattern `factor` times faster for `runS` s. */
export function thenRuns(teeth: Float64Array, fromS: number, factor: number, runS: number, teethPerRev = 58): Float64Array {
  const kept = Array.from(teeth).filter((t) => t < fromS);
  const pitches: number[] = [];
  for (let k = Math.max(0, kept.length - 1 - teethPerRev); k + 1 < kept.length; k++) pitches.push(kept[k + 1] - kept[k]);
  let t = kept[kept.length - 1];
  for (let k = 0; t < fromS + runS; k++) {
    t += pitches[k % pitches.length] / factor;
    kept.push(t);
  }
  return Float64Array.from(kept);
}

/** Before `untilS`: a third of the edges dropped, spurious edges a tenth of a tooth after others, and bursts. */
export function noisyStart(teeth: Float64Array, untilS: number, seed: number): Float64Array {
  const rnd = seededRandom(seed);
  const out: number[] = [];
  for (let k = 0; k < teeth.length; k++) {
    const t = teeth[k];
    if (t >= untilS) {
      out.push(t);
      continue;
    }
    const r = rnd.next();
    if (r < 0.3) continue;
    out.push(t);
    const next = k + 1 < teeth.length ? teeth[k + 1] : t + 0.005;
    if (r > 0.85) for (let b = 1; b <= 3; b++) out.push(t + ((next - t) * b) / 8);
    else if (r > 0.7) out.push(t + (next - t) * 0.1);
  }
  return Float64Array.from(out.sort((a, b) => a - b));
}

/** A headerless `time, level` edge log of the crank teeth (low at each edge, high half a tooth later). */
export function headerlessEdgeLog(teeth: Float64Array): string {
  const rows = ['0,1'];
  for (let k = 0; k < teeth.length; k++) {
    const next = k + 1 < teeth.length ? teeth[k + 1] : teeth[k] + 0.004;
    rows.push(`${teeth[k].toFixed(6)},0`, `${(teeth[k] + Math.min(next - teeth[k], 0.004) / 2).toFixed(6)},1`);
  }
  return rows.join('\n') + '\n';
}

/**
 * A tooth logger's period log: firmware lines, `toothPeriod_us` per tooth and, every `buffer` teeth, a marker row
 * (`MARK n`) where one buffer ends and the next begins; the teeth between buffers are not logged.
 */
export function toothPeriodLog(sim: SimResult, buffer = 480, lostBetween = 25): string {
  const rows = ['# tooth logger (simulated), firmware 1.0', '# one row a tooth', 'toothPeriod_us'];
  const t = sim.toothTimes;
  let inBuffer = 0;
  let marks = 0;
  for (let k = 1; k < t.length; k++) {
    if (inBuffer === buffer) {
      rows.push(`MARK ${++marks}`);
      k += lostBetween;
      inBuffer = 0;
      continue;
    }
    rows.push(String(Math.round((t[k] - t[k - 1]) * 1e6)));
    inBuffer++;
  }
  return rows.join('\n') + '\n';
}
