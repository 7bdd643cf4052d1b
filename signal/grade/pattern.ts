/** Names the pattern of low cylinders and the usual next tests (common practice, see TRADE.md). */
import { areNeighbours, type EngineSetup } from '../engine/firing';
import type { CylinderResult, PatternHint } from '../types';

export const NEXT_TESTS = {
  gauge: 'Gauge compression test on the low cylinders to confirm the reading',
  leakage: 'Cylinder leakage test: listen at the intake, tailpipe and oil filler to tell valve from rings',
  leakageGasket: 'Cylinder leakage test on both cylinders: air from the neighbouring plug hole or bubbles in the coolant point to the head gasket',
  wet: 'Wet compression test (about 15 mL of oil): a rise points to rings, no change to valves',
  timing: 'Check cam timing against the service information',
  inspection: 'Borescope inspection of the cylinder before teardown',
} as const;

/** Said after every cylinder number when no signal names cylinder 1: the numbers are the firing order's guess. */
export const NUMBERING_ASSUMED = '(numbering assumed: no cylinder 1 signal)';

/**
 * The pattern and its next tests. With `numberingAssumed`, every sentence that names a cylinder says so, so a
 * technician does not gauge or open the wrong one on the strength of a guess.
 */
export function describePattern(setup: EngineSetup, cylinders: CylinderResult[], uncertain: boolean, numberingAssumed = false): PatternHint {
  const tag = numberingAssumed ? ` ${NUMBERING_ASSUMED}` : '';
  const low = cylinders.filter((c) => c.status === 'low').map((c) => c.cylinder);
  if (uncertain) {
    return {
      kind: 'uncertain',
      cylinders: [],
      hint: 'The capture does not hold enough good evidence to rank the cylinders; fix the warnings and record again.',
      nextTests: [],
    };
  }
  const high = cylinders.filter((c) => c.status === 'high').map((c) => c.cylinder);
  if (low.length === 0 && high.length > 0) {
    return {
      kind: 'high',
      cylinders: high,
      hint: `Cylinder${high.length > 1 ? 's' : ''} ${high.join(', ')}${tag} read${high.length > 1 ? '' : 's'} above the others: carbon build-up or an oil-fouled chamber are possible causes (common on direct-injection engines); confirm with a gauge test.`,
      nextTests: [NEXT_TESTS.gauge, NEXT_TESTS.inspection],
    };
  }
  if (low.length === 0) {
    return {
      kind: 'none',
      cylinders: [],
      hint: 'No cylinder stands out. A relative test cannot see wear that is equal on every cylinder.',
      nextTests: [],
    };
  }
  const dead = cylinders.filter((c) => c.status === 'low' && (c.relativePercent ?? 100) < 25).map((c) => c.cylinder);
  if (low.length === 1) {
    const zero = dead.length === 1;
    return {
      kind: 'one-low',
      cylinders: low,
      hint: zero
        ? `Cylinder ${low[0]}${tag} holds almost no compression: a hole in the piston, a broken or badly burnt valve are common causes.`
        : `Cylinder ${low[0]}${tag} is low on its own: a leaking valve is the common cause; worn rings are also possible.`,
      nextTests: [NEXT_TESTS.gauge, NEXT_TESTS.leakage, NEXT_TESTS.wet, ...(zero ? [NEXT_TESTS.inspection] : [])],
    };
  }
  if (low.length === 2 && areNeighbours(setup, low[0], low[1])) {
    return {
      kind: 'neighbours-low',
      cylinders: low,
      hint: `Cylinders ${low[0]} and ${low[1]}${tag} sit next to each other on the same bank and are both low: a head gasket failed between them is a common cause.`,
      nextTests: [NEXT_TESTS.gauge, NEXT_TESTS.leakageGasket],
    };
  }
  return {
    kind: 'scattered-low',
    cylinders: low,
    hint: `Several cylinders (${low.join(', ')})${tag} are low: general wear, ring trouble or cam timing are common causes.`,
    nextTests: [NEXT_TESTS.gauge, NEXT_TESTS.wet, NEXT_TESTS.timing, NEXT_TESTS.leakage],
  };
}
