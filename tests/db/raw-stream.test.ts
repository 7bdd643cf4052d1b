/**
 * A capture kept in chunk rows streams back as uploaded: 5 MB in 1 MB gzip pieces come back byte for byte
 * (SHA-256, FIPS 180-4 through node:crypto), piece by piece, and a reader that stops early can cancel.
 */
import { createHash } from 'node:crypto';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { CHUNK_BYTES, compressPiece } from '@/db/chunks';
import type { Db } from '@/db/client';
import { createCapture, readCaptureStream } from '@/db/queries/captures';
import { jobs } from '@/db/schema';
import { seededDemo } from '../support/seeded-db';

let db: Db;
let shopId: string;
let userId: string;
let jobId: string;

beforeAll(async () => {
  delete process.env.CAPTURE_STORE;
  ({ db, shopId, userId } = await seededDemo(mkdtempSync(join(tmpdir(), 'crankprint-raw-'))));
  [{ id: jobId }] = await db.select({ id: jobs.id }).from(jobs).where(eq(jobs.shopId, shopId)).limit(1);
}, 60_000);

describe('the raw file from chunk rows', () => {
  it('streams back byte for byte, one piece at a time', async () => {
    const text = Array.from({ length: 400_000 }, (_, i) => `${(i / 50_000).toFixed(6)},${(120 + 40 * Math.sin(i / 90)).toFixed(2)}`).join('\n');
    const bytes = new TextEncoder().encode(text);
    const pieces = Array.from({ length: Math.ceil(bytes.length / CHUNK_BYTES) }, (_, i) => bytes.subarray(i * CHUNK_BYTES, (i + 1) * CHUNK_BYTES));
    expect(pieces.length).toBeGreaterThan(4);
    const sha = createHash('sha256').update(bytes).digest('hex');
    const row = (await createCapture(shopId, { jobId, fileName: 'stream — ü.csv', contentType: 'text/csv', sizeBytes: bytes.length, sha256: sha, pieces, chunks: pieces.map(compressPiece), uploadedBy: userId }))!;
    const reader = (await readCaptureStream(shopId, row.id))!.getReader();
    const hash = createHash('sha256');
    let reads = 0;
    let size = 0;
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      reads++;
      size += value.length;
      hash.update(value);
    }
    expect(size).toBe(bytes.length);
    expect(hash.digest('hex')).toBe(sha);
    expect(reads).toBe(pieces.length);
    const early = (await readCaptureStream(shopId, row.id))!.getReader();
    expect((await early.read()).value!.length).toBe(CHUNK_BYTES);
    await early.cancel();
  });
});
