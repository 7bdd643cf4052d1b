/**
 * The recovery sweep on the shapes the first recordings did not show (the simulator of sweep.test.ts; truth is its
 * leak input): coarse wheels of 1, 2, 3 and 6 teeth a revolution read by event duration, the same gap every 120°,
 * an engine that starts at 70 % of the capture, and a tooth-period log with marker rows. Each with a cam window at
 * cylinder 1's TDC (the mark offset's default). Checked: never a confident wrong flag (a healthy cylinder `low`
 * or `high`, a weak one `ok`), and the mean absolute error per shape within the measured tolerance (printed).
 */
import { describe, expect, it } from 'vitest';
import { analyzeCapture, importCapture } from '@/signal';
import type { EngineSetup } from '@/signal/engine/firing';
import { simulateCranking } from '@/signal/sim/simulate';
import { thenRuns, toothPeriodLog } from '@/signal/sim/shapes';
import { parseWheel } from '@/signal/teeth/wheel';
import type { AnalysisResult, CaptureColumns } from '@/signal/types';

const ENGINES: Record<string, EngineSetup> = {
  I4: { cylinders: 4, firingOrder: [1, 3, 4, 2] },
  V6: { cylinders: 6, firingOrder: [1, 2, 3, 4, 5, 6], layout: 'v' },
  I6: { cylinders: 6, firingOrder: [1, 5, 3, 6, 2, 4] },
  V8: { cylinders: 8, firingOrder: [1, 8, 4, 3, 6, 5, 7, 2], layout: 'v' },
};
const LEAKS: Record<string, (n: number) => number[]> = {
  healthy: () => [],
  'one leak': (n) => Array.from({ length: n }, (_, i) => (i === 1 ? 2.5 : 0)),
  'two leaks': (n) => Array.from({ length: n }, (_, i) => (i === 0 || i === 2 ? 1.5 : 0)),
};
type Shape = '1 tooth an event' | '2 teeth a rev' | '3 teeth a rev' | '6 teeth a rev' | 'gap every 120°' | 'starts at 70 %' | 'tooth-period log';
const SHAPES: Shape[] = ['1 tooth an event', '2 teeth a rev', '3 teeth a rev', '6 teeth a rev', 'gap every 120°', 'starts at 70 %', 'tooth-period log'];
/** Mean absolute error per shape, percentage points (measured on this sweep; printed). */
const TOLERANCE: Record<Shape, number> = {
  // Coarse wheels: a weak cylinder also moves its neighbours' events (their intervals reach over it); on a V8 the
  // figures are withheld as thin (EVENTS_OVERLAP) but still counted here.
  '1 tooth an event': 11,
  '2 teeth a rev': 10,
  '3 teeth a rev': 8,
  '6 teeth a rev': 16,
  'gap every 120°': 1.5,
  'starts at 70 %': 2.5,
  'tooth-period log': 1.5,
};

const even = (teeth: number) => ({ positions: teeth, gapsAfter: new Array<number>(teeth).fill(0), extraTooth: false });

function capture(engine: EngineSetup, leak: number[], shape: Shape, seed: number): { columns: CaptureColumns; truth: Float64Array } | null {
  const n = engine.cylinders;
  const teeth = shape === '1 tooth an event' ? n / 2 : shape === '2 teeth a rev' ? 2 : shape === '3 teeth a rev' ? 3 : shape === '6 teeth a rev' ? 6 : 0;
  // Fewer than one tooth an event cannot separate the cylinders.
  if (teeth && teeth < n / 2) return null;
  const wheel = teeth ? even(teeth) : shape === 'gap every 120°' ? parseWheel('36:10/2,10/2,10/2')! : undefined;
  const durationS = shape === 'starts at 70 %' ? 7 : 6;
  const sim = simulateCranking({ engine, leakPerS: leak, channels: [], noise: 1, seed, wheel, teeth: wheel ? undefined : { count: 60, missing: 2 }, camWindowDeg: [0, 30], durationS });
  const marks = [{ times: Float64Array.from(sim.camEdges!.rising), source: 'cam' as const, channel: 'cam' }];
  if (shape === 'starts at 70 %') return { columns: { toothTimes: thenRuns(sim.toothTimes, 0.7 * durationS, 4, 2), marks }, truth: sim.truth.relativePercent };
  if (shape === 'tooth-period log') {
    const cap = importCapture(new TextEncoder().encode(toothPeriodLog(sim, 2000, 0)));
    return { columns: cap.columns, truth: sim.truth.relativePercent };
  }
  return { columns: { toothTimes: sim.toothTimes, marks }, truth: sim.truth.relativePercent };
}

/** Identity is assumed only for the period log (no cam): compare at the rotation that fits best. */
function aligned(r: AnalysisResult, truth: Float64Array, engine: EngineSetup) {
  const n = engine.cylinders;
  const order = engine.firingOrder;
  let best = { err: Infinity, cyl: [] as AnalysisResult['cylinders'] };
  for (let rot = 0; rot < (r.identity === 'assumed' ? n : 1); rot++) {
    const cyl = new Array<AnalysisResult['cylinders'][number]>(n);
    for (let p = 0; p < n; p++) cyl[order[p] - 1] = r.cylinders[order[(p + rot) % n] - 1];
    const err = cyl.reduce((a, c, i) => a + Math.abs((c.relativePercent ?? 100) - truth[i]), 0);
    if (err < best.err) best = { err, cyl };
  }
  return best.cyl;
}

describe('recovery sweep on the new shapes', () => {
  const errors = Object.fromEntries(SHAPES.map((s) => [s, [] as number[]])) as Record<Shape, number[]>;
  const inside = Object.fromEntries(SHAPES.map((s) => [s, [] as number[]])) as Record<Shape, number[]>;
  const wrong: string[] = [];
  for (const shape of SHAPES) {
    it(shape, () => {
      for (const [name, engine] of Object.entries(ENGINES)) {
        for (const [kind, leakOf] of Object.entries(LEAKS)) {
          const made = capture(engine, leakOf(engine.cylinders), shape, 21);
          if (!made) continue;
          const r = analyzeCapture(made.columns, { engine });
          const cyl = aligned(r, made.truth, engine);
          cyl.forEach((c, i) => {
            const t = made.truth[i];
            if ((t >= 95 && (c.status === 'low' || c.status === 'high')) || (t < 80 && c.status === 'ok')) wrong.push(`${shape} ${name} ${kind} cyl ${i + 1}: truth ${t.toFixed(0)}, read ${c.relativePercent} ${c.status}`);
            if (c.relativePercent !== null) errors[shape].push(Math.abs(c.relativePercent - t));
            if (c.interval) inside[shape].push(t >= c.interval[0] && t <= c.interval[1] ? 1 : 0);
            if (process.env.SHOW_MISSES && c.interval && !(t >= c.interval[0] && t <= c.interval[1])) console.log(`miss ${shape} ${name} ${kind} cyl ${i + 1}: truth ${t.toFixed(1)} got ${c.relativePercent} [${c.interval.join(", ")}] ${c.status}`);
          });
        }
      }
    });
  }
  it('states its figures and holds them', () => {
    const lines = SHAPES.map((s) => {
      const e = errors[s];
      const mean = e.reduce((a, b) => a + b, 0) / Math.max(1, e.length);
      const cover = inside[s].reduce((a, b) => a + b, 0) / Math.max(1, inside[s].length);
      return { s, mean, text: `${s}: mean |error| ${mean.toFixed(2)} points, worst ${Math.max(0, ...e).toFixed(1)}, ${e.length} figures; 90 % intervals hold the truth for ${(100 * cover).toFixed(1)} %` };
    });
    console.log(`sweep (new shapes):\n${lines.map((l) => l.text).join('\n')}\nconfident wrong flags: ${wrong.length}\n${wrong.join('\n')}`);
    expect(wrong).toEqual([]);
    for (const l of lines) expect(l.mean, l.s).toBeLessThanOrEqual(TOLERANCE[l.s]);
  });
});
