/// <reference lib="webworker" />
/** The analysis Web Worker: the API of analysis-api.ts over comlink, with decimated views transferred, not copied. */
import * as Comlink from 'comlink';
import type { AnalysisSettings, ImportOptions } from '../signal';
import { createAnalysisApi, type ProgressFn, type TraceChannel, toWorkerError, WORKER_READY } from './analysis-api';

const api = createAnalysisApi();

/** Every call answers { ok, value } or { ok: false, error } so the page gets a plain error it can show. */
const exposed = {
  async importCapture(source: Blob | Uint8Array, options: ImportOptions, onProgress?: ProgressFn) {
    try {
      return { ok: true as const, value: await api.importCapture(source, options, onProgress) };
    } catch (e) {
      return { ok: false as const, error: toWorkerError(e) };
    }
  },
  analyze(settings: AnalysisSettings, onProgress?: ProgressFn) {
    try {
      return { ok: true as const, value: api.analyze(settings, onProgress) };
    } catch (e) {
      return { ok: false as const, error: toWorkerError(e) };
    }
  },
  decimate(channel: TraceChannel, fromS: number, toS: number, columns: number) {
    const view = api.decimate(channel, fromS, toS, columns);
    if (!view) return null;
    return Comlink.transfer(view, [view.x.buffer, view.min.buffer, view.max.buffer] as ArrayBuffer[]);
  },
  cancel() {
    api.cancel();
  },
};

export type AnalysisWorker = typeof exposed;

Comlink.expose(exposed);
// Only now does the worker listen: the page sends nothing before it hears this (a call posted while the worker's
// scripts were still loading could otherwise reach no listener and never be answered).
self.postMessage(WORKER_READY);
