/** The engine's public surface: import a capture, analyse it, decimate for drawing. */
import { analyzeCapture } from './analyze';
import { type ImportOptions, importCapture, type ImportedCapture } from './import/import-capture';
import type { AnalysisResult, AnalysisSettings } from './types';

export { analyzeCapture } from './analyze';
export { CaptureImporter, importCapture, MAX_CAPTURE_BYTES, MAX_CAPTURE_SIZE } from './import/import-capture';
export type { ChannelInfo, ImportedCapture, ImportOptions } from './import/import-capture';
export type { ChannelRole } from './import/map-channels';
export { decimateMinMax, indexAtTime } from './dsp/decimate';
export { median, quantile } from './dsp/stats';
export { CaptureError, isCaptureError } from './errors';
export { ENGINE_VERSION } from './version';
export { ENGINE_PROFILES, profileEngine } from './engine/profiles';
export { parseFiringOrder, checkFiringOrder, areNeighbours, firingIntervalsProblem, firingOrderProblem } from './engine/firing';
export type { EngineSetup, BankLayout, Numbering } from './engine/firing';
export { BANK_LAYOUTS, MAX_CYLINDERS, NUMBERINGS } from './engine/firing';
export { describeWheel, parseWheel, wheelNotation } from './teeth/wheel';
export type { ToothWheel } from './teeth/wheel';
export type * from './types';
export type { StartingCheck, StartingStatus, StartingSystem } from './starting/check';
export { readingText } from './starting/check';
export { DEFAULT_STARTING_LIMITS, LIMIT_SOURCES, type StartingLimits } from './starting/limits';
export type { QualityWarning, WarningCode } from './warnings';
export { THIN_EVIDENCE } from './warnings';
export { NUMBERING_ASSUMED } from './grade/pattern';

/** Imports and analyses a file held in memory: what the server does when it saves an analysis. */
export function analyzeBytes(
  bytes: Uint8Array,
  settings: AnalysisSettings,
  options: ImportOptions = {},
): { capture: ImportedCapture; result: AnalysisResult } {
  const capture = importCapture(bytes, options);
  return { capture, result: analyzeCapture(capture.columns, settings, capture.warnings) };
}
export { identityWords, intervalText, METHOD_CHOICES, METHOD_NAMES, methodAdjective, methodLabel, percentText, RAW_LABELS, STATUS_WORDS, VERDICT_WORDS } from './format';
export { compareResults } from './steps/compare';
export { toothPeriods } from './teeth/periods';
export type { CylinderChange } from './steps/compare';
export { LIMITS, limitProblem, limitSentence, type LimitKey } from './limits';
