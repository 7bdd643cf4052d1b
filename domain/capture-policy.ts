/**
 * The capture's storage policy (the server's upload and Save, the workspace's column question): the check before a
 * capture is stored: when the analysis, run with the vehicle's engine, finds no compression
 * event at all and the importer was sure which column is which, there is nothing a technician can do with the
 * file but record again, so it is refused with the analysis's own sentence. An unsure mapping is let through:
 * the columns can then be named by hand in the workspace.
 */
import { type AnalysisResult, CaptureError, type ImportedCapture, THIN_EVIDENCE } from '@/signal';

/** Below this mapping confidence the workspace asks which column is which. */
export const SURE_MAPPING = 0.7;

/**
 * The one "nothing to analyse" rule: the analysis found no compression event at all. An upload is refused for
 * it (below); Save answers it with the analysis's warnings and stores nothing.
 */
export function measuredNothing(result: Pick<AnalysisResult, 'events'>): boolean {
  return result.events.length === 0;
}

export function refusalFor(capture: ImportedCapture, result: AnalysisResult): CaptureError | null {
  if (!measuredNothing(result) || capture.confidence < SURE_MAPPING) return null;
  const cause = result.warnings.find((w) => THIN_EVIDENCE.has(w.code)) ?? result.warnings[0];
  if (!cause || cause.code === 'NO_USABLE_CHANNEL') {
    const found = capture.channels.filter((c) => c.role !== 'ignore').map((c) => `"${c.name}" (${c.role})`);
    return new CaptureError(
      'NOTHING_TO_ANALYSE',
      `The file holds no starter-current, crank-sensor or engine-speed channel that can be analysed (found ${found.join(', ') || 'no channels'}); export one of those with the time column and upload again.`,
    );
  }
  return new CaptureError('NOTHING_TO_ANALYSE', `No compression events were found, so the file was not stored. ${cause.message}`);
}
