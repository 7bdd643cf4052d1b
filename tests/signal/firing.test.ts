// Firing orders, intervals and neighbours against the published tables.
import { describe, expect, it } from 'vitest';
import { analysisSettingsSchema } from '@/domain/analysis-settings';
import { engineSchema } from '@/domain/engine';
import { areNeighbours, firingIntervals, firingIntervalsProblem, firingOrderProblem, parseFiringOrder, tdcPhasesDeg } from '@/signal/engine/firing';
import { ENGINE_PROFILES } from '@/signal/engine/profiles';
import { CaptureError } from '@/signal/errors';
import { symmetryStep } from '@/signal/steps/identity';

describe('firing intervals (Wikipedia, "Firing order")', () => {
  it.each([
    [3, 240],
    [4, 180],
    [5, 144],
    [6, 120],
    [8, 90],
    [10, 72],
    [12, 60],
  ])('even fire, %i cylinders: %i° apart', (n, interval) => {
    const order = Array.from({ length: n }, (_, i) => i + 1);
    expect(firingIntervals({ cylinders: n, firingOrder: order })).toEqual(new Array(n).fill(interval));
  });

  it('odd-fire 90° V6 alternates 90°/150° and repeats every two firings', () => {
    const v6 = ENGINE_PROFILES.find((p) => p.key === 'v6-odd')!;
    expect(firingIntervals(v6)).toEqual([90, 150, 90, 150, 90, 150]);
    expect(symmetryStep(v6.intervalsDeg!)).toBe(2);
    expect(Array.from(tdcPhasesDeg(v6))).toEqual([0, 570, 480, 330, 240, 90]);
  });

  it('I4 1-3-4-2: cylinder 3 is 180° after 1, 4 at 360°, 2 at 540°', () => {
    expect(Array.from(tdcPhasesDeg({ cylinders: 4, firingOrder: [1, 3, 4, 2] }))).toEqual([0, 540, 180, 360]);
  });
});

describe('published firing orders (Wikipedia, "Firing order")', () => {
  it.each(ENGINE_PROFILES.map((p) => [p.label, p] as const))('%s is a permutation with intervals summing to 720°', (_l, p) => {
    expect([...p.firingOrder].sort((a, b) => a - b)).toEqual(Array.from({ length: p.cylinders }, (_, i) => i + 1));
    expect(firingIntervals(p).reduce((a, b) => a + b, 0)).toBeCloseTo(720, 6);
  });

  it('parses the written forms', () => {
    expect(parseFiringOrder('1-5-3-6-2-4', 6)).toEqual([1, 5, 3, 6, 2, 4]);
    expect(parseFiringOrder('1,8,4,3,6,5,7,2', 8)).toEqual([1, 8, 4, 3, 6, 5, 7, 2]);
  });

  it.each([
    ['1-3-4-4', 4],
    ['1-2-3', 4],
    ['1-2-3-4-5', 4],
    ['0-1-2-3', 4],
    ['a-b', 2],
  ])('refuses "%s" for %i cylinders with a typed error', (text, n) => {
    expect(() => parseFiringOrder(text, n)).toThrow(CaptureError);
  });
});

describe('neighbours come from the layout, never the firing order (TRADE.md, SAE J824 numbering; common practice)', () => {
  it('inline: consecutive numbers', () => {
    const i4 = { cylinders: 4, firingOrder: [1, 3, 4, 2] };
    expect(areNeighbours(i4, 2, 3)).toBe(true);
    expect(areNeighbours(i4, 1, 3)).toBe(false); // neighbours in firing order, not on the block
  });

  it('V8 numbered along the crank (odd one bank, even the other): 1–3 and 2–4 are neighbours, 1–2 are not', () => {
    const v8 = { cylinders: 8, firingOrder: [1, 8, 4, 3, 6, 5, 7, 2], layout: 'v' as const, numbering: 'along-crank' as const };
    expect(areNeighbours(v8, 1, 3)).toBe(true);
    expect(areNeighbours(v8, 2, 4)).toBe(true);
    expect(areNeighbours(v8, 1, 2)).toBe(false);
  });

  it('V8 numbered bank by bank: 1–2 are neighbours, 4–5 are on different banks', () => {
    const v8 = { cylinders: 8, firingOrder: [1, 5, 4, 8, 6, 3, 7, 2], layout: 'v' as const, numbering: 'bank-by-bank' as const };
    expect(areNeighbours(v8, 1, 2)).toBe(true);
    expect(areNeighbours(v8, 4, 5)).toBe(false);
  });
});

// The one rule behind the engine, the vehicle and settings forms and the settings schema.
describe('firing order and interval rules, written once', () => {
  it('accepts every shipped profile (common practice orders) and names what is wrong otherwise', () => {
    for (const p of ENGINE_PROFILES) {
      expect(firingOrderProblem(p.firingOrder, p.cylinders)).toBeNull();
      if (p.intervalsDeg) expect(firingIntervalsProblem(p.intervalsDeg, p.cylinders)).toBeNull();
    }
    expect(firingOrderProblem([1, 3, 4, 4], 4)).toBe('The firing order must list each cylinder 1 to 4 exactly once; "1-3-4-4" does not.');
    expect(firingOrderProblem([1, 3, 2], 4)).toMatch(/lists 3 cylinders but the engine has 4/);
    // A four-stroke cycle is two revolutions, 720° (any engine handbook).
    expect(firingIntervalsProblem([90, 150, 90, 150, 90, 150], 6)).toBeNull();
    expect(firingIntervalsProblem([90, 150, 90, 150, 90, 90], 6)).toMatch(/add up to 660°/);
  });

  it('the settings and vehicle schemas give the same sentence', () => {
    const bad = { cylinders: 4, firingOrder: [1, 3, 4, 4] };
    const a = analysisSettingsSchema.safeParse({ engine: bad });
    const v = engineSchema.safeParse({ ...bad, layout: 'inline' });
    expect(a.success || v.success).toBe(false);
    expect(a.error!.issues[0].message).toBe(firingOrderProblem(bad.firingOrder, 4));
    expect(v.error!.issues[0].message).toBe(firingOrderProblem(bad.firingOrder, 4));
  });
});
