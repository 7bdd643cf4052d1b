/**
 * Variable-reluctance decoding as a VR interface circuit does it (common practice: arm on a fraction of the
 * previous peak, time the zero crossing): simulated VR waves with a small wiggle across the gap, at 10 to
 * 100 kHz, from a few tenths of a volt, either polarity, give the 60-2 wheel and every tooth.
 */
import { describe, expect, it } from 'vitest';
import { analyzeCapture } from '@/signal/analyze';
import { simulateCranking } from '@/signal/sim/simulate';
import { SWEEP_ENGINES } from '@/signal/sim/sweep';
import { toothTimesFromWaveform } from '@/signal/teeth/from-waveform';

const I4 = { cylinders: 4, firingOrder: [1, 3, 4, 2] };

describe('VR waveform decoding', () => {
  it.each([
    [10_000, 1, false],
    [50_000, 0.12, false],
    [100_000, 1, true],
    [20_000, 0.12, true],
  ])('%i samples/s, amplitude ×%f, inverted %s: every tooth, the wheel learned', (rate, scale, inverted) => {
    const sim = simulateCranking({ engine: I4, channels: ['vr'], sampleRateHz: rate, vrScale: scale, vrInverted: inverted, durationS: 4, seed: 5 });
    const teeth = toothTimesFromWaveform(sim.time, sim.vr!, 'vr');
    // Within the crank's turning, as many edges as the simulator's teeth (± the ends).
    const within = (x: number) => x > 0.6 && x < sim.time[sim.time.length - 1] - 1;
    const want = Array.from(sim.toothTimes).filter(within);
    const got = Array.from(teeth).filter(within);
    expect(Math.abs(got.length - want.length)).toBeLessThanOrEqual(2);
    const r = analyzeCapture({ time: sim.time, crank: sim.vr }, { engine: I4, sensor: 'vr' });
    expect(r.wheel?.notation).toBe('60-2');
    expect(r.verdict).not.toBe('uncertain');
  });

  // The flux model (signal/sim/simulate.ts, vrModel 'flux'): the coil's voltage is the rate of change of flux
  // (Faraday's law), so its amplitude grows in proportion to speed and the gap is one wide swing; noise with a slow
  // drift of the zero, 20 kHz, down to about 0.1 V at the slowest teeth, either polarity, six engine layouts.
  it('waves from the flux model decode on every engine layout, either polarity, down to a tenth of a volt', () => {
    const errors: number[] = [];
    let seed = 5;
    for (const [name, engine] of Object.entries(SWEEP_ENGINES)) {
      for (const inverted of [false, true]) {
        for (const scale of [0.3, 1]) {
          const leakPerS = Array.from({ length: engine.cylinders }, (_, i) => (i === 1 ? 2 : 0));
          const sim = simulateCranking({ engine, leakPerS, channels: ['vr', 'sync'], vrModel: 'flux', vrInverted: inverted, vrScale: scale, sampleRateHz: 20_000, seed, noise: 1 + (seed % 3) });
          seed++;
          const r = analyzeCapture({ time: sim.time, crank: sim.vr, sync: sim.sync }, { engine });
          expect(r.wheel?.notation, `${name} ×${scale}${inverted ? ' inverted' : ''}`).toBe('60-2');
          for (const c of r.cylinders) errors.push(Math.abs(c.relativePercent! - sim.truth.relativePercent[c.cylinder - 1]));
        }
      }
    }
    const mae = errors.reduce((a, b) => a + b, 0) / errors.length;
    console.log(`flux-model VR: ${errors.length} figures, mean |error| ${mae.toFixed(2)} points, worst ${Math.max(...errors).toFixed(1)}`);
    expect(errors.every(Number.isFinite)).toBe(true);
    expect(mae).toBeLessThanOrEqual(2);
  }, 120_000);

  it('pure noise gives no teeth to speak of', () => {
    const t = Float64Array.from({ length: 40_000 }, (_, i) => i / 20_000);
    let s = 7;
    const v = t.map(() => {
      s = (s * 1103515245 + 12345) % 2147483648;
      return (s / 2147483648 - 0.5) * 0.6;
    });
    const r = analyzeCapture({ time: t, crank: v }, { engine: I4, sensor: 'vr' });
    expect(r.verdict).toBe('uncertain');
    expect(r.cylinders.every((c) => c.relativePercent === null)).toBe(true);
  });
});
