/**
 * Figures with their uncertainty, on the realistic simulator (the truth is each cylinder's simulated peak
 * pressure relative to the sealed cylinders'): nothing capped at 100 %, a cylinder with more compression shows
 * above the rest, a close call is `uncertain` rather than `ok` or `low` by chance, and the intervals are
 * calibrated on the recovery sweep (tests/signal/sweep.test.ts).
 */
import { describe, expect, it } from 'vitest';
import { analyzeBytes, analyzeCapture, compareResults } from '@/signal';
import { simulateCranking } from '@/signal/sim/simulate';
import { readFileSync } from 'node:fs';
import { parseWheel } from '@/signal/teeth/wheel';

const I4 = { cylinders: 4, firingOrder: [1, 3, 4, 2] };

describe('intervals and statuses', () => {
  it('a cylinder with 8 % more compression reads above 100 % with an interval that holds it', () => {
    // Peak pressure ∝ trapped charge^n (n = 1.25): 1.08^(1/1.25) = 1.0635.
    const s = simulateCranking({ engine: I4, chargeScale: [1, 1, 1.0635, 1], channels: ['hall', 'sync'], sampleRateHz: 20000, seed: 3 });
    const r = analyzeCapture({ time: s.time, crank: s.hall, sync: s.sync }, { engine: I4 });
    const c3 = r.cylinders[2];
    expect(s.truth.relativePercent[2]).toBeGreaterThan(107);
    expect(c3.relativePercent!).toBeGreaterThan(104);
    expect(c3.interval![0]).toBeLessThanOrEqual(s.truth.relativePercent[2]);
    expect(c3.interval![1]).toBeGreaterThanOrEqual(s.truth.relativePercent[2]);
    expect(['high', 'uncertain']).toContain(c3.status);
    for (const c of [r.cylinders[0], r.cylinders[1], r.cylinders[3]]) expect(Math.abs(c.relativePercent! - 100)).toBeLessThan(2);
  });

  it('a 90 % cylinder blurred by a noisy, short capture is uncertain, with a sentence naming it', () => {
    const s = simulateCranking({ engine: I4, leakPerS: [0, 0.15, 0, 0], channels: ['current', 'sync'], noise: 6, seed: 3 });
    expect(Math.abs(s.truth.relativePercent[1] - 90)).toBeLessThan(1);
    const r = analyzeCapture({ time: s.time, current: s.current, sync: s.sync }, { engine: I4 });
    expect(r.cylinders[1].status).toBe('uncertain');
    expect(r.warnings.find((w) => w.code === 'CLOSE_CALL')?.message).toMatch(/^Cylinder 2 reads [\d.]+–[\d.]+ %.*record again with 5–10 s of cranking, or gauge it\.$/);
  });

  it('low only when the whole interval is below the limit', () => {
    const s = simulateCranking({ engine: I4, leakPerS: [0, 0, 3, 0], channels: ['current', 'sync'], seed: 5 });
    const r = analyzeCapture({ time: s.time, current: s.current, sync: s.sync }, { engine: I4 });
    for (const c of r.cylinders) {
      if (c.status === 'low') expect(c.interval![1]).toBeLessThan(r.settings.lowLimitPercent);
      if (c.status === 'ok') expect(c.interval![0]).toBeGreaterThanOrEqual(r.settings.lowLimitPercent);
    }
    expect(r.cylinders[2].status).toBe('low');
  });

  it('every cylinder of every sample with figures carries an interval', () => {
    const manifest: { file: string; engine?: typeof I4; teeth?: string; truthPercent?: number[] | null; sensor?: 'vr' }[] = JSON.parse(readFileSync('samples/manifest.json', 'utf8'));
    for (const m of manifest.filter((x) => x.truthPercent)) {
      const { result } = analyzeBytes(new Uint8Array(readFileSync(`samples/${m.file}`)), { engine: m.engine!, teeth: m.teeth ? parseWheel(m.teeth)! : undefined, sensor: m.sensor });
      for (const c of result.cylinders) {
        expect(c.interval, `${m.file} cylinder ${c.cylinder}`).not.toBeNull();
        expect(c.interval![0]).toBeLessThanOrEqual(c.relativePercent!);
        expect(c.interval![1]).toBeGreaterThanOrEqual(c.relativePercent!);
      }
    }
  });

  it('before and after: a change counts only when the intervals separate', () => {
    const before = { cylinders: [{ cylinder: 1, interval: [40, 50] as [number, number] }, { cylinder: 2, interval: [95, 103] as [number, number] }] };
    const after = { cylinders: [{ cylinder: 1, interval: [94, 102] as [number, number] }, { cylinder: 2, interval: [97, 104] as [number, number] }] };
    const changes = compareResults(before as never, after as never);
    expect(changes.map((c) => c.change)).toEqual(['up', 'none']);
  });
});
