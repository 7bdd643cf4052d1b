/**
 * Variable-reluctance decoding as a VR interface circuit does it (common practice: arm on a fraction of the
 * previous peak, time the zero crossing): simulated VR waves with a small wiggle across the gap, at 10 to
 * 100 kHz, from a few tenths of a volt, either polarity, give the 60-2 wheel and every tooth.
 */
import { describe, expect, it } from 'vitest';
import { analyzeCapture } from '@/signal/analyze';
import { simulateCranking } from '@/signal/sim/simulate';
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
