/**
 * The engine's thread pool: the same engine, run in another thread, must give what it gives on this one
 * (the reference is the engine called in-process on the same bytes); stored pieces must unpack to the
 * uploaded bytes (SHA-256); a full queue is a prompt 503; an aborted request cancels its task.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { afterAll, describe, expect, it } from 'vitest';
import { unpackPieces } from '@/db/chunks';
import { engineSettings, settingsForEngine } from '@/domain/analysis-settings';
import { analyzeBytes, isCaptureError } from '@/signal';
import { analyzeStored, closeEnginePool, MAX_QUEUE, renderPdf, screenUpload, storedTraceExcerpt, THREADS } from '@/server/engine/pool';
import { sampleReportData } from '../report/sample-report';
import { HttpError } from '@/server/http';
import { traceExcerpt } from '@/domain/trace-excerpt';
import { measuredNothing, refusalFor } from '@/domain/capture-policy';

const SAMPLE = readFileSync('samples/i4-burnt-valve-current-sync.csv');
const I4 = settingsForEngine({ cylinders: 4, layout: 'inline', firingOrder: [1, 3, 4, 2] });
const pieces = (b: Buffer, size = 1 << 18) => Array.from({ length: Math.ceil(b.length / size) }, (_, k) => new Uint8Array(b.subarray(k * size, (k + 1) * size)));
const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

afterAll(closeEnginePool);

const stored = (chunks: Uint8Array[]) => ({ pieces: chunks, size: SAMPLE.length, gzip: true });

describe('engine thread pool', () => {
  it('screens an upload in a thread and hands back gzip pieces that unpack to the same bytes, with the engine’s reading', async () => {
    const { chunks, result } = await screenUpload(pieces(SAMPLE), SAMPLE.length, I4, true);
    expect(JSON.parse(JSON.stringify(result))).toEqual(JSON.parse(JSON.stringify(analyzeBytes(new Uint8Array(SAMPLE), engineSettings(I4), {}).result)));
    expect(chunks.length).toBe(Math.ceil(SAMPLE.length / (1 << 18)));
    expect(sha(unpackPieces(chunks, SAMPLE.length))).toBe(sha(SAMPLE));
  });

  it('analyses a stored capture exactly as the engine does on this thread, from chunk rows or from an object', async () => {
    const { chunks } = await screenUpload(pieces(SAMPLE), SAMPLE.length, I4, true);
    const there = await analyzeStored(stored(chunks), I4);
    const here = analyzeBytes(new Uint8Array(SAMPLE), engineSettings(I4), {});
    expect(JSON.parse(JSON.stringify(there.result))).toEqual(JSON.parse(JSON.stringify(here.result)));
    // The report's excerpt comes from the same reading.
    expect(there.trace).toEqual(traceExcerpt(here.capture.columns, here.result));
    // An analysis saved before excerpts were kept gets the same excerpt from the stored file.
    expect(await storedTraceExcerpt(stored(chunks), there.result, I4)).toEqual(there.trace);
    expect(await analyzeStored({ pieces: pieces(SAMPLE), size: SAMPLE.length, gzip: false }, I4)).toEqual(there);
  });

  it('hands back no gzip pieces when the file goes to object storage as it is, and leaves the pieces to send', async () => {
    const kept = pieces(SAMPLE);
    expect((await screenUpload(kept, SAMPLE.length, I4, false)).chunks).toEqual([]);
    expect(sha(unpackPieces(kept, SAMPLE.length, false))).toBe(sha(SAMPLE));
  });

  it('moves the pieces to the thread when they are stored compressed: no copy of the file stays behind', async () => {
    const moved = pieces(SAMPLE);
    const { chunks } = await screenUpload(moved, SAMPLE.length, I4, true);
    expect(moved.every((p) => p.byteLength === 0)).toBe(true);
    expect(sha(unpackPieces(chunks, SAMPLE.length))).toBe(sha(SAMPLE));
  });

  it('refuses a file with nothing to analyse with the engine’s own error, as it would on this thread', async () => {
    const flat = Buffer.from(`Time (s),Current (A)\n${Array.from({ length: 4000 }, (_, i) => `${(i / 1000).toFixed(3)},5`).join('\n')}\n`);
    const local = analyzeBytes(new Uint8Array(flat), engineSettings(I4), {});
    const expected = refusalFor(local.capture, local.result);
    expect(expected).not.toBeNull();
    // The same rule Save answers with NOTHING_TO_MEASURE.
    expect(measuredNothing(local.result)).toBe(true);
    expect(measuredNothing(analyzeBytes(new Uint8Array(SAMPLE), engineSettings(I4), {}).result)).toBe(false);
    const e = await screenUpload(pieces(flat), flat.length, I4, true).catch((x: unknown) => x);
    expect(isCaptureError(e)).toBe(true);
    expect(e).toMatchObject({ code: expected!.code, message: expected!.message });
  });

  it('turns work away with a 503 at once when the queue is full', async () => {
    const { chunks } = await screenUpload(pieces(SAMPLE), SAMPLE.length, I4, true);
    const tasks = Array.from({ length: THREADS + MAX_QUEUE + 3 }, () => analyzeStored(stored(chunks), I4).then(() => 'done', (e: unknown) => e));
    const answers = await Promise.all(tasks);
    const busy = answers.filter((a) => a instanceof HttpError && a.status === 503);
    expect(busy.length).toBeGreaterThan(0);
    expect((busy[0] as HttpError).message).toMatch(/busy/);
    expect(answers.filter((a) => a === 'done').length).toBeGreaterThanOrEqual(MAX_QUEUE);
  });

  it('renders a report PDF in a thread', async () => {
    const pdf = await renderPdf(sampleReportData());
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(pdf.length).toBeGreaterThan(10_000);
  });

  it('cancels a task when its request is aborted', async () => {
    const { chunks } = await screenUpload(pieces(SAMPLE), SAMPLE.length, I4, true);
    const ac = new AbortController();
    const run = analyzeStored(stored(chunks), I4, ac.signal).catch((e: unknown) => e);
    ac.abort();
    const e = await run;
    expect(e).toBeInstanceOf(HttpError);
    expect((e as HttpError).code).toBe('CANCELLED');
  });
});
