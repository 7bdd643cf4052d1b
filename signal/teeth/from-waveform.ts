/**
 * Turns a sampled crank-sensor waveform into tooth edge times. Hall: a square wave, rising edges through a
 * hysteresis band. Variable reluctance: an AC wave whose amplitude follows speed, timed at the
 * positive-to-negative zero crossing after the wave has risen above an arming level.
 */
import { quantile } from '../dsp/stats';

export type SensorKind = 'hall' | 'vr';

/** Guesses the sensor type: a Hall wave sits at two levels, a VR wave swings around zero. */
export function guessSensorKind(v: Float64Array): SensorKind {
  const lo = quantile(sampleEvery(v, 50_000), 0.02);
  const hi = quantile(sampleEvery(v, 50_000), 0.98);
  return lo < -0.2 * Math.abs(hi) ? 'vr' : 'hall';
}

function sampleEvery(v: Float64Array, max: number): Float64Array {
  if (v.length <= max) return v;
  const step = v.length / max;
  const out = new Float64Array(max);
  for (let i = 0; i < max; i++) out[i] = v[Math.floor(i * step)];
  return out;
}

/** Edge times (s) from a sampled sensor waveform. */
export function toothTimesFromWaveform(t: Float64Array, v: Float64Array, kind: SensorKind): Float64Array {
  const probe = sampleEvery(v, 50_000);
  const out: number[] = [];
  if (kind === 'hall') {
    const lo = quantile(probe, 0.05);
    const hi = quantile(probe, 0.95);
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
    const amp = quantile(probe, 0.98);
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
