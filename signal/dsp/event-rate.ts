/**
 * The strongest periodic component of a uniformly sampled signal within a frequency band: an FFT (fft.js)
 * for the estimate, with harmonics summed so a weak cylinder cannot pull the pick to the cycle rate, then
 * autocorrelation around the estimate to refine it.
 */
import FFT from 'fft.js';

const plans = new Map<number, FFT>();

function planFor(size: number): FFT {
  let p = plans.get(size);
  if (!p) {
    p = new FFT(size);
    plans.set(size, p);
  }
  return p;
}

/** The Hann window's weight at sample `i` of `n`. */
function hann(i: number, n: number): number {
  return 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / Math.max(1, n - 1));
}

/**
 * Amplitude of the component repeating `perCycle` times per cycle in `x` (uniformly sampled, `samplesPerCycle`
 * samples a cycle): one DFT coefficient at any frequency, mean removed and Hann-windowed as in
 * {@link powerSpectrum}.
 */
export function orderAmplitude(x: Float64Array, samplesPerCycle: number, perCycle: number): number {
  const n = x.length;
  let mean = 0;
  for (let j = 0; j < n; j++) mean += x[j];
  mean /= n || 1;
  let re = 0;
  let im = 0;
  const w = (2 * Math.PI * perCycle) / samplesPerCycle;
  for (let j = 0; j < n; j++) {
    const v = (x[j] - mean) * hann(j, n);
    re += v * Math.cos(w * j);
    im -= v * Math.sin(w * j);
  }
  return Math.hypot(re, im) / (n || 1);
}

/** Power spectrum |X_k|² of a real signal (mean removed, zero-padded to a power of two ≥ 4× length). */
export function powerSpectrum(x: Float64Array, minSize = 0): { power: Float64Array; size: number } {
  let size = 1;
  while (size < Math.max(x.length * 4, minSize)) size <<= 1;
  let mean = 0;
  for (let i = 0; i < x.length; i++) mean += x[i];
  mean /= x.length || 1;
  const input = new Float64Array(size);
  for (let i = 0; i < x.length; i++) {
    input[i] = (x[i] - mean) * hann(i, x.length);
  }
  const plan = planFor(size);
  const out = plan.createComplexArray() as number[];
  plan.realTransform(out, input as unknown as number[]);
  const power = new Float64Array(size / 2);
  for (let k = 0; k < size / 2; k++) power[k] = out[2 * k] * out[2 * k] + out[2 * k + 1] * out[2 * k + 1];
  return { power, size };
}

export interface RateEstimate {
  /** Hz. */
  frequencyHz: number;
  /** Share of the band's power in the chosen peak and its harmonics, 0…1. */
  strength: number;
}

/** Estimates the dominant rate in [minHz, maxHz] of `x` sampled at `rateHz`. */
export function estimateRate(x: Float64Array, rateHz: number, minHz: number, maxHz: number): RateEstimate | null {
  if (x.length < 16) return null;
  const { power, size } = powerSpectrum(x);
  const binHz = rateHz / size;
  const k0 = Math.max(1, Math.floor(minHz / binHz));
  const k1 = Math.min(power.length - 1, Math.ceil(maxHz / binHz));
  if (k1 <= k0) return null;
  let best = -1;
  let bestScore = 0;
  let total = 0;
  for (let k = k0; k <= k1; k++) total += power[k];
  for (let k = k0; k <= k1; k++) {
    let score = power[k];
    for (let h = 2; h <= 3; h++) {
      const kh = Math.round(k * h);
      if (kh < power.length) score += 0.5 * Math.max(power[kh - 1], power[kh], power[Math.min(power.length - 1, kh + 1)]);
    }
    if (score > bestScore) {
      bestScore = score;
      best = k;
    }
  }
  if (best < 0 || total <= 0) return null;
  // Parabolic interpolation of the peak bin.
  const a = power[best - 1] ?? 0;
  const b = power[best];
  const c = power[best + 1] ?? 0;
  const denom = a - 2 * b + c;
  const offset = denom !== 0 ? Math.max(-0.5, Math.min(0.5, (0.5 * (a - c)) / denom)) : 0;
  const coarse = (best + offset) * binHz;
  const refined = refineByAutocorrelation(x, rateHz, coarse);
  return { frequencyHz: refined, strength: Math.min(1, power[best] / total) };
}

/** Finds the autocorrelation peak within ±20 % of the lag 1/f and returns the refined frequency. */
export function refineByAutocorrelation(x: Float64Array, rateHz: number, frequencyHz: number): number {
  const lag0 = rateHz / frequencyHz;
  const lo = Math.max(2, Math.floor(lag0 * 0.8));
  const hi = Math.min(x.length - 2, Math.ceil(lag0 * 1.2));
  if (hi <= lo + 2) return frequencyHz;
  let mean = 0;
  for (let i = 0; i < x.length; i++) mean += x[i];
  mean /= x.length;
  const r = (lag: number) => {
    let s = 0;
    for (let i = 0; i + lag < x.length; i++) s += (x[i] - mean) * (x[i + lag] - mean);
    return s / (x.length - lag);
  };
  let bestLag = lo;
  let best = -Infinity;
  const values = new Float64Array(hi - lo + 1);
  for (let lag = lo; lag <= hi; lag++) {
    const v = r(lag);
    values[lag - lo] = v;
    if (v > best) {
      best = v;
      bestLag = lag;
    }
  }
  if (bestLag === lo || bestLag === hi) return frequencyHz;
  const a = values[bestLag - lo - 1];
  const b = values[bestLag - lo];
  const c = values[bestLag - lo + 1];
  const denom = a - 2 * b + c;
  const offset = denom !== 0 ? (0.5 * (a - c)) / denom : 0;
  return rateHz / (bestLag + offset);
}

/** Compression events per second for a four-stroke: f = N·rpm/120. */
export function compressionEventRateHz(cylinders: number, rpm: number): number {
  return (cylinders * rpm) / 120;
}
