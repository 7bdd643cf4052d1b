'use client';
/**
 * The analysis worker for one capture: loads the raw file into the worker with progress, re-analyses when
 * settings change, and asks for decimated views. The full-resolution columns never leave the worker.
 */
import * as Comlink from 'comlink';
import { useCallback, useEffect, useRef, useState } from 'react';
import type { AnalysisResult, AnalysisSettings, ImportOptions } from '@/signal';
import { type ImportSummary, type Stage, type TraceChannel, type TraceView, WORKER_READY, type WorkerError } from '@/workers/analysis-api';
import type { AnalysisWorker } from '@/workers/analysis.worker';

export type LoadState =
  | { phase: 'idle' }
  | { phase: 'loading'; stage: Stage | 'starting' | 'downloading'; fraction: number }
  | { phase: 'ready'; summary: ImportSummary }
  | { phase: 'error'; error: WorkerError };

export function useAnalysisWorker() {
  const remote = useRef<Comlink.Remote<AnalysisWorker> | null>(null);
  const [load, setLoad] = useState<LoadState>({ phase: 'idle' });
  /** Counts workers started: a new one (strict-mode remount, fast refresh) must be loaded again. */
  const [generation, setGeneration] = useState(0);

  /** Bumped to throw the worker away and start a new one (a worker that stopped answering). */
  const [restarts, setRestarts] = useState(0);

  useEffect(() => {
    const w = new Worker(new URL('../../workers/analysis.worker.ts', import.meta.url), { type: 'module' });
    setLoad({ phase: 'loading', stage: 'starting', fraction: 0 });
    // A worker whose script could not load never answers: say so instead of waiting.
    w.onerror = () => setLoad({ phase: 'error', error: { code: 'NO_WORKER', message: 'The analysis could not start in this browser; reload the page.' } });
    // Nothing is sent before the worker says it listens; then the page loads the capture into it (`generation`).
    let live = true;
    const onReady = (e: MessageEvent) => {
      if (e.data !== WORKER_READY) return;
      w.removeEventListener('message', onReady);
      if (!live) return;
      remote.current = Comlink.wrap<AnalysisWorker>(w);
      setGeneration((g) => g + 1);
    };
    w.addEventListener('message', onReady);
    return () => {
      live = false;
      remote.current = null;
      w.terminate();
    };
  }, [restarts]);

  /** Throws the worker away and starts another; the page loads the capture into it again (see `generation`). */
  const restart = useCallback(() => {
    remote.current = null;
    setRestarts((r) => r + 1);
  }, []);

  /** Downloads (when given a URL) and imports a capture into the worker. */
  const open = useCallback(async (source: string | Blob, options: ImportOptions = {}) => {
    const r = remote.current;
    if (!r) return null;
    let blob: Blob;
    if (typeof source === 'string') {
      setLoad({ phase: 'loading', stage: 'downloading', fraction: 0 });
      const res = await fetch(source);
      if (!res.ok) {
        setLoad({ phase: 'error', error: { code: 'DOWNLOAD', message: `The capture could not be downloaded (${res.status}); reload the page.` } });
        return null;
      }
      blob = await downloadWithProgress(res, (fraction) => remote.current === r && setLoad({ phase: 'loading', stage: 'downloading', fraction }));
    } else blob = source;
    if (remote.current !== r) return null;
    setLoad({ phase: 'loading', stage: 'parsing', fraction: 0 });
    const out = await r.importCapture(blob, options, Comlink.proxy((stage: Stage, fraction: number) => remote.current === r && setLoad({ phase: 'loading', stage, fraction })));
    // A worker thrown away meanwhile (restarted, unmounted) no longer speaks for the page.
    if (remote.current !== r) return null;
    if (!out.ok) {
      setLoad({ phase: 'error', error: out.error });
      return null;
    }
    setLoad({ phase: 'ready', summary: out.value });
    return out.value;
  }, []);

  const analyze = useCallback(async (settings: AnalysisSettings): Promise<{ ok: true; value: AnalysisResult } | { ok: false; error: WorkerError }> => {
    const r = remote.current;
    if (!r) return { ok: false, error: { code: 'NO_WORKER', message: 'The analysis worker is not running; reload the page.' } };
    return r.analyze(settings);
  }, []);

  const decimate = useCallback(async (channel: TraceChannel, fromS: number, toS: number, columns: number): Promise<TraceView | null> => {
    const r = remote.current;
    return r ? r.decimate(channel, fromS, toS, columns) : null;
  }, []);

  const cancel = useCallback(() => remote.current?.cancel(), []);

  return { load, open, analyze, decimate, cancel, generation, restart };
}

/** The response body as one Blob, reporting the fraction received (of Content-Length, when the server sent one). */
async function downloadWithProgress(res: Response, onFraction: (f: number) => void): Promise<Blob> {
  const total = Number(res.headers.get('content-length')) || 0;
  if (!res.body || total === 0) return res.blob();
  const parts: Uint8Array[] = [];
  const reader = res.body.getReader();
  let received = 0;
  let reported = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    parts.push(value);
    received += value.length;
    if (received - reported >= Math.min(total / 100, 1 << 20)) {
      reported = received;
      onFraction(Math.min(1, received / total));
    }
  }
  return new Blob(parts as BlobPart[]);
}

export type AnalysisWorkerHandle = ReturnType<typeof useAnalysisWorker>;
