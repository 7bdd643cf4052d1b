import { describe, expect, it } from 'vitest';
import { ENSEMBLE_DRAWS, ENSEMBLE_METHODS, runEnsembleSweep } from '@/signal/sim/sweep';
import { reportSweep, SWEEP_TIMEOUT_MS } from '../support/ensemble-report';

/**
 * The ensemble with a starting-system fault (issue: one crank, the whole answer): a weak battery (25–40 mΩ) and a
 * dragging starter. The starting-system check names them (tests/signal/starting-system.test.ts); here the
 * compression figures must stay honest on them: no confident wrong flag, no bound below 0 %, and the truths inside
 * their intervals at least as often as on the ensemble's own floor.
 */
describe.each(['weak-battery', 'dragging-starter'] as const)('recovery sweep, %s', (family) => {
  it('stays honest', () => {
    const tally = runEnsembleSweep(family, ENSEMBLE_DRAWS);
    reportSweep(family, tally, {});
    expect(tally.lowestBound).toBeGreaterThanOrEqual(0);
    for (const m of ENSEMBLE_METHODS) expect(tally.figures(m).wrongFlags, m).toBe(0);
    for (const m of ENSEMBLE_METHODS) expect(tally.figures(m).coverage, m).toBeGreaterThanOrEqual(0.88);
  }, SWEEP_TIMEOUT_MS);
});
