/**
 * Common layouts and firing orders (Wikipedia, "Firing order"), the seed of the engine-profile library.
 * Each profile is a starting point: the vehicle's service information decides.
 */
import type { EngineSetup } from './firing';

export interface EngineProfile extends EngineSetup {
  key: string;
  label: string;
}

const even = (n: number) => new Array<number>(n).fill(720 / n);

export const ENGINE_PROFILES: EngineProfile[] = [
  { key: 'i3', label: 'Inline 3, 1-2-3', cylinders: 3, firingOrder: [1, 2, 3], layout: 'inline' },
  { key: 'i4', label: 'Inline 4, 1-3-4-2', cylinders: 4, firingOrder: [1, 3, 4, 2], layout: 'inline' },
  { key: 'i4-b', label: 'Inline 4, 1-2-4-3', cylinders: 4, firingOrder: [1, 2, 4, 3], layout: 'inline' },
  { key: 'i5', label: 'Inline 5, 1-2-4-5-3', cylinders: 5, firingOrder: [1, 2, 4, 5, 3], layout: 'inline' },
  { key: 'i6', label: 'Inline 6, 1-5-3-6-2-4', cylinders: 6, firingOrder: [1, 5, 3, 6, 2, 4], layout: 'inline' },
  {
    key: 'v6-odd',
    label: 'V6 90° odd-fire, 1-6-5-4-3-2, 90°/150°',
    cylinders: 6,
    firingOrder: [1, 6, 5, 4, 3, 2],
    intervalsDeg: [90, 150, 90, 150, 90, 150],
    layout: 'v',
    numbering: 'along-crank',
  },
  {
    key: 'v6-even',
    label: 'V6 even-fire, 1-2-3-4-5-6',
    cylinders: 6,
    firingOrder: [1, 2, 3, 4, 5, 6],
    layout: 'v',
    numbering: 'along-crank',
  },
  { key: 'v8-a', label: 'V8, 1-8-4-3-6-5-7-2', cylinders: 8, firingOrder: [1, 8, 4, 3, 6, 5, 7, 2], layout: 'v', numbering: 'along-crank' },
  { key: 'v8-b', label: 'V8, 1-5-4-8-6-3-7-2', cylinders: 8, firingOrder: [1, 5, 4, 8, 6, 3, 7, 2], layout: 'v', numbering: 'bank-by-bank' },
  { key: 'v8-c', label: 'V8, 1-5-4-2-6-3-7-8', cylinders: 8, firingOrder: [1, 5, 4, 2, 6, 3, 7, 8], layout: 'v', numbering: 'bank-by-bank' },
  { key: 'v10', label: 'V10, 1-10-9-4-3-6-5-8-7-2', cylinders: 10, firingOrder: [1, 10, 9, 4, 3, 6, 5, 8, 7, 2], layout: 'v', numbering: 'along-crank' },
  {
    key: 'v12',
    label: 'V12, 1-7-5-11-3-9-6-12-2-8-4-10',
    cylinders: 12,
    firingOrder: [1, 7, 5, 11, 3, 9, 6, 12, 2, 8, 4, 10],
    layout: 'v',
    numbering: 'bank-by-bank',
  },
].map((p) => ({ ...p, intervalsDeg: p.intervalsDeg ?? even(p.cylinders) }) as EngineProfile);

/** A profile's engine with the layout and numbering spelled out, as settings and forms take it. */
export function profileEngine(p: EngineProfile) {
  return { cylinders: p.cylinders, firingOrder: p.firingOrder, intervalsDeg: p.intervalsDeg, layout: p.layout ?? 'inline', numbering: p.numbering ?? 'along-crank' };
}
