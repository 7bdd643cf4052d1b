/**
 * The analysis worker's API: import a capture in chunks (with progress and cancel), keep its full-resolution
 * columns here, analyse with any settings, and answer min/max decimated views of any time range with
 * transferable buffers.
 */
import {
  analyzeCapture,
  type AnalysisResult,
  type AnalysisSettings,
  CaptureError,
  CaptureImporter,
  type ChannelInfo,
  decimateMinMax,
  type ImportedCapture,
  type ImportOptions,
  indexAtTime,
  isCaptureError,
  toothPeriods,
} from '../signal';

/** The message a worker posts once it listens for calls. */
export const WORKER_READY = 'crankprint-worker-ready';

export type Stage = 'reading' | 'parsing' | 'analysing' | 'done';
export type ProgressFn = (stage: Stage, fraction: number) => void;
export type TraceChannel = 'current' | 'crank' | 'sync' | 'rpm' | 'battery' | 'toothPeriod';

export interface ImportSummary {
  rows: number;
  durationS: number;
  channels: ChannelInfo[];
  /** The channels the trace can draw (from the decoded columns, so an edge log's crank shows as tooth period). */
  traces: TraceChannel[];
  confidence: number;
  preview: string[][];
  header: string[];
  delimiter: string;
  decimalComma: boolean;
  warnings: { code: string; message: string }[];
}

export interface TraceView {
  x: Float64Array;
  min: Float64Array;
  max: Float64Array;
}

export type WorkerError = { code: string; message: string; line?: number; column?: number };

const CHUNK = 1 << 20;

export function createAnalysisApi() {
  let capture: ImportedCapture | null = null;
  let cancelled = false;
  let periods: { t: Float64Array; v: Float64Array } | null = null;

  const check = () => {
    if (cancelled) throw new CaptureError('CANCELLED', 'Cancelled.');
  };

  return {
    /** Reads and parses a file (Blob) or bytes, reporting progress; keeps the columns in this worker. */
    async importCapture(source: Blob | Uint8Array, options: ImportOptions = {}, onProgress?: ProgressFn): Promise<ImportSummary> {
      cancelled = false;
      capture = null;
      periods = null;
      const size = source instanceof Uint8Array ? source.length : source.size;
      const headBytes = source instanceof Uint8Array ? source.subarray(0, CHUNK) : new Uint8Array(await source.slice(0, CHUNK).arrayBuffer());
      const importer = new CaptureImporter(headBytes, size, options);
      if (source instanceof Uint8Array) {
        for (let offset = 0; offset < size; offset += CHUNK) {
          check();
          const end = Math.min(size, offset + CHUNK);
          importer.push(source.subarray(offset, end));
          onProgress?.('parsing', end / size);
        }
      } else {
        // One stream over the file: a slice per megabyte costs a round trip to the browser each.
        const reader = source.stream().getReader();
        let read = 0;
        let reported = 0;
        for (;;) {
          check();
          const { done, value } = await reader.read();
          if (done) break;
          importer.push(value);
          read += value.length;
          if (read - reported >= CHUNK || read === size) {
            reported = read;
            onProgress?.('parsing', read / size);
          }
        }
      }
      capture = importer.finish();
      const t = capture.columns.time ?? capture.columns.toothTimes;
      return {
        rows: capture.rows,
        durationS: t && t.length > 1 ? t[t.length - 1] - t[0] : 0,
        channels: capture.channels,
        traces: [
          ...(['current', 'crank', 'rpm', 'battery', 'sync'] as const).filter((c) => capture!.columns[c] && capture!.columns.time),
          ...(capture.columns.toothTimes ? (['toothPeriod'] as const) : []),
        ],
        confidence: capture.confidence,
        preview: capture.sniff.preview,
        header: capture.sniff.columns.map((c) => (c.unit ? `${c.name} [${c.unit}]` : c.name)),
        delimiter: capture.sniff.delimiter,
        decimalComma: capture.sniff.decimalComma,
        warnings: capture.warnings,
      };
    },

    /** Analyses the imported capture with these settings. */
    analyze(settings: AnalysisSettings, onProgress?: ProgressFn): AnalysisResult {
      if (!capture) throw new CaptureError('NO_NUMERIC_DATA', 'Open a capture first.');
      onProgress?.('analysing', 0);
      const result = analyzeCapture(capture.columns, settings, capture.warnings);
      onProgress?.('done', 1);
      return result;
    },

    /** Min/max view of one channel over [fromS, toS] in at most `columns` buckets. */
    decimate(channel: TraceChannel, fromS: number, toS: number, columns: number): TraceView | null {
      if (!capture) return null;
      let t: Float64Array | undefined = capture.columns.time;
      let v: Float64Array | undefined;
      if (channel === 'toothPeriod') {
        periods ??= toothPeriods(capture.columns.toothTimes);
        if (!periods) return null;
        t = periods.t;
        v = periods.v;
      } else {
        v = capture.columns[channel];
      }
      if (!t || !v) return null;
      const a = indexAtTime(t, fromS);
      const b = Math.min(t.length, indexAtTime(t, toS) + 1);
      return decimateMinMax(t, v, a, b, Math.max(2, Math.min(8000, Math.floor(columns))));
    },

    cancel(): void {
      cancelled = true;
    },
  };
}

/** Plain error object for the page: what was wrong, where, and what to try. */
export function toWorkerError(e: unknown): WorkerError {
  if (isCaptureError(e)) return e.toJSON();
  return { code: 'INTERNAL', message: 'The analysis stopped unexpectedly; try again, and report the file if it happens again.' };
}

export type AnalysisApi = ReturnType<typeof createAnalysisApi>;
