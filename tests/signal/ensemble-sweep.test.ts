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
import { ENSEMBLE_DRAWS, ENSEMBLE_METHODS, runEnsembleSweep, type SweepMethod, type SweepTally } from '@/signal/sim/sweep';

const CRANK_SPEED: SweepMethod[] = ['teeth', 'hall+sync', 'vr'];
/** Targets: mean |error| ≤ 1.5 points on crank speed, ≤ 3 on the electrical methods; coverage 88–97 %. */
const TARGET_MAE: Partial<Record<SweepMethod, number>> = { teeth: 1.5, 'hall+sync': 1.5, vr: 1.5, 'current+sync': 3, 'battery+sync': 3, 'reversed clamp+sync': 3 };
/**
 * Measured ceilings where a target is not met yet (mean |error|, points; measured on this sweep when the ensemble
 * came in, the worst of the two families, with a little room): a change may only bring these down.
 */
const CEILING_MAE: Partial<Record<SweepMethod, number>> = {
  'hall+sync': 1.6,
  'teeth, event duration': 7,
};
/** Measured floors of coverage where 88 % is not met yet (none: every method is held to the target). */
const FLOOR_COVERAGE: Partial<Record<SweepMethod, number>> = {};

function report(label: string, tally: SweepTally): void {
  const targets = ENSEMBLE_METHODS.map((m) => {
    const f = tally.figures(m);
    const mae = TARGET_MAE[m];
    const cover = f.coverage >= 0.88 && f.coverage <= 0.97;
    return `${m}: ${mae === undefined ? '' : `mae target ${mae} ${f.mae <= mae ? 'met' : 'NOT met'}; `}coverage target ${cover ? 'met' : 'NOT met'}`;
  });
  console.log(`${label}:\n${tally.table(ENSEMBLE_METHODS).join('\n')}\nlowest bound ${tally.lowestBound}\n${targets.join('\n')}\n${tally.wrong.join('\n')}`);
}

describe.each(['ensemble', 'held-out'] as const)('recovery sweep, %s physics', (family) => {
  it('holds its figures', () => {
    const tally = runEnsembleSweep(family, ENSEMBLE_DRAWS);
    report(family, tally);
    expect(tally.lowestBound).toBeGreaterThanOrEqual(0);
    for (const m of ENSEMBLE_METHODS) {
      const f = tally.figures(m);
      expect(f.figures, m).toBeGreaterThan(0);
      expect(f.mae, m).toBeLessThanOrEqual(CEILING_MAE[m] ?? TARGET_MAE[m]!);
      expect(f.coverage, m).toBeGreaterThanOrEqual(FLOOR_COVERAGE[m] ?? 0.88);
      expect(f.coverage, m).toBeLessThanOrEqual(0.97);
    }
    for (const m of ENSEMBLE_METHODS) expect(tally.figures(m).wrongFlags, m).toBe(0);
    // Leak depth (issue target): leaking cylinders within 3 points on crank speed, whatever the leak's model.
    for (const m of CRANK_SPEED) expect(tally.figures(m).leakMae, m).toBeLessThanOrEqual(3);
  }, 240_000);
});

/**
 * The ensemble with a starting-system fault (issue: one crank, the whole answer): a weak battery (25–40 mΩ) and a
 * dragging starter. The starting-system check names them (tests/signal/starting-system.test.ts); here the
 * compression figures must stay honest on them: no confident wrong flag, no bound below 0 %, and the truths inside
 * their intervals at least as often as on the ensemble's own floor.
 */
describe.each(['weak-battery', 'dragging-starter'] as const)('recovery sweep, %s', (family) => {
  it('stays honest', () => {
    const tally = runEnsembleSweep(family, ENSEMBLE_DRAWS);
    report(family, tally);
    expect(tally.lowestBound).toBeGreaterThanOrEqual(0);
    for (const m of ENSEMBLE_METHODS) expect(tally.figures(m).wrongFlags, m).toBe(0);
    for (const m of ENSEMBLE_METHODS) expect(tally.figures(m).coverage, m).toBeGreaterThanOrEqual(0.88);
  }, 240_000);
});
