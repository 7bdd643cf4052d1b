/**
 * The recovery sweep on an ensemble of independent physics (signal/sim/ensemble.ts: three leak models, polytropic
 * exponent 1.10–1.35, intake closing 30–70° after BDC, inertia ±30 %, armature inertia, battery 5–25 mΩ, cable drop,
 * friction rising with speed) and on the family kept out of its calibration (heat lost to the cylinder wall).
 * Equations behind the simulator: Heywood, Internal Combustion Engine Fundamentals, slider-crank volume (eq. 2.5)
 * and polytropic compression; a DC motor's back-EMF relation for the starter.
 *
 * Checked here:
 *  - no interval bound below 0 % anywhere;
 *  - no method gives a confident wrong flag (a healthy cylinder low, a weak one ok);
 *  - leaking cylinders within 3 points on crank speed;
 *  - the targets (mean |error| ≤ 1.5 points on crank speed, ≤ 3 on the electrical methods, coverage 88–97 %) where
 *    they are met, and elsewhere no worse than measured when the ensemble came in (the ceilings below); the
 *    report line says which targets are still ahead.
 */
import { describe, expect, it } from 'vitest';
import { ENSEMBLE_DRAWS, ENSEMBLE_METHODS, runEnsembleSweep, type SweepMethod } from '@/signal/sim/sweep';
import { reportSweep, SWEEP_TIMEOUT_MS } from '../support/ensemble-report';

const CRANK_SPEED: SweepMethod[] = ['teeth', 'hall+sync', 'vr'];
/** Targets: mean |error| ≤ 1.5 points on crank speed, ≤ 3 on the electrical methods; coverage 88–97 %. */
const TARGET_MAE: Partial<Record<SweepMethod, number>> = { teeth: 1.5, 'hall+sync': 1.5, vr: 1.5, 'current+sync': 3, 'battery+sync': 3, 'reversed clamp+sync': 3 };
/**
 * Event duration is the cross-check on crank speed, not one of the targets: its ceiling is what it measured
 * on 10 draws per layout (4.03 on the ensemble, 3.92 held out) with a little room, and a change may only bring it
 * down.
 */
const CEILING_MAE: Partial<Record<SweepMethod, number>> = {
  'teeth, event duration': 5,
};
/** Measured caps of coverage where 97 % is not met yet (none: every method is held to the target). */
const CAP_COVERAGE: Partial<Record<SweepMethod, number>> = {};
/** Measured floors of coverage where 88 % is not met yet (none: every method is held to the target). */
const FLOOR_COVERAGE: Partial<Record<SweepMethod, number>> = {};

describe.each(['ensemble', 'held-out'] as const)('recovery sweep, %s physics', (family) => {
  it('holds its figures', () => {
    const tally = runEnsembleSweep(family, ENSEMBLE_DRAWS);
    reportSweep(family, tally, TARGET_MAE);
    expect(tally.lowestBound).toBeGreaterThanOrEqual(0);
    for (const m of ENSEMBLE_METHODS) {
      const f = tally.figures(m);
      expect(f.figures, m).toBeGreaterThan(0);
      expect(f.mae, m).toBeLessThanOrEqual(CEILING_MAE[m] ?? TARGET_MAE[m]!);
      expect(f.coverage, m).toBeGreaterThanOrEqual(FLOOR_COVERAGE[m] ?? 0.88);
      expect(f.coverage, m).toBeLessThanOrEqual(CAP_COVERAGE[m] ?? 0.97);
    }
    for (const m of ENSEMBLE_METHODS) expect(tally.figures(m).wrongFlags, m).toBe(0);
    // Leak depth (issue target): leaking cylinders within 3 points on crank speed, whatever the leak's model.
    for (const m of CRANK_SPEED) expect(tally.figures(m).leakMae, m).toBeLessThanOrEqual(3);
  }, SWEEP_TIMEOUT_MS);
});
