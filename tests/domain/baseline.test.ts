/**
 * The shop's baselines: ranges are the 10th–90th percentiles with linear interpolation between order statistics
 * (Hyndman & Fan 1996, definition 7, the default of R's quantile() and NumPy's percentile()), shown only from five
 * captures, and a new capture is placed below, within or above them.
 */
import { describe, expect, it } from 'vitest';
import { BASELINE_MIN_CAPTURES, baselineKey, baselineSentences, buildBaseline } from '@/domain/baseline';

const rpm = (v: number) => ({ crankingRpm: v });

describe('shop baselines', () => {
  it('the range of 188, 195, 200, 205, 214 rpm is 190.8–210.4 (definition 7: h = (n − 1)·p)', () => {
    const b = buildBaseline([188, 195, 200, 205, 214].map(rpm));
    expect(b.crankingRpm!.low).toBeCloseTo(190.8, 6);
    expect(b.crankingRpm!.high).toBeCloseTo(210.4, 6);
    expect(b.crankingRpm!.captures).toBe(5);
  });

  it('fewer than five captures give no range', () => {
    expect(BASELINE_MIN_CAPTURES).toBe(5);
    expect(buildBaseline([188, 195, 200, 205].map(rpm))).toEqual({});
  });

  it('a slow capture is said to be below the shop’s healthy ones, with their count', () => {
    const b = buildBaseline([188, 190, 200, 205, 212, 214, 196, 199, 201, 203, 207, 209].map(rpm));
    const cylinders = [{ cylinder: 1, raw: 0, relativePercent: 100, interval: null, status: 'ok' as const, events: 5, rejected: 0, spreadPercent: 0, plainPercent: null, perCycle: [] }];
    const [line] = baselineSentences({ crankingRpm: 152, rawUnit: 'rpm', cylinders }, b);
    expect(line).toMatch(/^Cranking speed 152 rpm; healthy captures of this engine in your shop: 19\d–21\d rpm \(12 captures\), below them\.$/);
  });

  it('engines share a baseline only with the same cylinders, layout, firing order and displacement', () => {
    const a = baselineKey({ cylinders: 4, layout: 'inline', firingOrder: [1, 3, 4, 2], displacementL: 2 });
    expect(baselineKey({ cylinders: 4, layout: 'inline', firingOrder: [1, 3, 4, 2], displacementL: 2.0 })).toBe(a);
    expect(baselineKey({ cylinders: 4, layout: 'inline', firingOrder: [1, 2, 4, 3], displacementL: 2 })).not.toBe(a);
    expect(baselineKey({ cylinders: 4, layout: 'inline', firingOrder: [1, 3, 4, 2], displacementL: 1.6 })).not.toBe(a);
  });
});
