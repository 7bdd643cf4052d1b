/**
 * What a capture's current and battery-voltage channels say about the battery and the starter: the resting
 * voltage before the starter engages, the inrush (the highest current and the lowest voltage as it engages), the
 * steady cranking draw and voltage, and the battery's resistance from the inrush, the slope of voltage against
 * current (Ohm's law: R = −ΔV/ΔI, the two-point method of battery standards taken over every inrush sample).
 */
import { lineFit, maxOf, mean, median, minOf, quantileProbe } from '../dsp/stats';
import { movingAverage } from '../dsp/smooth';
import { indexAtTime } from '../dsp/decimate';
import { clampReversed } from '../methods/current';

export interface StartingFigures {
  /** 12 or 24, from the resting or the cranking voltage. */
  systemV: 12 | 24;
  /** Seconds from the first sample at which the starter engaged; null when the capture starts with it engaged. */
  engagedAtS: number | null;
  restingV: number | null;
  inrushMinV: number | null;
  crankingMinV: number | null;
  crankingMeanV: number | null;
  inrushPeakA: number | null;
  crankingMeanA: number | null;
  /** Battery resistance from the inrush, mΩ (with both a voltage and a current channel). */
  internalMilliOhm: number | null;
}

export interface StartingInput {
  time: Float64Array;
  current?: Float64Array;
  battery?: Float64Array;
  /** The steady cranking, as the compression method found it (ignored when it is empty). */
  window: { startS: number; endS: number };
}

/** Rest before the starter needs this long, s, to be read. */
const MIN_REST_S = 0.02;
/** The inrush is read over this long after the starter engages, s. */
const INRUSH_S = 0.3;

/** The starting system's figures, or null when the capture holds neither current nor battery voltage. */
export function measureStarting(input: StartingInput): StartingFigures | null {
  const { time } = input;
  const n = time.length;
  if (n < 10 || !(input.current || input.battery)) return null;
  const rate = (n - 1) / Math.max(1e-9, time[n - 1] - time[0]);
  const smooth = (x: Float64Array, seconds: number) => (rate > 200 ? movingAverage(x, Math.max(1, Math.round(seconds * rate))) : x);
  // Current drawn as a positive number (a clamp on backwards reads the cranking draw negative).
  const current = input.current && clampReversed(input.current) ? input.current.map((v) => -v) : input.current;
  const fastA = current && smooth(current, 0.002);
  const fastV = input.battery && smooth(input.battery, 0.002);
  const slowA = current && smooth(current, 0.005);
  const slowV = input.battery && smooth(input.battery, 0.005);

  // The engagement: the first sample half-way from the quiet level to the cranking level.
  const level = fastA ?? fastV!;
  const sign = fastA ? 1 : -1;
  const quiet = fastA ? quantileProbe(level, 0.01, 50_000) : quantileProbe(level, 0.99, 50_000);
  const w = input.window.endS > input.window.startS ? input.window : null;
  const cranking = w ? median(level.subarray(indexAtTime(time, w.startS), Math.max(indexAtTime(time, w.startS) + 1, indexAtTime(time, w.endS)))) : quantileProbe(level, fastA ? 0.7 : 0.3, 50_000);
  if (!(sign * (cranking - quiet) > (fastA ? 20 : 0.3))) return null;
  const half = quiet + (cranking - quiet) / 2;
  let engaged = 0;
  while (engaged < n && sign * (level[engaged] - half) < 0) engaged++;
  if (engaged >= n) return null;
  // Back to where the rise began: the last sample at the quiet level's side of a tenth of the way.
  const tenth = quiet + (cranking - quiet) / 10;
  let rise = engaged;
  while (rise > 0 && sign * (level[rise - 1] - tenth) > 0) rise--;
  const restEnd = rise - Math.ceil(0.003 * rate);
  const hasRest = restEnd > 4 && time[restEnd] - time[0] >= MIN_REST_S;
  const engagedAtS = hasRest ? time[rise] - time[0] : null;

  const restA = hasRest && current ? median(current.subarray(0, restEnd)) : 0;
  const restingV = hasRest && input.battery ? median(input.battery.subarray(0, restEnd)) : null;
  const inrushEnd = Math.min(n, indexAtTime(time, time[rise] + INRUSH_S) + 1, w ? Math.max(indexAtTime(time, w.startS), indexAtTime(time, time[rise] + 0.1)) : n);
  const span = (x: Float64Array | undefined, from: number, to: number) => (x && to > from ? x.subarray(from, to) : null);
  const inrushA = span(fastA, rise, inrushEnd);
  const inrushV = span(fastV, rise, inrushEnd);
  const from = w ? indexAtTime(time, w.startS) : inrushEnd;
  const to = w ? indexAtTime(time, w.endS) : lastBeyond(level, half, sign);
  const crankA = span(slowA, from, to);
  const crankV = span(slowV, from, to);
  const reference = restingV ?? (crankV ? maxOf(crankV) : null);
  const systemV = reference !== null && reference > 18 ? 24 : 12;
  return {
    systemV,
    engagedAtS,
    restingV: round(restingV, 2),
    inrushMinV: round(inrushV && hasRest ? minOf(inrushV) : null, 2),
    crankingMinV: round(crankV ? minOf(crankV) : null, 2),
    crankingMeanV: round(crankV ? mean(crankV) : null, 2),
    inrushPeakA: round(inrushA && hasRest ? maxOf(inrushA) - restA : null, 0),
    crankingMeanA: round(crankA ? mean(crankA) - restA : null, 0),
    internalMilliOhm: round(current && input.battery && hasRest ? inrushResistance(fastA!, fastV!, Math.max(0, restEnd - Math.round(0.05 * rate)), inrushEnd) : null, 1),
  };
}

/** −slope of voltage on current over the rest and the inrush, mΩ; null when the current does not span 50 A. */
function inrushResistance(a: Float64Array, v: Float64Array, from: number, to: number): number | null {
  const amps = a.subarray(from, to);
  if (amps.length < 10 || maxOf(amps) - minOf(amps) < 50) return null;
  return -lineFit(amps, v.subarray(from, to)).b * 1000;
}

function lastBeyond(x: Float64Array, threshold: number, sign: number): number {
  for (let i = x.length - 1; i > 0; i--) if (sign * (x[i] - threshold) > 0) return i;
  return 0;
}

function round(v: number | null, digits: number): number | null {
  if (v === null || !Number.isFinite(v)) return null;
  const f = 10 ** digits;
  return Math.round(v * f) / f;
}
