/**
 * The engine's work on the server, run in a worker thread of the pool (server/engine/pool.ts), never on the
 * request thread: screening an upload (hash it, import every byte, analyse, refuse what holds nothing to analyse,
 * compress the pieces for chunk rows), analysing a stored capture, drawing a stored capture's trace excerpt, and
 * rendering a report PDF.
 * Capture errors come back as data (a class does not cross threads).
 */
import { createHash } from 'node:crypto';
import type { StoredPieces } from '@/db/capture-store';
import { compressPiece, unpackPieces } from '@/db/chunks';
import { type AnalysisSettingsValues, engineSettings, importOptions } from '@/domain/analysis-settings';
import type { AnalysisResult, CaptureError } from '@/signal';
import { analyzeBytes, analyzeCapture, CaptureImporter, importCapture, isCaptureError } from '@/signal';
import { type TraceExcerpt, traceExcerpt } from '@/domain/trace-excerpt';
import { ENGINE_VERSION } from '@/signal';
import type { ReportPdfData } from '../pdf/report-document';
import { renderReportPdf } from '../pdf/render';
import { refusalFor } from '@/domain/capture-policy';

export type EngineTask =
  | { kind: 'screen-upload'; pieces: Uint8Array[]; length: number; settings: AnalysisSettingsValues; compress: boolean }
  | { kind: 'analyze'; stored: StoredPieces; settings: AnalysisSettingsValues }
  | { kind: 'trace'; stored: StoredPieces; result: AnalysisResult; settings: AnalysisSettingsValues }
  | { kind: 'pdf'; data: ReportPdfData }
  /** Which engine this bundle is: asked once when the pool starts, so a stale or broken bundle is found at once. */
  | { kind: 'version' };

export interface EngineFailure {
  ok: false;
  error: { code: CaptureError['code']; message: string; line?: number; column?: number };
}
export type EngineAnswer<T> = { ok: true; value: T } | EngineFailure;

function screenUpload(t: Extract<EngineTask, { kind: 'screen-upload' }>): { chunks: Uint8Array[]; result: AnalysisResult; sha256: string } {
  const hash = createHash('sha256');
  for (const piece of t.pieces) hash.update(piece);
  const importer = new CaptureImporter(t.pieces[0], Math.max(t.length, t.pieces[0].length));
  for (const piece of t.pieces) importer.push(piece);
  const imported = importer.finish();
  const result = analyzeCapture(imported.columns, engineSettings(t.settings), imported.warnings);
  const refusal = refusalFor(imported, result);
  if (refusal) throw refusal;
  return { chunks: t.compress ? t.pieces.map(compressPiece) : [], result, sha256: hash.digest('hex') };
}

const bytesOf = (s: StoredPieces) => unpackPieces(s.pieces, s.size, s.gzip);

/** One import of the stored file: the analysis and, from the same columns, the report's trace excerpt. */
function analyzeStored(t: Extract<EngineTask, { kind: 'analyze' }>): { result: AnalysisResult; trace: TraceExcerpt | null } {
  const { capture, result } = analyzeBytes(bytesOf(t.stored), engineSettings(t.settings), importOptions(t.settings));
  return { result, trace: traceExcerpt(capture.columns, result) ?? null };
}

async function run(task: EngineTask): Promise<unknown> {
  switch (task.kind) {
    case 'version':
      return ENGINE_VERSION;
    case 'pdf':
      return new Uint8Array(await renderReportPdf(task.data));
    case 'screen-upload':
      return screenUpload(task);
    case 'analyze':
      return analyzeStored(task);
    case 'trace':
      // The saved result is given: the file is only read, not analysed again.
      return traceExcerpt(importCapture(bytesOf(task.stored), importOptions(task.settings)).columns, task.result) ?? null;
  }
}

/** The pool calls this with each task. */
export default async function engineThread(task: EngineTask): Promise<EngineAnswer<unknown>> {
  try {
    return { ok: true, value: await run(task) };
  } catch (e) {
    if (isCaptureError(e)) return { ok: false, error: e.toJSON() };
    throw e;
  }
}
