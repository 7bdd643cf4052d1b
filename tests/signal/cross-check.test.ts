/**
 * Two methods read from one capture, checked against each other (signal/steps/cross-check.ts), and the
 * event-duration method as the check on crank speed where the teeth are fine (issue 19, point 1). The captures
 * come from the simulator (SIGNAL.md physics: Heywood's slider-crank volume, polytropic gas with leakage); the
 * overlap rule is the one before-and-after comparisons use (two 90 % intervals that share no value differ).
 */
import { describe, expect, it } from 'vitest';
import { analyzeCapture } from '@/signal/analyze';
import { drawEngine } from '@/signal/sim/ensemble';
import { simulateCranking } from '@/signal/sim/simulate';
import { alignedToTruth, SWEEP_ENGINES } from '@/signal/sim/sweep';
import { simpleWheel } from '@/signal/teeth/wheel';
import { crossCheck, intervalsOverlap } from '@/signal/steps/cross-check';
import type { CylinderResult, MethodResult } from '@/signal/types';

const I5 = { cylinders: 5, firingOrder: [1, 2, 4, 5, 3] };
const V6odd = { cylinders: 6, firingOrder: [1, 6, 5, 4, 3, 2], intervalsDeg: [90, 150, 90, 150, 90, 150], layout: 'v' as const };

function method(figures: [number, [number, number], CylinderResult['status']][], identity: MethodResult['identity'] = 'sync', eventTimes: number[] = []): MethodResult {
  const n = figures.length;
  return {
    method: 'crank-speed',
    crankingRpm: 200,
    identity,
    window: { startS: 0, endS: 5 },
    cylinders: figures.map(([p, interval, status], i) => ({ cylinder: i + 1, relativePercent: p, interval, status, events: 5, rejected: 0, spreadPercent: 1, plainPercent: p, raw: 0, perCycle: [] })),
    events: eventTimes.map((timeS, k) => ({ timeS, cylinder: (k % n) + 1, used: true })),
    rawUnit: 'rpm',
    spreadPercent: 0,
    fitQuality: 1,
    warnings: [],
  };
}

describe('cross-check of two methods', () => {
  it('agrees where the intervals overlap, even 15 points apart (worked by hand)', () => {
    const mine = method([[100, [97, 103], 'ok'], [60, [55, 65], 'low']]);
    const other = method([[100, [90, 110], 'ok'], [75, [60, 90], 'uncertain']]);
    const c = crossCheck(mine, other, [1, 2])!;
    expect(c.agree).toBe(true);
    expect(c.maxDifference).toBe(15);
    expect(mine.cylinders[1].interval).toEqual([55, 65]);
  });

  it('disagrees where the intervals are apart, and reaches halfway to the other figure (worked by hand)', () => {
    const mine = method([[100, [97, 103], 'ok'], [60, [55, 65], 'low']]);
    const other = method([[100, [90, 110], 'ok'], [90, [85, 95], 'uncertain']]);
    const c = crossCheck(mine, other, [1, 2])!;
    expect(c.agree).toBe(false);
    // Middle 60, other 90: halfway is 75.
    expect(mine.cylinders[1].interval).toEqual([55, 75]);
    expect(intervalsOverlap([55, 65], [85, 95])).toBe(false);
    expect(intervalsOverlap([55, 65], [65, 95])).toBe(true);
  });

  it('renumbers a method whose cylinder 1 is assumed by its events, nearest in time', () => {
    // Mine names the events at 0.1, 0.2, 0.3 as cylinders 1, 2, 3; the other starts one event later.
    const mine = method([[100, [97, 103], 'ok'], [60, [55, 65], 'low'], [100, [97, 103], 'ok']], 'sync', [0.1, 0.2, 0.3, 0.4, 0.5, 0.6]);
    const other = method([[62, [50, 70], 'low'], [100, [95, 105], 'ok'], [100, [95, 105], 'ok']], 'assumed', [0.2, 0.3, 0.4, 0.5]);
    const c = crossCheck(mine, other, [1, 2, 3])!;
    expect(c.cylinders.map((x) => x.relativePercent)).toEqual([100, 62, 100]);
    expect(c.agree).toBe(true);
  });
});

describe('event duration checks crank speed on a fine wheel', () => {
  it('tooth times alone, I5 with one leak: the two readings name the same low cylinder and agree', () => {
    const s = simulateCranking({ engine: I5, leakPerS: [0, 0, 0, 3, 0], noise: 2, sampleRateHz: 10_000, seed: 11, teeth: { count: 36, missing: 2 } });
    const r = analyzeCapture({ toothTimes: s.toothTimes }, { engine: I5, teeth: simpleWheel(36, 2) });
    expect(r.method).toBe('crank-speed');
    expect(r.crossCheck?.method).toBe('event-duration');
    expect(r.crossCheck?.agree).toBe(true);
    const low = r.cylinders.filter((c) => c.status === 'low').map((c) => c.cylinder);
    expect(low).toHaveLength(1);
    expect(r.crossCheck!.cylinders.filter((c) => c.status === 'low').map((c) => c.cylinder)).toEqual(low);
    expect(r.warnings.map((w) => w.code)).not.toContain('METHODS_DISAGREE');
  });

  it('an odd-fire V6 read by event duration compares events of the same length only: healthy reads healthy', () => {
    const s = simulateCranking({ engine: V6odd, channels: ['hall', 'sync'], sampleRateHz: 50_000, seed: 11 });
    const r = analyzeCapture({ time: s.time, crank: s.hall, sync: s.sync }, { engine: V6odd, method: 'event-duration' });
    expect(r.identity).toBe('sync');
    for (const c of r.cylinders) {
      expect(c.status).not.toBe('low');
      expect(c.interval![0]).toBeLessThanOrEqual(100);
      expect(c.interval![1]).toBeGreaterThanOrEqual(100);
    }
  });

  it('event duration takes cylinder 1 from a sync channel', () => {
    const s = simulateCranking({ engine: I5, leakPerS: [0, 0, 0, 3, 0], channels: ['hall', 'sync'], sampleRateHz: 50_000, seed: 11 });
    const r = analyzeCapture({ time: s.time, crank: s.hall, sync: s.sync }, { engine: I5, method: 'event-duration' });
    expect(r.identity).toBe('sync');
    expect(r.cylinders.filter((c) => c.status === 'low').map((c) => c.cylinder)).toEqual([4]);
  });
});

/**
 * Event duration reads a cylinder from the event after it. On an ensemble draw (signal/sim/ensemble.ts, seed 206: an
 * I3 with a nearly dead cylinder leaking through an orifice) the healthy cylinder before the dead one read 0 % `low`,
 * from a figure of −122 %, because the dead cylinder's own event changes too. Its interval now reaches a healthy
 * cylinder's, so it is `uncertain`, never a confident `low`. Engine and leak are a simulator draw, not trade figures.
 */
describe('event duration beside a nearly dead cylinder', () => {
  it('gives the cylinder before it an interval that holds a healthy figure', () => {
    const engine = SWEEP_ENGINES.I3;
    const d = drawEngine(engine, 206, 'ensemble');
    const sim = simulateCranking({ ...d.physics, engine, leakPerS: d.leakPerS, channels: [], seed: 206, sampleRateHz: 10_000 });
    const truth = sim.truth.relativePercent;
    const dead = Array.from(truth).findIndex((t) => t < 10);
    expect(dead).toBeGreaterThanOrEqual(0);
    const r = analyzeCapture({ toothTimes: sim.toothTimes }, { engine, method: 'event-duration' });
    const { status, interval } = alignedToTruth(r, truth, engine);
    // The cylinder that fires before the dead one (firing order 1-2-3).
    const order = engine.firingOrder;
    const before = order[(order.indexOf(dead + 1) + order.length - 1) % order.length] - 1;
    expect(truth[before]).toBeGreaterThan(95);
    expect(status[before]).not.toBe('low');
    expect(interval[before]![1]).toBeGreaterThanOrEqual(100);
  });
});
