/**
 * Turns a sampled crank-sensor waveform into tooth edge times. Hall: a square wave, rising edges through a
 * hysteresis band. Variable reluctance: an AC wave whose amplitude follows speed. As a VR interface circuit
 * does, each tooth arms the detector when the wave rises past a fraction of the previous tooth's peak (so the
 * small wiggles across a gap never count), and the tooth is timed at the zero crossing that follows; the
 * detector disarms below zero by a hysteresis band. The wire's polarity is found by trying both.
 */
import { movingAverage } from '../dsp/smooth';
import { quantileProbe } from '../dsp/stats';
import { directionScore } from './direction-score';

export type SensorKind = 'hall' | 'vr';

/** Guesses the sensor type: a Hall wave sits at two levels, a VR wave swings around zero. */
export function guessSensorKind(v: Float64Array): SensorKind {
  const lo = quantileProbe(v, 0.02, 50_000);
  const hi = quantileProbe(v, 0.98, 50_000);
  return lo < -0.2 * Math.abs(hi) ? 'vr' : 'hall';
}

/** Edge times (s) from a sampled sensor waveform. */
/** A Hall wave's swing must stand this many noise levels clear of the noise to be read. */
const HALL_MIN_SWING_NOISES = 12;

export function toothTimesFromWaveform(t: Float64Array, v: Float64Array, kind: SensorKind): Float64Array {
  const out: number[] = [];
  if (kind === 'hall') {
    let lo = quantileProbe(v, 0.05, 50_000);
    let hi = quantileProbe(v, 0.95, 50_000);
    // A crank that hardly turned sits at one level nearly all the time: its levels from the extremes, and no teeth
    // at all where there is no swing above the noise (else the noise itself is read as thousands of teeth).
    const noise = noiseLevel(v);
    if (hi - lo < HALL_MIN_SWING_NOISES * noise) {
      lo = quantileProbe(v, 0.001, 50_000);
      hi = quantileProbe(v, 0.999, 50_000);
      if (hi - lo < HALL_MIN_SWING_NOISES * noise) return new Float64Array(0);
    }
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
    // The noise is read on the raw wave: the smoothed one hides it from a second difference.
    const rawNoise = noiseLevel(v);
    const w = conditionVr(t, v, rawNoise);
    out.push(...vrBestCrossings(t, w.wave, rawNoise / Math.sqrt(w.smoothing)));
  }
  return Float64Array.from(out);
}

/**
 * A VR wave made ready for the detector, as an interface circuit's filter does: a centred moving average an eighth
 * of a tooth wide takes out the noise (the slowest teeth swing only a few tenths of a volt), and a centred
 * moving average four teeth wide, taken away, removes a slow drift of the zero. Both are symmetric, so the zero
 * crossings keep their times. The tooth period comes from a first reading of the raw wave.
 */
export function conditionVr(t: Float64Array, v: Float64Array, noise = noiseLevel(v)): { wave: Float64Array; smoothing: number } {
  const fs = (t.length - 1) / (t[t.length - 1] - t[0]);
  const first = vrBestCrossings(t, v, noise);
  if (first.length < 20 || !(fs > 0)) return { wave: v, smoothing: 1 };
  const gaps = first.slice(1).map((x, k) => x - first[k]).sort((a, b) => a - b);
  const toothS = gaps[gaps.length >> 1];
  const smooth = Math.floor((toothS * fs) / 8) | 1;
  if (smooth < 3) return { wave: v, smoothing: 1 };
  const low = movingAverage(v, smooth);
  const drift = movingAverage(low, Math.floor(4 * toothS * fs) | 1);
  for (let i = 0; i < low.length; i++) low[i] -= drift[i];
  return { wave: low, smoothing: smooth };
}

/** Share of the previous tooth's peak that arms the detector for the next tooth. */
const ARM_SHARE = 0.3;

/**
 * Zero crossings (positive to negative, after `sign` flips the wave) of teeth that rose past ARM_SHARE of the
 * previous tooth's peak; the floor is four times the noise (the median absolute deviation of the quietest
 * tenth of the wave), so pure noise arms nothing.
 */
export function vrCrossings(t: Float64Array, raw: Float64Array, sign: 1 | -1, noise = noiseLevel(raw)): number[] {
  const floor = Math.max(4 * noise, 0.02);
  const out: number[] = [];
  let lastPeak = quantileProbe(raw.map((x) => sign * x), 0.98, 50_000);
  let armed = false;
  let peak = 0;
  for (let i = 1; i < raw.length; i++) {
    const x = sign * raw[i];
    const prev = sign * raw[i - 1];
    if (!armed) {
      if (x > Math.max(floor, ARM_SHARE * lastPeak)) {
        armed = true;
        peak = x;
      }
    } else {
      if (x > peak) peak = x;
      if (prev >= 0 && x < 0) {
        const f = prev / (prev - x);
        out.push(t[i - 1] + f * (t[i] - t[i - 1]));
        armed = false;
        lastPeak = peak;
      }
    }
  }
  return out;
}

/** The crossings of the polarity that reads as a tooth wheel best (as recorded, or the wires swapped). */
export function vrBestCrossings(t: Float64Array, v: Float64Array, noise = noiseLevel(v)): number[] {
  const a = vrCrossings(t, v, 1, noise);
  const b = vrCrossings(t, v, -1, noise);
  return directionScore(Float64Array.from(b)) > directionScore(Float64Array.from(a)) ? b : a;
}

/** Noise: from the median absolute second difference over a sparse probe (a smooth wave's is near zero). */
function noiseLevel(v: Float64Array): number {
  const step = Math.max(1, Math.floor(v.length / 20_000));
  const d: number[] = [];
  for (let i = step; i + 1 < v.length; i += step) d.push(Math.abs(v[i + 1] - 2 * v[i] + v[i - 1]));
  d.sort((a, b) => a - b);
  // For white noise σ, the second difference has σ·√6 and its median absolute value 0.674·σ·√6.
  return d.length ? d[d.length >> 1] / (0.674 * Math.sqrt(6)) : 0;
}
