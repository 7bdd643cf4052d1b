// Spectral estimate, event-rate derivation, decimation and the linear solver against independent references.
import FFT from 'fft.js';
import { describe, expect, it } from 'vitest';
import { decimateMinMax } from '@/signal/dsp/decimate';
import { compressionEventRateHz, estimateRate } from '@/signal/dsp/event-rate';
import { choleskySolve } from '@/signal/dsp/solve';
import { toothPeriodS } from '@/signal/teeth/wheel';

describe('fft.js against a naive DFT (the definition X_k = Σ x_n e^(−2πikn/N))', () => {
  it.each([16, 64, 256])('size %i', (size) => {
    const x = Array.from({ length: size }, (_, i) => Math.sin(i * 0.7) + 0.3 * Math.cos(i * 2.1) + ((i * 7919) % 13) / 13);
    const f = new FFT(size);
    const out = f.createComplexArray() as number[];
    f.realTransform(out, x);
    f.completeSpectrum(out);
    for (let k = 0; k < size; k++) {
      let re = 0;
      let im = 0;
      for (let n = 0; n < size; n++) {
        re += x[n] * Math.cos((-2 * Math.PI * k * n) / size);
        im += x[n] * Math.sin((-2 * Math.PI * k * n) / size);
      }
      expect(out[2 * k]).toBeCloseTo(re, 9);
      expect(out[2 * k + 1]).toBeCloseTo(im, 9);
    }
  });
});

describe('event rate f = N·rpm/120 for a four-stroke (TRADE.md, derived)', () => {
  it('4 cylinders at 200 rpm → 6.67 Hz; 8 at 250 rpm → 16.7 Hz', () => {
    expect(compressionEventRateHz(4, 200)).toBeCloseTo(6.667, 3);
    expect(compressionEventRateHz(8, 250)).toBeCloseTo(16.667, 3);
  });

  it('the estimator finds a 6.67 Hz event train with harmonics and noise to within 0.5 %', () => {
    const rate = 1000;
    const x = new Float64Array(5000);
    let s = 12345;
    for (let i = 0; i < x.length; i++) {
      const t = i / rate;
      s = (s * 1103515245 + 12345) % 2147483648;
      x[i] = Math.cos(2 * Math.PI * 6.667 * t) + 0.6 * Math.cos(2 * Math.PI * 13.33 * t + 1) + 0.3 * (s / 2147483648 - 0.5);
    }
    const est = estimateRate(x, rate, 3, 14)!;
    expect(Math.abs(est.frequencyHz - 6.667) / 6.667).toBeLessThan(0.005);
  });
});

describe('tooth period = 60 / (rpm × pitches) (TRADE.md, derived)', () => {
  it('60-2 at 300 rpm → 3.333 ms; 36-1 at 300 rpm → 5.556 ms', () => {
    expect(toothPeriodS(300, 60) * 1000).toBeCloseTo(3.333, 3);
    expect(toothPeriodS(300, 36) * 1000).toBeCloseTo(5.556, 3);
  });
});

describe('min/max decimation keeps every extreme (uPlot-style columns)', () => {
  it('matches a brute-force min/max per column', () => {
    const n = 10_007;
    const t = Float64Array.from({ length: n }, (_, i) => i);
    const y = Float64Array.from({ length: n }, (_, i) => Math.sin(i / 37) + (i % 997 === 0 ? 5 : 0));
    const v = decimateMinMax(t, y, 0, n, 100);
    expect(v.min.length).toBe(100);
    for (let c = 0; c < 100; c++) {
      const a = Math.floor((c * n) / 100);
      const b = Math.floor(((c + 1) * n) / 100);
      const slice = Array.from(y.subarray(a, b));
      expect(v.min[c]).toBe(Math.min(...slice));
      expect(v.max[c]).toBe(Math.max(...slice));
    }
  });
});

describe('Cholesky least squares against a hand-solved system', () => {
  it('solves [[4,2],[2,3]]·x = [2,1] → x = [0.5, 0]', () => {
    const b = Float64Array.from([2, 1]);
    expect(choleskySolve(Float64Array.from([4, 2, 2, 3]), b, 2, 0)).toBe(true);
    expect(b[0]).toBeCloseTo(0.5, 12);
    expect(b[1]).toBeCloseTo(0, 12);
  });
});
