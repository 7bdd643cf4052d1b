/** The engine's inputs and outputs. */
import type { EngineSetup } from './engine/firing';
import type { QualityWarning } from './warnings';
import type { CylinderMarks } from './import/edge-log';
import type { ToothWheel } from './teeth/wheel';
import type { METHOD_CHOICES } from './format';
import type { StartingOptions, StartingSystem } from './starting/check';

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
  /** Battery voltage, V (dips as the starter draws current). */
  battery?: Float64Array;
  /** Crank-tooth edge times, s (a capture of its own, or the crank channel of an edge log). */
  toothTimes?: Float64Array;
  /** Cylinder-1 mark candidates from an edge log (cam window, injector or coil bit mask), best first. */
  marks?: CylinderMarks[];
}

export type MethodChoice = (typeof METHOD_CHOICES)[number];
/**
 * `battery` is the electrical method on battery voltage (it dips as the starter current rises); `event-duration`
 * times each compression event on the crank teeth (any wheel, down to one tooth an event).
 */
export type Method = 'current' | 'crank-speed' | 'event-duration' | 'battery';
/** `high`: wholly above the upper limit (carbon build-up or an oil-fouled chamber are common causes). */
export type CylinderStatus = 'ok' | 'low' | 'high' | 'uncertain';
/** Where cylinder numbers come from: a sync channel, a cam channel, an injector or coil output, or assumed. */
export type IdentitySource = 'sync' | 'cam' | 'injector' | 'coil' | 'assumed';

export interface AnalysisSettings {
  engine: EngineSetup;
  /** @default 'auto' */
  method?: MethodChoice;
  /** Tooth wheel (a one-gap pattern or any wheel); learned from the capture when absent. */
  teeth?: ToothWheel;
  /** Crank degrees from a cylinder-1 mark (cam, injector or coil) to cylinder 1's compression TDC. @default 0 for cam, 360 for injector and coil */
  markOffsetDeg?: number;
  /** @default 90 */
  lowLimitPercent?: number;
  /** @default 10 */
  spreadLimitPercent?: number;
  /** A cylinder wholly above this reads `high`. @default 110 */
  highLimitPercent?: number;
  /** Override of the cranking window, s. */
  window?: { startS: number; endS: number };
  /** Without sync: steps the cylinder assignment along the firing order. @default 0 */
  rotation?: number;
  /** Crank sensor type for a sampled waveform. @default 'auto' */
  sensor?: 'auto' | 'hall' | 'vr';
  /** The starting-system check's limits and the conditions it needs (temperature, displacement, fuel). */
  starting?: StartingOptions;
}

export interface CylinderResult {
  cylinder: number;
  /** Estimated compression pressure in percent of the healthy cylinders' median, as it is (above 100 when above the rest); null when the capture shows no compression to compare. */
  relativePercent: number | null;
  /** 90 % interval of the figure, percent; null with no figure. */
  interval: [number, number] | null;
  /** Crank-speed method: mean time the crank takes through this cylinder's event window, ms. */
  strokeMs?: number;
  status: CylinderStatus;
  /** Complete compression events used. */
  events: number;
  /** Events rejected as malformed. */
  rejected: number;
  /** Cycle-to-cycle spread (standard deviation of the per-event estimates), percentage points. */
  spreadPercent: number;
  /** The plain index (current peak or kinetic-energy dip) in percent of the strongest cylinder, a cross-check. */
  plainPercent: number | null;
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

export type PatternKind = 'none' | 'one-low' | 'neighbours-low' | 'scattered-low' | 'high' | 'uncertain';

export interface PatternHint {
  kind: PatternKind;
  cylinders: number[];
  /** A plain sentence: what the pattern usually means. */
  hint: string;
  /** Recommended next tests, in order. */
  nextTests: string[];
}

/** The crank wheel as read from the capture, and what was repaired. */
export interface WheelInfo {
  /** In our notation, e.g. `36:15/2,14/1,3/1`. */
  notation: string;
  /** In words, e.g. "36 positions, 32 teeth, gaps of 2, 1 and 1". */
  description: string;
  learned: boolean;
  glitchesDropped: number;
  teethInserted: number;
  /** Too few positions per firing interval for the crank-speed method to separate cylinders. */
  tooCoarse: boolean;
}

export interface MethodResult {
  method: Method;
  crankingRpm: number;
  identity: IdentitySource;
  /** Where the cylinder numbers come from, in plain words. */
  identityNote?: string;
  wheel?: WheelInfo;
  /** Median max/min crank speed within one compression event (crank-speed method); near 1 means no compression. */
  speedSwing?: number;
  window: { startS: number; endS: number };
  cylinders: CylinderResult[];
  events: EventMark[];
  rawUnit: 'A' | 'rpm' | 'V' | 'ms';
  /** Strongest − weakest relative compression, percentage points. */
  spreadPercent: number;
  /** Share of the crank's acceleration the torque model explains, 0…1 (event duration: the share of events timed whole). */
  fitQuality: number;
  warnings: QualityWarning[];
}

/** Capture quality in one word, and what limits it most. */
export interface QualityGrade {
  grade: 'good' | 'fair' | 'poor';
  limitedBy: 'cycles' | 'noise' | 'sample rate' | 'wheel resolution' | 'identity' | 'compression' | 'none';
  /** The limit in a plain sentence. */
  note: string;
}

export interface AnalysisResult extends MethodResult {
  engineVersion: string;
  verdict: CylinderStatus;
  quality: QualityGrade;
  pattern: PatternHint;
  settings: Required<Pick<AnalysisSettings, 'lowLimitPercent' | 'spreadLimitPercent' | 'highLimitPercent' | 'rotation'>> & {
    method: MethodChoice;
    cylinders: number;
    firingOrder: number[];
    teeth?: string;
  };
  /** The battery and starter, as far as the capture's channels show them. */
  startingSystem?: StartingSystem;
  /** The other method's result when the capture holds both current and crank channels. */
  crossCheck?: { method: Method; cylinders: { cylinder: number; relativePercent: number | null; status: CylinderStatus }[]; agree: boolean; maxDifference: number };
}
