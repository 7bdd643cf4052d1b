/**
 * Capture bytes as chunk rows. The bytes cross to the database as base64 text decoded in SQL: PGlite's own
 * bytea parameter encoding is about 14× slower for megabyte chunks (measured here), and a server takes it alike.
 */
import { promisify } from 'node:util';
import { gunzip, gunzipSync, gzipSync } from 'node:zlib';
import { and, asc, eq, gte, lt, sql } from 'drizzle-orm';
import type { Db } from './db-type';
import { captureChunks } from './schema';

export const CHUNK_BYTES = 1 << 20;

/** gzip-compresses one piece of a capture. */
export function compressPiece(piece: Uint8Array): Uint8Array {
  return gzipSync(piece, { level: 1 });
}

/** Inserts the compressed pieces in order, a few per statement. */
export async function insertChunks(db: Pick<Db, 'insert'>, captureId: string, chunks: Uint8Array[]): Promise<void> {
  for (let seq = 0; seq < chunks.length; seq += 8) {
    await db.insert(captureChunks).values(
      chunks.slice(seq, seq + 8).map((c, k) => ({ captureId, seq: seq + k, data: sql`decode(${Buffer.from(c).toString('base64')}, 'base64')` as unknown as Uint8Array })),
    );
  }
}

/** Pieces read per query: small batches, so other requests' queries run between them (PGlite works on this thread). */
const READ_BATCH = 4;

/** Up to READ_BATCH compressed pieces from `seq` on, in order. */
async function readBatch(db: Pick<Db, 'select'>, captureId: string, seq: number, count = READ_BATCH): Promise<Uint8Array[]> {
  const rows = await db
    .select({ b64: sql<string>`encode(${captureChunks.data}, 'base64')` })
    .from(captureChunks)
    .where(and(eq(captureChunks.captureId, captureId), gte(captureChunks.seq, seq), lt(captureChunks.seq, seq + count)))
    .orderBy(asc(captureChunks.seq));
  return rows.map((r) => Buffer.from(r.b64, 'base64'));
}

/** A capture's compressed pieces, in order, as stored (the engine's thread pool unpacks them). */
export async function readPackedChunks(db: Pick<Db, 'select'>, captureId: string): Promise<Uint8Array[]> {
  const out: Uint8Array[] = [];
  for (;;) {
    const rows = await readBatch(db, captureId, out.length);
    out.push(...rows);
    if (rows.length < READ_BATCH) return out;
    // Let the event loop serve others before the next batch.
    await new Promise((r) => setImmediate(r));
  }
}

/** One array of `size` bytes from pieces in order, gzip-compressed (chunk rows) or plain (an object's). */
export function unpackPieces(pieces: Uint8Array[], size: number, gzip = true): Uint8Array {
  if (!gzip && pieces.length === 1 && pieces[0].length === size) return pieces[0];
  const out = new Uint8Array(size);
  let o = 0;
  for (const piece of pieces) {
    const part = gzip ? gunzipSync(piece) : piece;
    out.set(part, o);
    o += part.length;
  }
  return out;
}

const gunzipAsync = promisify(gunzip);

/**
 * The capture's plain bytes as a stream: chunk rows are read a few at a time as the reader asks for more, and each
 * is unpacked on libuv's thread pool, so a large download neither holds the file in memory nor stalls the server.
 */
export function unpackedChunkStream(db: Pick<Db, 'select'>, captureId: string): ReadableStream<Uint8Array> {
  let seq = 0;
  return new ReadableStream<Uint8Array>(
    {
      // One piece per query: the smallest slices of this thread's time, between which other requests run.
      async pull(ctrl) {
        const [piece] = await readBatch(db, captureId, seq++, 1);
        if (!piece) return ctrl.close();
        ctrl.enqueue(new Uint8Array(await gunzipAsync(piece)));
      },
    },
    { highWaterMark: 2 },
  );
}
