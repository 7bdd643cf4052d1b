/** Cylinder-1 sync pulses (ignition or injector trigger, cam sensor): rising edges through a hysteresis band. */
import { quantilesProbe } from '../dsp/stats';

/** What a sync channel with no usable pulse means, for every method that reads one. */
export const SYNC_PULSE_MISSING = 'The sync channel holds no clear pulse once per cycle; check the probe on the cylinder 1 trigger. Cylinder numbers below are assumed.';

/** Times (s) of the sync channel's rising edges, at least `minSpacingS` apart; empty when there is no clear pulse. */
export function findSyncPulses(t: Float64Array, v: Float64Array, minSpacingS: number): number[] {
  const [lo, hi] = quantilesProbe(v, [0.05, 0.999], 40_000);
  if (!(hi - lo > 0.5)) return [];
  const up = lo + 0.6 * (hi - lo);
  const down = lo + 0.4 * (hi - lo);
  const out: number[] = [];
  let high = v[0] > up;
  for (let i = 1; i < v.length; i++) {
    if (!high && v[i] > up) {
      high = true;
      const f = (up - v[i - 1]) / (v[i] - v[i - 1]);
      const time = t[i - 1] + f * (t[i] - t[i - 1]);
      if (out.length === 0 || time - out[out.length - 1] >= minSpacingS) out.push(time);
    } else if (high && v[i] < down) {
      high = false;
    }
  }
  return out;
}
