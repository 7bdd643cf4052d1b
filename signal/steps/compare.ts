/** Before and after a repair: a cylinder changed only when its two 90 % intervals do not overlap. */
import type { AnalysisResult } from '../types';
import { intervalsOverlap } from './cross-check';

export interface CylinderChange {
  cylinder: number;
  change: 'up' | 'down' | 'none' | 'unknown';
  /** In words, e.g. "Cylinder 3: 41–52 % before, 93–101 % after: up". */
  sentence: string;
}

export function compareResults(before: Pick<AnalysisResult, 'cylinders'>, after: Pick<AnalysisResult, 'cylinders'>): CylinderChange[] {
  return after.cylinders.map((a) => {
    const b = before.cylinders.find((c) => c.cylinder === a.cylinder);
    const bi = b?.interval;
    const ai = a.interval;
    if (!bi || !ai) return { cylinder: a.cylinder, change: 'unknown', sentence: `Cylinder ${a.cylinder}: no interval on one of the two tests, so no change can be read.` };
    const change = intervalsOverlap(ai, bi) ? 'none' : ai[0] > bi[1] ? 'up' : 'down';
    const words = { up: 'higher after', down: 'lower after', none: 'no clear change (the intervals overlap)' }[change];
    return { cylinder: a.cylinder, change, sentence: `Cylinder ${a.cylinder}: ${bi[0]}–${bi[1]} % before, ${ai[0]}–${ai[1]} % after: ${words}.` };
  });
}
