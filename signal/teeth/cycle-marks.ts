/**
 * A cam (or injector, coil) channel as a once-per-cycle mark. Each mark edge is placed on the crank's tooth
 * count (a fractional tooth index, which follows crank angle whatever the speed), and the pattern of spaces
 * between mark edges that repeats once an engine cycle is found: the smallest number of edges after which the
 * spaces repeat. Its length in teeth is the crank's teeth per cycle (720°); the edge after the widest space of
 * the pattern marks each cycle. A cam with one window a cycle, or with several windows of different widths,
 * comes out the same way.
 */
import { indexAtTime } from '../dsp/decimate';
import { median } from '../dsp/stats';
import type { CylinderMarks } from '../import/edge-log';

export interface CycleMarks {
  marks: CylinderMarks;
  /** Crank teeth (edges) per engine cycle, as measured (a whole number on a clean signal). */
  teethPerCycle: number;
  /** Mark edges per cycle in the channel's pattern. */
  edgesPerCycle: number;
  /** The pattern repeats every revolution too: it gives the teeth a cycle but not which revolution is which. */
  symmetric: boolean;
}

/** Pattern spaces may differ by this share of their median and still repeat. */
const SPACE_TOLERANCE = 0.12;
/** The cycle's length in teeth may vary by this share across the capture. */
const LENGTH_TOLERANCE = 0.04;

/** Fractional tooth index of time `x`: k + the share of the tooth period k → k + 1 passed. NaN outside. */
export function toothIndexAt(teeth: Float64Array, x: number): number {
  if (!(x >= teeth[0] && x <= teeth[teeth.length - 1])) return NaN;
  // The last tooth at or before x.
  const hi = indexAtTime(teeth, x);
  const lo = teeth[hi] === x || hi === 0 ? hi : hi - 1;
  return lo + (x - teeth[lo]) / Math.max(1e-12, (teeth[lo + 1] ?? teeth[lo] + 1) - teeth[lo]);
}

/**
 * One candidate mark channel reduced to one edge per engine cycle, or null when its edges do not repeat in a
 * pattern (at least two cycles seen). The cycle is the shortest repeat of at least `minTeethPerCycle` teeth; a
 * pattern that also repeats in fewer teeth (the same every revolution) is `symmetric`: it counts the cycle's
 * teeth but cannot tell one revolution of the cycle from the other.
 */
export function cycleMarksOf(candidate: CylinderMarks, teeth: Float64Array, minTeethPerCycle = 2): CycleMarks | null {
  const at: number[] = [];
  const times: number[] = [];
  for (const x of candidate.times) {
    const k = toothIndexAt(teeth, x);
    if (Number.isFinite(k)) {
      at.push(k);
      times.push(x);
    }
  }
  if (at.length < 3) return null;
  const space = at.slice(1).map((k, i) => k - at[i]);
  const limit = Math.min(24, Math.floor(space.length / 2));
  let shortest = 0;
  for (let m = 1; m <= limit; m++) {
    const length = repeatLength(at, space, m);
    if (!Number.isFinite(length)) continue;
    shortest ||= length;
    if (length < 0.9 * minTeethPerCycle) continue;
    // The edge after the widest space of the pattern marks each cycle.
    const bySlot = Array.from({ length: m }, () => [] as number[]);
    for (let i = 0; i < space.length; i++) bySlot[(i + 1) % m].push(space[i]);
    let slot = 0;
    for (let s = 1; s < m; s++) if (median(bySlot[s]) > median(bySlot[slot])) slot = s;
    const once: number[] = [];
    for (let i = slot; i < times.length; i += m) once.push(times[i]);
    if (once.length < 2) return null;
    return { marks: { ...candidate, times: Float64Array.from(once) }, teethPerCycle: length, edgesPerCycle: m, symmetric: shortest < 0.9 * length };
  }
  return null;
}

/** The teeth spanned by `m` consecutive mark spaces when the spaces repeat every `m`, or NaN. */
function repeatLength(at: number[], space: number[], m: number): number {
  const lengths: number[] = [];
  for (let i = 0; i + m <= space.length; i++) lengths.push(at[i + m] - at[i]);
  const length = median(lengths);
  if (!lengths.every((l) => Math.abs(l - length) <= LENGTH_TOLERANCE * length + 0.6)) return NaN;
  let same = 0;
  for (let i = 0; i + m < space.length; i++) if (Math.abs(space[i] - space[i + m]) <= (SPACE_TOLERANCE * length) / m + 0.35) same++;
  return space.length > m && same < 0.9 * (space.length - m) ? NaN : length;
}

/**
 * The best once-per-cycle mark among the candidates (in their order of preference), each read as a cycle of at
 * least `expectedTeeth` teeth when that is known: one that agrees with it and tells the revolutions apart first,
 * then one that agrees, then (with nothing expected) the first found.
 */
export function findCycleMarks(candidates: CylinderMarks[] | undefined, teeth: Float64Array, expectedTeeth?: number): CycleMarks | null {
  const found = (candidates ?? []).map((c) => cycleMarksOf(c, teeth, expectedTeeth ?? 2)).filter((f): f is CycleMarks => !!f);
  if (!expectedTeeth) return found.find((f) => !f.symmetric) ?? found[0] ?? null;
  const agree = found.filter((f) => Math.abs(f.teethPerCycle - expectedTeeth) <= 0.05 * expectedTeeth + 0.6);
  return agree.find((f) => !f.symmetric) ?? agree[0] ?? null;
}
