/**
 * Reads an uploaded capture from the request stream: refuses what is too large (413), compressed or not text
 * (415), and has the engine's thread pool hash it (SHA-256) and import every byte as the analysis will, so a
 * file that cannot be read — or holds nothing to analyse for this engine — is refused (422) before anything is
 * stored; the pool also compresses the pieces for chunk rows (object storage takes them as they are).
 */
import 'server-only';
import { CHUNK_BYTES } from '@/db/chunks';
import { pastCutOff } from './lifecycle.mjs';
import { captureStoreTarget } from '@/db/object-store';
import type { EngineSpec } from '@/domain/engine';
import { settingsForEngine } from '@/domain/analysis-settings';
import { type AnalysisResult, type CaptureError, isCaptureError, MAX_CAPTURE_BYTES, MAX_CAPTURE_SIZE } from '@/signal';
import { screenUpload } from './engine/pool';
import { HttpError } from './http';

const TEXT_TYPES = /^(text\/(csv|plain|tab-separated-values)|application\/(csv|vnd\.ms-excel|octet-stream))\b/i;

export interface ReceivedCapture {
  contentType: string;
  sizeBytes: number;
  sha256: string;
  pieces: Uint8Array[];
  chunks: Uint8Array[];
  /** The engine's reading with the job's engine and default settings, made while screening. */
  screening: AnalysisResult;
}

/** A 422 carrying the engine's sentence and, when it has one, the line and column. */
export class UnreadableCaptureError extends HttpError {
  constructor(e: CaptureError) {
    super(422, 'UNREADABLE_CAPTURE', e.message);
    this.detail = { engine: e.toJSON() };
  }
}

const tooLarge = () => new HttpError(413, 'TOO_LARGE', `The file is larger than ${MAX_CAPTURE_SIZE}; export a shorter window around the cranking.`);
const notText = (what: string) => new HttpError(415, 'NOT_TEXT', what);

/** What the first bytes say the file is, when that is not text. */
function binaryKind(head: Uint8Array): string | null {
  if (head[0] === 0x1f && head[1] === 0x8b) return 'This is a compressed (gzip) file; unpack it and upload the CSV or TSV text inside.';
  if (head[0] === 0x50 && head[1] === 0x4b && head[2] === 0x03 && head[3] === 0x04) return 'This is a zip archive; unpack it and upload the CSV or TSV text inside.';
  if ((head[0] === 0xff && head[1] === 0xfe) || (head[0] === 0xfe && head[1] === 0xff)) return 'This file is UTF-16 text; export the capture as UTF-8 (or plain ASCII) CSV or TSV.';
  if (head.subarray(0, 64 * 1024).includes(0)) return 'This is not a plain-text capture (it holds binary data); export it as CSV or TSV text.';
  return null;
}

/** Checks the request's headers before a byte of the body is read. */
export function checkUploadHeaders(headers: Headers): { length: number; contentType: string } {
  const length = Number(headers.get('content-length') ?? 0);
  if (length > MAX_CAPTURE_BYTES) throw tooLarge();
  const encoding = (headers.get('content-encoding') ?? 'identity').trim().toLowerCase();
  if (encoding !== 'identity' && encoding !== '') {
    throw notText(`The upload was sent compressed (${encoding}); send the capture as plain CSV or TSV text.`);
  }
  const contentType = (headers.get('content-type') ?? 'application/octet-stream').split(';')[0].trim();
  if (!TEXT_TYPES.test(contentType)) {
    throw notText(`A capture is a text file (CSV or TSV); this one was sent as ${contentType}. Export the capture as text from the scope or logger.`);
  }
  return { length, contentType };
}

/**
 * Streams the body: checks its first bytes and counts every piece on the request thread; then the engine's
 * thread pool hashes, imports and analyses the whole file (refusing what holds nothing to analyse) and
 * compresses the pieces for storage. `signal` cancels that work when the client goes away.
 */
export async function receiveCapture(body: ReadableStream<Uint8Array>, length: number, contentType: string, engine: EngineSpec, signal?: AbortSignal): Promise<ReceivedCapture> {
  const pieces: Uint8Array[] = [];
  let size = 0;
  let pending: Uint8Array[] = [];
  let pendingBytes = 0;
  const flush = () => {
    if (pendingBytes === 0) return;
    // A piece that owns its memory (never a slice of Node's shared pool), so it can move to the engine's thread.
    const piece = new Uint8Array(pendingBytes);
    let at = 0;
    for (const part of pending) {
      piece.set(part, at);
      at += part.length;
    }
    if (pieces.length === 0) {
      const kind = binaryKind(piece);
      if (kind) throw notText(kind);
    }
    pieces.push(piece);
    pending = [];
    pendingBytes = 0;
  };
  const reader = body.getReader();
  try {
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      if (pastCutOff()) throw new HttpError(503, 'RESTARTING', 'The server restarted during the upload and nothing was stored; upload the file again.');
      size += value.length;
      if (size > MAX_CAPTURE_BYTES) throw tooLarge();
      pending.push(value);
      pendingBytes += value.length;
      if (pendingBytes >= CHUNK_BYTES) flush();
    }
    flush();
  } catch (e) {
    await reader.cancel().catch(() => {});
    throw e;
  }
  if (size === 0 || pieces.length === 0) throw new HttpError(400, 'EMPTY_FILE', 'The file is empty; export the capture again.');
  try {
    const { chunks, result, sha256 } = await screenUpload(pieces, length, settingsForEngine(engine), !captureStoreTarget(), signal);
    return { contentType, sizeBytes: size, sha256, pieces, chunks, screening: result };
  } catch (e) {
    if (isCaptureError(e)) throw new UnreadableCaptureError(e);
    throw e;
  }
}
