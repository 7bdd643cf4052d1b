/** The ensemble sweeps' shared report line and time limit (tests/signal/ensemble-*.test.ts). */
import { ENSEMBLE_METHODS, type SweepMethod, type SweepTally } from '@/signal/sim/sweep';

/** One family at 10 draws per layout takes about two minutes alone; the limit leaves room for a loaded machine. */
export const SWEEP_TIMEOUT_MS = 900_000;

/** Prints a family's sweep table, its lowest bound, which targets are met and every confident wrong flag. */
export function reportSweep(label: string, tally: SweepTally, targetMae: Partial<Record<SweepMethod, number>>): void {
  const targets = ENSEMBLE_METHODS.map((m) => {
    const f = tally.figures(m);
    const mae = targetMae[m];
    const cover = f.coverage >= 0.88 && f.coverage <= 0.97;
    return `${m}: ${mae === undefined ? '' : `mae target ${mae} ${f.mae <= mae ? 'met' : 'NOT met'}; `}coverage target ${cover ? 'met' : 'NOT met'}`;
  });
  console.log(`${label}:\n${tally.table(ENSEMBLE_METHODS).join('\n')}\nlowest bound ${tally.lowestBound}\n${targets.join('\n')}\n${tally.wrong.join('\n')}`);
}
