/**
 * The recovery sweep on the realistic simulator (SIGNAL.md physics: Heywood slider-crank volume, polytropic gas
 * with leakage, a DC starter on a battery driving through a one-way clutch with a light armature, valve
 * springs, crank inertia and friction; tuned so healthy engines swing max/min 1.7–2.4 within an event as the
 * real recordings in captures-real/ do). Engines × methods × leak patterns. Two things are checked:
 *  - never a confident wrong flag: a healthy cylinder (truth ≥ 95 %) `low`, or a weak one (truth < 80 %) `ok`;
 *  - the mean absolute error of the figures per method within the tolerance stated below (printed).
 */
import { describe, expect, it } from 'vitest';
import { analyzeCapture } from '@/signal/analyze';
import type { EngineSetup } from '@/signal/engine/firing';
import { simulateCranking, type SimChannel } from '@/signal/sim/simulate';
import type { AnalysisResult, CaptureColumns } from '@/signal/types';

type Method = 'current+sync' | 'teeth' | 'hall+sync' | 'vr' | 'teeth, event duration';
const ENGINES: Record<string, EngineSetup> = {
  I3: { cylinders: 3, firingOrder: [1, 2, 3] },
  I4: { cylinders: 4, firingOrder: [1, 3, 4, 2] },
  I5: { cylinders: 5, firingOrder: [1, 2, 4, 5, 3] },
  I6: { cylinders: 6, firingOrder: [1, 5, 3, 6, 2, 4] },
  V6odd: { cylinders: 6, firingOrder: [1, 6, 5, 4, 3, 2], intervalsDeg: [90, 150, 90, 150, 90, 150], layout: 'v' },
  V8: { cylinders: 8, firingOrder: [1, 8, 4, 3, 6, 5, 7, 2], layout: 'v' },
};
const LEAKS: Record<string, (n: number) => number[]> = {
  healthy: () => [],
  'one leak': (n) => Array.from({ length: n }, (_, i) => (i === n - 2 ? 3 : 0)),
  'two leaks': (n) => Array.from({ length: n }, (_, i) => (i === 0 || i === 2 ? 1.5 : 0)),
};
/** Mean absolute error per method on this sweep, percentage points (measured; figures as they are, not capped at 100). */
const TOLERANCE: Record<Method, number> = { 'current+sync': 1.7, teeth: 1.5, 'hall+sync': 1.5, vr: 1.5, 'teeth, event duration': 6 };
/** Teeth a speed curve is read from are timed event by event too: the two readings agree on a share of the captures at least this. */
const TEETH_CHECK_AGREES = 0.8;

function run(engine: EngineSetup, leak: number[], method: Method, seed: number): { r: AnalysisResult; truth: Float64Array } {
  const channels: SimChannel[] = method === 'current+sync' ? ['current', 'sync'] : method === 'hall+sync' ? ['hall', 'sync'] : method === 'vr' ? ['vr'] : [];
  const sim = simulateCranking({ engine, leakPerS: leak, channels, seed, sampleRateHz: method === 'hall+sync' || method === 'vr' ? 50_000 : 10_000 });
  const teethOnly = method === 'teeth' || method === 'teeth, event duration';
  const columns: CaptureColumns = teethOnly ? { toothTimes: sim.toothTimes } : { time: sim.time, current: sim.current, sync: sim.sync, crank: sim.hall ?? sim.vr };
  const settings = { engine, sensor: method === 'vr' ? ('vr' as const) : undefined, method: method === 'teeth, event duration' ? ('event-duration' as const) : undefined };
  return { r: analyzeCapture(columns, settings), truth: sim.truth.relativePercent };
}

/** Without sync the capture cannot tell the rotation: compare at the rotation that fits best. */
function aligned(r: AnalysisResult, truth: Float64Array, engine: EngineSetup) {
  const n = engine.cylinders;
  const order = engine.firingOrder;
  let best = { err: Infinity, got: [] as (number | null)[], status: [] as string[], interval: [] as ([number, number] | null)[] };
  for (let rot = 0; rot < (r.identity === 'assumed' ? n : 1); rot++) {
    const got = new Array<number | null>(n);
    const status = new Array<string>(n);
    const interval = new Array<[number, number] | null>(n);
    for (let p = 0; p < n; p++) {
      const c = r.cylinders[order[(p + rot) % n] - 1];
      got[order[p] - 1] = c.relativePercent;
      status[order[p] - 1] = c.status;
      interval[order[p] - 1] = c.interval;
    }
    const err = got.reduce<number>((a, v, i) => a + Math.abs((v ?? 0) - truth[i]), 0);
    if (err < best.err) best = { err, got, status, interval };
  }
  return best;
}

describe('recovery sweep on the realistic simulator', () => {
  const perMethod = <T>(make: () => T): Record<Method, T> => ({ 'current+sync': make(), teeth: make(), 'hall+sync': make(), vr: make(), 'teeth, event duration': make() });
  const errors = perMethod<number[]>(() => []);
  const uncertain = perMethod(() => 0);
  const wrong: string[] = [];
  const inside = perMethod<number[]>(() => []);
  const widths = perMethod<number[]>(() => []);
  const teethChecks: boolean[] = [];
  for (const [name, engine] of Object.entries(ENGINES)) {
    for (const method of Object.keys(errors) as Method[]) {
      it(`${name} × ${method}`, () => {
        for (const [kind, leakOf] of Object.entries(LEAKS)) {
          const { r, truth } = run(engine, leakOf(engine.cylinders), method, 11);
          if (method === 'teeth' && r.crossCheck?.method === 'event-duration') teethChecks.push(r.crossCheck.agree);
          const { got, status, interval } = aligned(r, truth, engine);
          for (let i = 0; i < engine.cylinders; i++) {
            const t = truth[i];
            if ((t >= 95 && status[i] === 'low') || (t < 80 && status[i] === 'ok')) wrong.push(`${name} ${method} ${kind} cyl ${i + 1}: truth ${t.toFixed(0)}, read ${got[i]} ${status[i]}`);
            if (status[i] === 'uncertain') uncertain[method]++;
            if (got[i] !== null) errors[method].push(Math.abs(got[i]! - t));
            const iv = interval[i];
            if (iv) {
              inside[method].push(t >= iv[0] && t <= iv[1] ? 1 : 0);
              if (process.env.SHOW_MISSES && !(t >= iv[0] && t <= iv[1])) console.log(`miss ${name} ${method} ${kind} cyl ${i + 1}: truth ${t.toFixed(1)} got ${got[i]} [${iv.join(', ')}]`);
              widths[method].push(iv[1] - iv[0]);
            }
          }
        }
      });
    }
  }
  it('states its figures and holds them', () => {
    const lines: string[] = [];
    const coverage: number[] = [];
    const means: [Method, number][] = [];
    for (const m of Object.keys(errors) as Method[]) {
      const e = errors[m];
      const mean = e.reduce((a, b) => a + b, 0) / Math.max(1, e.length);
      const cover = inside[m].reduce((a, b) => a + b, 0) / Math.max(1, inside[m].length);
      const w = [...widths[m]].sort((a, b) => a - b);
      lines.push(`${m}: mean |error| ${mean.toFixed(2)} points, worst ${Math.max(0, ...e).toFixed(1)}, ${e.length} figures, ${uncertain[m]} cylinders uncertain; 90 % intervals hold the truth for ${(100 * cover).toFixed(1)} %, median width ${w[w.length >> 1]?.toFixed(1)} points`);
      means.push([m, mean]);
      coverage.push(cover);
    }
    const agreed = teethChecks.filter(Boolean).length / Math.max(1, teethChecks.length);
    lines.push(`crank speed checked by event duration on the same teeth: ${teethChecks.length} captures, agreeing on ${(100 * agreed).toFixed(0)} %`);
    console.log(`sweep:\n${lines.join('\n')}\nconfident wrong flags: ${wrong.length}\n${wrong.join('\n')}`);
    // Every teeth-only capture with figures is checked (issue 19, point 1), and the two readings mostly agree.
    expect(teethChecks.length).toBe(Object.keys(ENGINES).length * Object.keys(LEAKS).length);
    expect(agreed).toBeGreaterThanOrEqual(TEETH_CHECK_AGREES);
    for (const [m, mean] of means) expect(mean, m).toBeLessThanOrEqual(TOLERANCE[m]);
    expect(wrong).toEqual([]);
    // Calibration (issue: 88–97 % of true values inside the 90 % intervals), per method.
    for (const c of coverage) {
      expect(c).toBeGreaterThanOrEqual(0.88);
      expect(c).toBeLessThanOrEqual(0.97);
    }
  });
});
