/**
 * Turns a sampled crank-sensor waveform into tooth edge times. Hall: a square wave, rising edges through a
 * hysteresis band. Variable reluctance: an AC wave whose amplitude follows speed, timed at the
 * positive-to-negative zero crossing after the wave has risen above an arming level.
 */
import { quantileProbe } from '../dsp/stats';

export type SensorKind = 'hall' | 'vr';

/** Guesses the sensor type: a Hall wave sits at two levels, a VR wave swings around zero. */
export function guessSensorKind(v: Float64Array): SensorKind {
  const lo = quantileProbe(v, 0.02, 50_000);
  const hi = quantileProbe(v, 0.98, 50_000);
  return lo < -0.2 * Math.abs(hi) ? 'vr' : 'hall';
}

/** Edge times (s) from a sampled sensor waveform. */
export function toothTimesFromWaveform(t: Float64Array, v: Float64Array, kind: SensorKind): Float64Array {
  const out: number[] = [];
  if (kind === 'hall') {
    const lo = quantileProbe(v, 0.05, 50_000);
    const hi = quantileProbe(v, 0.95, 50_000);
    const mid = (lo + hi) / 2;
    const band = 0.15 * (hi - lo);
    let high = v[0] > mid;
    for (let i = 1; i < v.length; i++) {
      if (!high && v[i] > mid + band) {
        high = true;
        // Interpolate the crossing of the mid level between the last sample below it and this one.
        let j = i;
        while (j > 0 && v[j - 1] > mid) j--;
        const a = v[j - 1] ?? v[j];
        const b = v[j];
        const f = b !== a ? (mid - a) / (b - a) : 0;
        out.push(t[j - 1] + f * (t[j] - t[j - 1]));
      } else if (high && v[i] < mid - band) {
        high = false;
      }
    }
  } else {
    const amp = quantileProbe(v, 0.98, 50_000);
    const arm = 0.12 * amp;
    let armed = false;
    for (let i = 1; i < v.length; i++) {
      if (v[i] > arm) armed = true;
      else if (armed && v[i - 1] >= 0 && v[i] < 0) {
        const f = v[i - 1] / (v[i - 1] - v[i]);
        out.push(t[i - 1] + f * (t[i] - t[i - 1]));
        armed = false;
      }
    }
  }
  return Float64Array.from(out);
}
