/**
 * Runs the torque fit for an engine setup and settles cylinder identity: with sync, cylinder 1 is the TDC
 * nearest the sync angle (0 on the motion's scale); without, the first complete event is cylinder 1 and the
 * user's rotation steps the assignment along the firing order.
 */
import { type EngineSetup, firingIntervals, tdcPhasesDeg } from '../engine/firing';
import type { CrankMotion } from '../steps/crank-motion';
import { assumedRelabel, degreesOfPositions, symmetryStep } from '../steps/identity';
import { type FitEvent, fitTorque, type TorqueFit } from './torque-fit';

export function runFit(
  m: CrankMotion,
  setup: EngineSetup,
  synced: boolean,
  rotation: number,
  exclude?: Set<string>,
  refineLeaks = true,
): TorqueFit | null {
  const iv = firingIntervals(setup);
  const n = setup.cylinders;
  const step = symmetryStep(iv);
  const period = degreesOfPositions(iv, step);
  const base = {
    phasesDeg: tdcPhasesDeg(setup),
    firingOrder: setup.firingOrder,
    exclude,
    refineLeaks,
    coarseStepDeg: Math.min(6, period / 8),
  };
  if (synced) {
    // The sync pulse may sit a little before or after TDC: search ± half the symmetry period around it.
    return fitTorque(m, { ...base, scanFromDeg: -period / 2, scanToDeg: period / 2 });
  }
  const fit = fitTorque(m, { ...base, scanFromDeg: 0, scanToDeg: period });
  if (!fit) return null;
  const map = assumedRelabel(fit.events, n, step, rotation);
  return relabel(fit, setup.firingOrder, map);
}

/** Applies a firing-position relabelling to a fit's events and per-cylinder arrays. */
function relabel(fit: TorqueFit, order: number[], map: Int32Array): TorqueFit {
  const n = order.length;
  const newCylOfOld = new Int32Array(n + 1);
  for (let p = 0; p < n; p++) newCylOfOld[order[p]] = order[map[p]];
  const permute = (a: Float64Array) => {
    const out = new Float64Array(n);
    for (let c = 1; c <= n; c++) out[newCylOfOld[c] - 1] = a[c - 1];
    return out;
  };
  const events: FitEvent[] = fit.events.map((e) => ({ ...e, position: map[e.position], cylinder: order[map[e.position]] }));
  return {
    ...fit,
    events,
    perCylinder: permute(fit.perCylinder),
    pressure: permute(fit.pressure),
    leakPerS: permute(fit.leakPerS),
  };
}
