/** Quality warnings: a stable code and a sentence a technician can act on. */

export type WarningCode =
  | 'NO_CRANKING'
  | 'CRANKING_TOO_SLOW'
  | 'CRANKING_TOO_FAST'
  | 'TOO_FEW_CYCLES'
  | 'SAMPLE_RATE_TOO_LOW'
  | 'CLIPPED_SIGNAL'
  | 'NO_SYNC'
  | 'SYNC_NOT_FOUND'
  | 'FIRING_ORDER_MISMATCH'
  | 'INCONSISTENT_CYCLES'
  | 'EVENTS_REJECTED'
  | 'SPREAD_HIGH'
  | 'METHODS_DISAGREE'
  | 'NO_TOOTH_GAP'
  | 'TIME_NOT_MONOTONIC'
  | 'TIME_GAPS'
  | 'MISSING_VALUES'
  | 'NO_USABLE_CHANNEL'
  | 'OVER_RANGE'
  | 'NO_COMPRESSION'
  | 'ENGINE_FIRED'
  | 'CLAMP_REVERSED'
  | 'WHEEL_TOO_COARSE'
  | 'TEETH_REPAIRED'
  | 'MARK_ORDER'
  | 'AFTER_LOW'
  | 'CLOSE_CALL'
  | 'ENGINE_STARTED'
  | 'COARSE_WHEEL'
  | 'HIGH_HELD'
  | 'MOST_LOW_HELD'
  | 'UNSTEADY_START'
  | 'EVENTS_OVERLAP'
  | 'WEAK_BATTERY'
  | 'CLUTCH_OVERRUN';

export interface QualityWarning {
  code: WarningCode;
  message: string;
  /** The cylinder count the capture looks like, when it contradicts the engine set up (no figures are given then). */
  cylinders?: number;
}

/** Removes, in place, the warnings `drop` picks (a step that says its words again clears its earlier ones). */
export function dropWarnings(warnings: QualityWarning[], drop: (w: QualityWarning) => boolean): void {
  for (let i = warnings.length - 1; i >= 0; i--) if (drop(warnings[i])) warnings.splice(i, 1);
}

export function warning(code: WarningCode, message: string, cylinders?: number): QualityWarning {
  return cylinders === undefined ? { code, message } : { code, message, cylinders };
}

/** Codes that mean the numbers cannot be trusted: every cylinder is then `uncertain`. */
export const THIN_EVIDENCE: ReadonlySet<WarningCode> = new Set<WarningCode>([
  'NO_CRANKING',
  'CRANKING_TOO_SLOW',
  'CRANKING_TOO_FAST',
  'TOO_FEW_CYCLES',
  'SAMPLE_RATE_TOO_LOW',
  'CLIPPED_SIGNAL',
  'FIRING_ORDER_MISMATCH',
  'NO_TOOTH_GAP',
  'NO_USABLE_CHANNEL',
  'TIME_NOT_MONOTONIC',
  'NO_COMPRESSION',
  'EVENTS_OVERLAP',
]);
