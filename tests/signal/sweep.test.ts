/**
 * The recovery sweep on the realistic simulator (SIGNAL.md physics: Heywood slider-crank volume, polytropic gas
 * with leakage, a DC starter on a battery driving through a one-way clutch with a light armature, valve
 * springs, crank inertia and friction; tuned so healthy engines swing max/min 1.7–2.4 within an event as the
 * real recordings in captures-real/ do). Engines × methods × leak patterns. Two things are checked:
 *  - never a confident wrong flag: a healthy cylinder (truth ≥ 95 %) `low`, or a weak one (truth < 80 %) `ok`;
 *  - the mean absolute error of the figures per method within the tolerance stated below (printed).
 */
import { describe, expect, it } from 'vitest';
import { SWEEP_ENGINES as ENGINES, SWEEP_LEAKS as LEAKS, SWEEP_METHODS, type SweepMethod as Method, SweepTally, sweepCase } from '@/signal/sim/sweep';

/** Mean absolute error per method on this sweep, percentage points (measured; figures as they are, not capped at 100). */
const TOLERANCE: Partial<Record<Method, number>> = { 'current+sync': 1.7, teeth: 1.5, 'hall+sync': 1.5, vr: 1.5, 'teeth, event duration': 6 };
/**
 * Each case's own ceiling (one engine × one method over the leak patterns, mean |error|, points): the issue's
 * target for the electrical method (3), and on crank speed and event duration what was measured case by case,
 * with a little room; a change may only bring these down.
 */
const CASE_TOLERANCE: Partial<Record<Method, number>> = { 'current+sync': 3, teeth: 2, 'hall+sync': 2, vr: 2, 'teeth, event duration': 6 };
/** Measured exceptions: a three-cylinder engine's events are read by duration worst of all (20.7 points). */
const CASE_EXCEPTION: Record<string, number> = { 'I3 × teeth, event duration': 21 };
/** Teeth a speed curve is read from are timed event by event too: the two readings agree on a share of the captures at least this. */
const TEETH_CHECK_AGREES = 0.8;

describe('recovery sweep on the realistic simulator', () => {
  const tally = new SweepTally();
  for (const [name, engine] of Object.entries(ENGINES)) {
    for (const method of SWEEP_METHODS) {
      it(`${name} × ${method}`, () => {
        const own = new SweepTally();
        for (const [kind, leakOf] of Object.entries(LEAKS)) {
          const { r, truth } = sweepCase(engine, leakOf(engine.cylinders), method, 11);
          tally.add(name, method, kind, r, truth, engine);
          own.add(name, method, kind, r, truth, engine);
        }
        expect(own.wrong, 'confident wrong flags').toEqual([]);
        expect(own.figures(method).mae).toBeLessThanOrEqual(CASE_EXCEPTION[`${name} × ${method}`] ?? CASE_TOLERANCE[method]!);
      });
    }
  }
  it('states its figures and holds them', () => {
    const lines = tally.table();
    const agreed = tally.teethChecks.filter(Boolean).length / Math.max(1, tally.teethChecks.length);
    lines.push(`crank speed checked by event duration on the same teeth: ${tally.teethChecks.length} captures, agreeing on ${(100 * agreed).toFixed(0)} %`);
    console.log(`sweep:\n${lines.join('\n')}\nconfident wrong flags: ${tally.wrong.length}\n${tally.wrong.join('\n')}${process.env.SHOW_MISSES ? `\n${tally.misses.join('\n')}` : ''}`);
    // Every teeth-only capture with figures is checked (issue 19, point 1), and the two readings mostly agree.
    expect(tally.teethChecks.length).toBe(Object.keys(ENGINES).length * Object.keys(LEAKS).length);
    expect(agreed).toBeGreaterThanOrEqual(TEETH_CHECK_AGREES);
    for (const m of SWEEP_METHODS) expect(tally.figures(m).mae, m).toBeLessThanOrEqual(TOLERANCE[m]!);
    expect(tally.wrong).toEqual([]);
    // Calibration (issue: 88–97 % of true values inside the 90 % intervals), per method.
    for (const m of SWEEP_METHODS) {
      const c = tally.figures(m).coverage;
      expect(c, m).toBeGreaterThanOrEqual(0.88);
      expect(c, m).toBeLessThanOrEqual(0.97);
    }
  });
});
