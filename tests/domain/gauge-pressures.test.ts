/**
 * Gauge-equivalent pressures against the trade's worked example: a gauge test passes when the lowest cylinder is
 * at least 70 % of the highest and at least 100 psi (690 kPa); highest 150 psi → lowest allowed 105 psi (factory
 * service information, several makes; ../shared/design/TRADE.md). Units: 1 psi = 6.894757 kPa (NIST SP 811,
 * appendix B).
 */
import { describe, expect, it } from 'vitest';
import { gaugePressures, type GaugePressures } from '@/domain/gauge-pressures';
import { pressureFrom, pressureIn } from '@/domain/units';
import type { AnalysisResult } from '@/signal';

type Cyl = AnalysisResult['cylinders'][number];
const cyl = (cylinder: number, pct: number | null, half = 0.5): Cyl => ({
  cylinder, relativePercent: pct, interval: pct === null ? null : [pct - half, pct + half], status: 'ok', events: 6, rejected: 0, spreadPercent: 1, plainPercent: pct, raw: 0, perCycle: [],
});
const result = (figures: (number | null)[], identity: AnalysisResult['identity'] = 'sync') => ({ cylinders: figures.map((p, i) => cyl(i + 1, p)), identity });
const psi = (v: number) => pressureFrom(v, 'psi');
const ok = (r: ReturnType<typeof gaugePressures>) => {
  if ('problem' in r) throw new Error(r.problem);
  return r as GaugePressures;
};

describe('gauge-equivalent pressures', () => {
  it('units: 150 psi is 1034.2 kPa and 10.34 bar', () => {
    expect(psi(150)).toBeCloseTo(1034.21, 2);
    expect(pressureIn(psi(150), 'bar')).toBe(10.34);
    expect(pressureIn(psi(150), 'psi')).toBe(150);
  });

  it('worked example: highest 150 psi, lowest allowed 105 psi (70 %); 102 psi fails the difference rule though above 100 psi', () => {
    const p = ok(gaugePressures(result([100, 100, 100, 68]), { cylinder: 1, readingKpa: psi(150), accuracyPercent: 1, minimumKpa: psi(100), maxDifferencePercent: 30 }));
    expect(pressureIn(p.cylinders[3].kpa!, 'psi')).toBe(102);
    expect(p.cylinders[3].status).toBe('ok');
    expect(p.spread).toMatchObject({ allowedShare: 70, status: 'beyond' });
    expect(p.sentence).toContain('below the 70 % allowed');
  });

  it('worked example: 108 psi (72 % of 150) passes both rules', () => {
    const p = ok(gaugePressures(result([100, 100, 100, 72]), { cylinder: 1, readingKpa: psi(150), accuracyPercent: 1, minimumKpa: psi(100), maxDifferencePercent: 30 }));
    expect(pressureIn(p.cylinders[3].kpa!, 'psi')).toBe(108);
    expect(p.spread?.status).toBe('within');
    expect(p.sentence).toBe('Every cylinder’s estimated pressure meets the specification entered.');
  });

  it('a cylinder whose whole interval is under the minimum is below it; one straddling it is uncertain', () => {
    const p = ok(gaugePressures(result([100, 100, 60, 67]), { cylinder: 1, readingKpa: psi(150), accuracyPercent: 2, minimumKpa: psi(100) }));
    expect(p.cylinders[2].status).toBe('below minimum');
    expect(p.cylinders[3].status).toBe('uncertain');
    expect(p.cylinders[0]).toMatchObject({ gauged: true, kpa: Math.round(psi(150) * 10) / 10 });
    // The gauged cylinder's interval is the gauge's own accuracy.
    expect(p.cylinders[0].interval![1] / psi(150)).toBeCloseTo(1.02, 3);
  });

  it('intervals combine both figures and the gauge: wider than either alone, never below 0', () => {
    const r = result([100, 50, 100, 100]);
    r.cylinders[1].interval = [40, 56];
    const p = ok(gaugePressures(r, { cylinder: 1, readingKpa: 1000, accuracyPercent: 2 }));
    const [lo, hi] = p.cylinders[1].interval!;
    expect(lo).toBeLessThan(1000 * 0.4);
    expect(hi).toBeGreaterThan(1000 * 0.56);
    expect(lo).toBeGreaterThanOrEqual(0);
  });

  it('refuses when the cylinder numbers are assumed, or the gauged cylinder has no figure', () => {
    expect(gaugePressures(result([100, 100, 100, 100], 'assumed'), { cylinder: 1, readingKpa: 1000, accuracyPercent: 2 })).toHaveProperty('problem');
    expect(gaugePressures(result([null, 100, 100, 100]), { cylinder: 1, readingKpa: 1000, accuracyPercent: 2 })).toHaveProperty('problem');
  });
});
