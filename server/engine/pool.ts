/**
 * A bounded pool of worker threads (piscina) for the engine's work, sized to the machine's cores; the request
 * thread only streams, hashes and stores. A full queue answers 503 at once with a sentence; a task whose
 * request is aborted is cancelled. The thread is one bundled ES module (server/engine/build.mjs): in production
 * the one `npm run build` made (.engine/thread.mjs); in development and tests the pool bundles it itself first.
 */
import 'server-only';
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Piscina } from 'piscina';
import { CaptureError, ENGINE_VERSION, type AnalysisResult } from '@/signal';
import type { StoredPieces } from '@/db/capture-store';
import type { AnalysisSettingsValues } from '@/domain/analysis-settings';
import type { TraceExcerpt } from '@/domain/trace-excerpt';
import type { ReportPdfData } from '../pdf/report-document';
import { HttpError } from '../http';
import { currentRequestId, log, safeError, shortId } from '../log';
import type { EngineAnswer, EngineTask } from './thread';
import { processShared } from '@/db/process-state.mjs';

export const THREADS = Math.max(1, Math.min(4, availableParallelism()));
/** Tasks that may wait for a thread before new ones are turned away. */
export const MAX_QUEUE = THREADS * 4;

const BUILT = resolve(/*turbopackIgnore: true*/ process.cwd(), '.engine/thread.mjs');
const DEV_BUILT = resolve(/*turbopackIgnore: true*/ process.cwd(), '.engine/thread.dev.mjs');
const BUILDER = pathToFileURL(resolve(/*turbopackIgnore: true*/ process.cwd(), 'server/engine/build.mjs')).href;

async function build(): Promise<Piscina> {
  let file = BUILT;
  // Without the engine's bundle every task would wait for a thread that never starts: refuse at once, saying why.
  if (process.env.NODE_ENV === 'production' && !existsSync(/*turbopackIgnore: true*/ BUILT)) {
    throw new HttpError(503, 'ENGINE_MISSING', 'The analysis engine is not installed on this server (.engine/thread.mjs is missing): run npm run build, which builds it, then start the server again. Nothing was stored.');
  }
  if (process.env.NODE_ENV !== 'production') {
    const { buildEngine } = (await import(/*turbopackIgnore: true*/ /* @vite-ignore */ BUILDER)) as { buildEngine: (out: string) => Promise<string> };
    file = await buildEngine(DEV_BUILT);
  }
  const p = new Piscina({
    filename: pathToFileURL(file).href,
    minThreads: 1,
    maxThreads: THREADS,
    maxQueue: MAX_QUEUE,
    idleTimeout: 60_000,
  });
  // A thread that stops on its own (its bundle replaced by a broken one) lets the pool go: the next task starts a
  // fresh one and asks it which engine it is.
  p.on('error', (e: unknown) => {
    log.error({ err: safeError(e) }, 'engine thread failed');
    if (g.engineThreads === p) g.enginePool = g.engineThreads = undefined;
    void p.destroy().catch(() => {});
  });
  // The first thread says which engine it is: one that cannot start, or a bundle from another engine version
  // (a `next build` without the engine step), fails here within a second instead of leaving tasks waiting.
  let version: unknown;
  try {
    const answer = (await p.run({ kind: 'version' } satisfies EngineTask)) as EngineAnswer<string>;
    version = answer.ok ? answer.value : undefined;
  } catch (e) {
    void p.destroy().catch(() => {});
    throw engineDown(e);
  }
  if (version !== ENGINE_VERSION) {
    void p.destroy().catch(() => {});
    throw engineDown(new Error(`engine bundle ${String(version)} beside source ${ENGINE_VERSION}`), `The analysis engine on this server (${String(version)}) is not the one this version of Crankprint was built with (${ENGINE_VERSION}): run npm run build, then start the server again.`);
  }
  g.engineThreads = p;
  return p;
}

const g = processShared<{ enginePool?: Promise<Piscina>; engineThreads?: Piscina }>('engine', () => ({}));
const pool = (): Promise<Piscina> =>
  (g.enginePool ??= build().catch((e) => {
    g.enginePool = undefined;
    throw e;
  }));

/** Starts the engine's threads and checks the bundle (at server start): throws the 503 a request would get. */
export async function checkEngine(): Promise<void> {
  await pool();
}

/** Stops the engine's threads (tests; the server's exit stops them with the process). */
export async function closeEnginePool(): Promise<void> {
  const p = g.enginePool;
  g.enginePool = g.engineThreads = undefined;
  await (await p?.catch(() => undefined))?.destroy();
}

/** A thread that could not start: a 503 with a reference to quote, never a wait. */
function engineDown(e: unknown, why = 'The analysis engine could not start on this server, so nothing was analysed or stored; try again in a minute'): HttpError {
  const requestId = currentRequestId() ?? '-';
  log.error({ err: safeError(e), requestId }, 'engine thread did not start');
  const err = new HttpError(503, 'ENGINE_UNAVAILABLE', `${why.replace(/[.:]$/, '')}. If it keeps happening, tell your shop owner the reference ${shortId(requestId)}.`);
  err.detail = { requestId };
  return err;
}

/** Runs one task; a capture error comes back as the engine's CaptureError, a full queue as a 503. */
async function runTask<T>(task: EngineTask, signal?: AbortSignal, transfer: ArrayBufferLike[] = []): Promise<T> {
  const p = await pool();
  let answer: EngineAnswer<T>;
  try {
    answer = await p.run(task, { signal, transferList: transfer as ArrayBuffer[] });
  } catch (e) {
    // piscina refuses a task beyond maxQueue with this error.
    if (e instanceof Error && /queue is at limit/i.test(e.message)) throw busy();
    if (signal?.aborted) throw new HttpError(499, 'CANCELLED', 'The request was cancelled before the analysis finished.');
    throw e;
  }
  if (!answer.ok) throw new CaptureError(answer.error.code, answer.error.message, answer.error);
  return answer.value;
}

const busy = () => new HttpError(503, 'BUSY', 'The server is busy analysing other captures; try again in a minute.');

/**
 * Imports and analyses an upload's pieces, refusing what holds nothing to analyse; returns the result with the
 * job's engine and the gzip pieces for chunk rows (none when `compress` is false: the file goes to object storage
 * as it is). With `compress`, the pieces are handed over to the thread: the caller must not read them again.
 */
export function screenUpload(pieces: Uint8Array[], length: number, settings: AnalysisSettingsValues, compress: boolean, signal?: AbortSignal): Promise<{ chunks: Uint8Array[]; result: AnalysisResult; sha256: string }> {
  // Stored as chunk rows, the file is needed only in its compressed form: its pieces move to the thread rather
  // than being copied (each must own its memory). Bound for object storage, they stay here to be sent as they are.
  const owned = compress && pieces.every((p) => p.byteOffset === 0 && p.byteLength === p.buffer.byteLength);
  return runTask({ kind: 'screen-upload', pieces, length, settings, compress }, signal, owned ? pieces.map((p) => p.buffer) : []);
}

/** The engine on a stored capture with the given settings, and the report's trace excerpt from the same reading. */
export function analyzeStored(stored: StoredPieces, settings: AnalysisSettingsValues, signal?: AbortSignal): Promise<{ result: AnalysisResult; trace: TraceExcerpt | null }> {
  return runTask({ kind: 'analyze', stored, settings }, signal);
}

/** The report's trace excerpt from a stored capture (for analyses saved before excerpts were kept), or null when it has no channel to draw. */
export function storedTraceExcerpt(stored: StoredPieces, result: AnalysisResult, settings: AnalysisSettingsValues, signal?: AbortSignal): Promise<TraceExcerpt | null> {
  return runTask({ kind: 'trace', stored, result, settings }, signal);
}

/** A report PDF from its data (@react-pdf/renderer in a thread). */
export async function renderPdf(data: ReportPdfData, signal?: AbortSignal): Promise<Buffer> {
  return Buffer.from(await runTask<Uint8Array>({ kind: 'pdf', data }, signal));
}
