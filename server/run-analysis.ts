/** Runs the engine on the server exactly as the worker does: same import options, same settings. */
import 'server-only';
import { analyzeBytes, type AnalysisResult, parseToothPattern } from '@/signal';
import type { AnalysisSettingsValues } from '@/db/validators/analysis';

export function runAnalysis(bytes: Uint8Array, s: AnalysisSettingsValues): AnalysisResult {
  return analyzeBytes(
    bytes,
    {
      engine: s.engine,
      method: s.method,
      teeth: s.teeth ? (parseToothPattern(s.teeth) ?? undefined) : undefined,
      lowLimitPercent: s.lowLimitPercent,
      spreadLimitPercent: s.spreadLimitPercent,
      window: s.window,
      rotation: s.rotation,
      sensor: s.sensor,
    },
    { mapping: s.mapping, sampleRateHz: s.sampleRateHz },
  ).result;
}
