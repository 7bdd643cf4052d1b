/** Firing order, firing intervals and bank layout: which cylinder fires when, and which cylinders are neighbours. */
import { CaptureError } from '../errors';

export const BANK_LAYOUTS = ['inline', 'v', 'flat'] as const;
export type BankLayout = (typeof BANK_LAYOUTS)[number];
/** along-crank: odd numbers on one bank, even on the other; bank-by-bank: 1…N/2 then N/2+1…N. */
export const NUMBERINGS = ['along-crank', 'bank-by-bank'] as const;
export type Numbering = (typeof NUMBERINGS)[number];
/** The most cylinders the engine reads. */
export const MAX_CYLINDERS = 16;

export interface EngineSetup {
  cylinders: number;
  /** Cylinder numbers in firing order, a permutation of 1…N. */
  firingOrder: number[];
  /** Crank degrees from each firing to the next, in firing order; defaults to 720/N each (even fire). */
  intervalsDeg?: number[];
  /** @default 'inline' */
  layout?: BankLayout;
  /** @default 'along-crank' */
  numbering?: Numbering;
}

/** Parses "1-3-4-2" (also commas or spaces) into [1, 3, 4, 2]; throws when it is not a permutation of 1…N. */
export function parseFiringOrder(text: string, cylinders: number): number[] {
  const parts = text.trim().split(/[\s,\-–]+/).filter(Boolean);
  const order = parts.map(Number);
  checkFiringOrder(order, cylinders);
  return order;
}

/** What is wrong with a firing order for an engine of `cylinders`, in a sentence, or null when it lists each of 1…N once. */
export function firingOrderProblem(order: readonly number[], cylinders: number): string | null {
  if (!Number.isInteger(cylinders) || cylinders < 1 || cylinders > MAX_CYLINDERS) return `The cylinder count must be a whole number from 1 to ${MAX_CYLINDERS}, not ${cylinders}.`;
  const seen = new Set<number>();
  for (const c of order) {
    if (!Number.isInteger(c) || c < 1 || c > cylinders || seen.has(c)) return `The firing order must list each cylinder 1 to ${cylinders} exactly once; "${order.join('-')}" does not.`;
    seen.add(c);
  }
  if (seen.size !== cylinders) return `The firing order lists ${seen.size} cylinders but the engine has ${cylinders}; list each cylinder once.`;
  return null;
}

/** What is wrong with firing intervals for `cylinders`, in a sentence, or null when there is one positive interval per cylinder adding up to 720°. */
export function firingIntervalsProblem(intervals: readonly number[], cylinders: number): string | null {
  if (intervals.length !== cylinders || intervals.some((d) => !(d > 0))) return `Give one positive firing interval per cylinder (${cylinders} in all).`;
  const sum = intervals.reduce((a, b) => a + b, 0);
  if (Math.abs(sum - 720) > 0.5) return `The firing intervals add up to ${sum}°; a four-stroke cycle is 720°.`;
  return null;
}

/** Throws a BAD_SETTINGS error unless `order` holds each of 1…N exactly once. */
export function checkFiringOrder(order: number[], cylinders: number): void {
  const problem = firingOrderProblem(order, cylinders);
  if (problem) throw new CaptureError('BAD_SETTINGS', problem);
}

/** Firing intervals in crank degrees, checked to sum to 720°. */
export function firingIntervals(setup: EngineSetup): number[] {
  const iv = setup.intervalsDeg ?? new Array<number>(setup.cylinders).fill(720 / setup.cylinders);
  const problem = firingIntervalsProblem(iv, setup.cylinders);
  if (problem) throw new CaptureError('BAD_SETTINGS', problem);
  return iv;
}

/**
 * Crank angle of each cylinder's compression TDC, degrees after cylinder 1's, indexed by cylinder number − 1.
 */
export function tdcPhasesDeg(setup: EngineSetup): Float64Array {
  checkFiringOrder(setup.firingOrder, setup.cylinders);
  const iv = firingIntervals(setup);
  const phases = new Float64Array(setup.cylinders);
  let angle = 0;
  for (let j = 0; j < setup.firingOrder.length; j++) {
    phases[setup.firingOrder[j] - 1] = angle;
    angle += iv[j];
  }
  return phases;
}

/** Bank of a cylinder: 0 or 1 (always 0 on an inline engine). */
export function bankOf(setup: EngineSetup, cylinder: number): number {
  if ((setup.layout ?? 'inline') === 'inline') return 0;
  if ((setup.numbering ?? 'along-crank') === 'along-crank') return (cylinder - 1) % 2;
  return cylinder <= Math.ceil(setup.cylinders / 2) ? 0 : 1;
}

/** Whether two cylinders sit next to each other on the same bank (from the layout, never the firing order). */
export function areNeighbours(setup: EngineSetup, a: number, b: number): boolean {
  if (a === b || bankOf(setup, a) !== bankOf(setup, b)) return false;
  const layout = setup.layout ?? 'inline';
  if (layout === 'inline') return Math.abs(a - b) === 1;
  if ((setup.numbering ?? 'along-crank') === 'along-crank') return Math.abs(a - b) === 2;
  return Math.abs(a - b) === 1;
}
