/**
 * Edge logs: logic-analyser state-change exports and engine-computer tooth logs, where each row is the moment
 * one channel changed level. Each 0/1 channel becomes edge times; the channel with the most edges is the crank,
 * a channel with few edges (a cam window, an injector or coil bit mask) marks cylinder 1.
 */
import { directionScore } from '../teeth/direction-score';

export type MarkSource = 'cam' | 'injector' | 'coil';

/** Candidate cylinder-1 marks: times of one edge per engine cycle, when the method can confirm 720° spacing. */
export interface CylinderMarks {
  times: Float64Array;
  source: MarkSource;
  /** Column name, for the words shown to the user. */
  channel: string;
  /** Cylinder numbers in the order a bit mask named them over one cycle (injector or coil masks). */
  order?: number[];
}

/** A channel of level rows: its name, column and values. */
export interface LevelColumn {
  name: string;
  values: Float64Array;
}

/**
 * The preview looks like an edge log: at least one 0/1 column, and either the rows change some 0/1 or
 * whole-number column nearly every time (a row per level change) or the time steps are uneven.
 */
export function looksLikeEdgeLog(time: Float64Array | undefined, others: Float64Array[]): boolean {
  if (!time || time.length < 5 || !others.some(isBinary)) return false;
  const levels = others.filter(isLevelLike);
  let changed = 0;
  for (let i = 2; i < time.length; i++) if (levels.some((v) => v[i] !== v[i - 1])) changed++;
  if (changed >= 0.7 * (time.length - 2)) return true;
  let lo = Infinity;
  let hi = 0;
  for (let i = 2; i < time.length; i++) {
    const d = time[i] - time[i - 1];
    if (!(d > 0)) continue;
    lo = Math.min(lo, d);
    hi = Math.max(hi, d);
  }
  return hi > 1.8 * lo;
}

export function isBinary(v: Float64Array): boolean {
  if (v.length === 0) return false;
  for (let i = 0; i < v.length; i++) if (v[i] !== 0 && v[i] !== 1) return false;
  return true;
}

/** Whole numbers from 0 to 255: a level or a bit mask. */
export function isLevelLike(v: Float64Array): boolean {
  if (v.length === 0) return false;
  for (let i = 0; i < v.length; i++) if (!(v[i] >= 0 && v[i] <= 255 && v[i] === Math.round(v[i]))) return false;
  return true;
}

/** Times at which `v` rose (0 → non-0) and fell; the first row is the start of the recording, not an edge. */
export function levelEdges(time: Float64Array, v: Float64Array): { rising: Float64Array; falling: Float64Array } {
  const rising: number[] = [];
  const falling: number[] = [];
  for (let i = 1; i < v.length; i++) {
    const a = v[i - 1] !== 0;
    const b = v[i] !== 0;
    if (!a && b) rising.push(time[i]);
    else if (a && !b) falling.push(time[i]);
  }
  return { rising: Float64Array.from(rising), falling: Float64Array.from(falling) };
}

export interface EdgeChannels {
  /** Crank tooth times, s. */
  toothTimes: Float64Array;
  crankIndex: number;
  crankEdge: 'rising' | 'falling';
  marks: CylinderMarks[];
  /** Column indices used as marks. */
  markIndices: number[];
}

/**
 * Picks the crank channel (the most edges, at least 20) and the cylinder-1 mark candidates among level columns.
 * `crankIndex` forces the crank column (the user's mapping); `markIndex` forces the mark column.
 */
export function chooseEdgeChannels(time: Float64Array, levels: (LevelColumn & { index: number })[], crankIndex?: number, markIndex?: number): EdgeChannels | null {
  const edges = levels.map((l) => ({ ...l, ...levelEdges(time, l.values) }));
  const binary = edges.filter((e) => isBinary(e.values));
  let crank = crankIndex !== undefined ? edges.find((e) => e.index === crankIndex) : undefined;
  if (!crank) for (const e of binary) if (!crank || e.rising.length > crank.rising.length) crank = e;
  if (!crank || crank.rising.length + crank.falling.length < 40) return null;
  const crankEdge: 'rising' | 'falling' = directionScore(crank.rising) > directionScore(crank.falling) ? 'rising' : 'falling';
  const toothTimes = crank[crankEdge];
  const marks: CylinderMarks[] = [];
  const markIndices: number[] = [];
  // A cam may carry several windows a cycle (its pattern is read later against the crank); it has fewer edges than the crank.
  const few = Math.max(3, toothTimes.length - 1);
  const candidates = edges.filter((e) => e.index !== crank!.index && (markIndex === undefined || e.index === markIndex));
  // Bit masks first (an injector or coil output names its cylinder), then cam-like channels.
  for (const e of candidates) {
    if (isBinary(e.values) || !isLevelLike(e.values)) continue;
    const source: MarkSource = /coil|ign|spark/i.test(e.name) ? 'coil' : 'injector';
    const mask = maskMarks(time, e.values);
    if (mask.cylinder1.length >= 3) {
      marks.push({ times: mask.cylinder1, source, channel: e.name, order: mask.order });
      markIndices.push(e.index);
    }
  }
  const camLike = candidates
    .filter((e) => isBinary(e.values) && e.rising.length >= 3 && e.rising.length <= few)
    .sort((a, b) => Number(/cam|cmp|phase/i.test(b.name)) - Number(/cam|cmp|phase/i.test(a.name)));
  for (const e of camLike) {
    for (const dir of ['rising', 'falling'] as const) marks.push({ times: e[dir], source: 'cam', channel: e.name });
    markIndices.push(e.index);
  }
  return { toothTimes, crankIndex: crank.index, crankEdge, marks, markIndices };
}

/** Rising edges of each bit of a mask; bit 0 is cylinder 1. Also the cylinder order over the first cycle. */
export function maskMarks(time: Float64Array, v: Float64Array): { cylinder1: Float64Array; order: number[] } {
  const ones: number[] = [];
  const seq: number[] = [];
  for (let i = 1; i < v.length; i++) {
    const rose = v[i] & ~v[i - 1];
    if (!rose) continue;
    for (let bit = 0; bit < 8; bit++) {
      if (!(rose & (1 << bit))) continue;
      seq.push(bit + 1);
      if (bit === 0) ones.push(time[i]);
    }
  }
  // The order seen from the first cylinder-1 pulse until it comes round again.
  const start = seq.indexOf(1);
  const order: number[] = [];
  if (start >= 0) {
    for (let k = start; k < seq.length; k++) {
      if (k > start && seq[k] === 1) break;
      if (!order.includes(seq[k])) order.push(seq[k]);
    }
  }
  return { cylinder1: Float64Array.from(ones), order };
}
