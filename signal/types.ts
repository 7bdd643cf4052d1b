/** The engine's inputs and outputs. */
import type { EngineSetup } from './engine/firing';
import type { QualityWarning } from './steps/warnings';
import type { ToothPattern } from './teeth/tooth-angles';

/** Decoded channels of one capture; every array is aligned with `time` except `toothTimes`. */
export interface CaptureColumns {
  /** Seconds. */
  time?: Float64Array;
  /** Starter current, A. */
  current?: Float64Array;
  /** Crank sensor voltage, V (Hall square wave or variable-reluctance sine). */
  crank?: Float64Array;
  /** Cylinder-1 sync, V. */
  sync?: Float64Array;
  /** Engine speed, rpm. */
  rpm?: Float64Array;
  /** Crank-tooth edge times, s (a capture of its own). */
  toothTimes?: Float64Array;
}

export type MethodChoice = 'auto' | 'current' | 'crank-speed';
export type Method = 'current' | 'crank-speed';
export type CylinderStatus = 'ok' | 'low' | 'uncertain';

export interface AnalysisSettings {
  engine: EngineSetup;
  /** @default 'auto' */
  method?: MethodChoice;
  /** Tooth pattern; detected from the gaps when absent. */
  teeth?: ToothPattern;
  /** @default 90 */
  lowLimitPercent?: number;
  /** @default 10 */
  spreadLimitPercent?: number;
  /** Override of the cranking window, s. */
  window?: { startS: number; endS: number };
  /** Without sync: steps the cylinder assignment along the firing order. @default 0 */
  rotation?: number;
  /** Crank sensor type for a sampled waveform. @default 'auto' */
  sensor?: 'auto' | 'hall' | 'vr';
}

export interface CylinderResult {
  cylinder: number;
  /** Estimated compression pressure in percent of the healthy cylinders' median, 0…100. */
  relativePercent: number;
  status: CylinderStatus;
  /** Complete compression events used. */
  events: number;
  /** Events rejected as malformed. */
  rejected: number;
  /** Cycle-to-cycle spread (standard deviation of the per-event estimates), percentage points. */
  spreadPercent: number;
  /** The plain index (current peak or kinetic-energy dip) in percent of the strongest cylinder, a cross-check. */
  plainPercent: number;
  /** Mean raw figure: current peak above the trough (A) or speed dip (rpm). */
  raw: number;
  /** Per-event estimates in percent, one per cycle. */
  perCycle: number[];
}

export interface EventMark {
  /** Time of the event's compression TDC, s. */
  timeS: number;
  cylinder: number;
  used: boolean;
}

export type PatternKind = 'none' | 'one-low' | 'neighbours-low' | 'scattered-low' | 'uncertain';

export interface PatternHint {
  kind: PatternKind;
  cylinders: number[];
  /** A plain sentence: what the pattern usually means. */
  hint: string;
  /** Recommended next tests, in order. */
  nextTests: string[];
}

export interface MethodResult {
  method: Method;
  crankingRpm: number;
  identity: 'sync' | 'assumed';
  window: { startS: number; endS: number };
  cylinders: CylinderResult[];
  events: EventMark[];
  rawUnit: 'A' | 'rpm';
  /** Strongest − weakest relative compression, percentage points. */
  spreadPercent: number;
  /** Share of the crank's acceleration the torque model explains, 0…1. */
  fitQuality: number;
  warnings: QualityWarning[];
}

export interface AnalysisResult extends MethodResult {
  engineVersion: string;
  verdict: CylinderStatus;
  pattern: PatternHint;
  settings: Required<Pick<AnalysisSettings, 'lowLimitPercent' | 'spreadLimitPercent' | 'rotation'>> & {
    method: MethodChoice;
    cylinders: number;
    firingOrder: number[];
    teeth?: string;
  };
  /** The other method's result when the capture holds both current and crank channels. */
  crossCheck?: { method: Method; cylinders: { cylinder: number; relativePercent: number; status: CylinderStatus }[]; agree: boolean; maxDifference: number };
}
