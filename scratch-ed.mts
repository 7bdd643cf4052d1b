import { ENSEMBLE_DRAWS, runEnsembleSweep } from './signal/sim/sweep';
for (const fam of ['ensemble', 'held-out'] as const) {
  const t = runEnsembleSweep(fam, ENSEMBLE_DRAWS, ['teeth, event duration']);
  const f = t.figures('teeth, event duration');
  console.log(fam, 'cover', (100*f.coverage).toFixed(1), 'n', f.figures, 'width', f.medianWidth);
  for (const m of t.misses) console.log('  ', m);
}
