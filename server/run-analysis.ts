/** Runs the engine on the server exactly as the worker does: same import options, same settings. */
import 'server-only';
import { analyzeBytes, type AnalysisResult } from '@/signal';
import { type AnalysisSettingsValues, engineSettings } from '@/db/validators/analysis';

export function runAnalysis(bytes: Uint8Array, s: AnalysisSettingsValues): AnalysisResult {
  return analyzeBytes(bytes, engineSettings(s), { mapping: s.mapping, sampleRateHz: s.sampleRateHz }).result;
}
