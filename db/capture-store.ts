/**
 * Where a capture's raw bytes live, read back the same way wherever that is: gzip chunk rows in the database
 * (the default, so the embedded database and its backup hold everything), or one object in S3-compatible
 * storage when CAPTURE_STORE is set (db/object-store.ts). The capture row says which (storage_url).
 */
import { createHash } from 'node:crypto';
import type { Db } from './db-type';
import { readPackedChunks, unpackedChunkStream, unpackPieces } from './chunks';
import { headObject, objectStream, readObject } from './object-store';

export interface StoredCaptureRef {
  id: string;
  sizeBytes: number;
  storageUrl: string | null;
}

/** A capture's bytes as stored: gzip pieces from the database, or the object's plain pieces. */
export interface StoredPieces {
  pieces: Uint8Array[];
  size: number;
  gzip: boolean;
}

export async function readStoredPieces(db: Pick<Db, 'select'>, c: StoredCaptureRef, signal?: AbortSignal): Promise<StoredPieces> {
  if (c.storageUrl) return { pieces: await readObject(c.storageUrl, signal), size: c.sizeBytes, gzip: false };
  return { pieces: await readPackedChunks(db, c.id), size: c.sizeBytes, gzip: true };
}

/** The bytes as one array. */
export function joinStoredPieces(s: StoredPieces): Uint8Array {
  return unpackPieces(s.pieces, s.size, s.gzip);
}

/** The raw file as a stream with backpressure: straight from object storage, or unpacked chunk by chunk from the database. */
export async function storedStream(db: Pick<Db, 'select'>, c: StoredCaptureRef, signal?: AbortSignal): Promise<ReadableStream<Uint8Array>> {
  if (c.storageUrl) return (await objectStream(c.storageUrl, signal)).stream;
  return unpackedChunkStream(db, c.id);
}

/** What is wrong with a stored capture's bytes against its recorded size and SHA-256, or undefined when whole. */
export async function storedProblem(db: Pick<Db, 'select'>, c: StoredCaptureRef & { sha256: string }): Promise<string | undefined> {
  const hash = createHash('sha256');
  let size = 0;
  if (c.storageUrl) {
    const head = await headObject(c.storageUrl);
    if (!head) return `its object ${c.storageUrl} is missing from object storage`;
    for await (const piece of (await objectStream(c.storageUrl)).stream as unknown as AsyncIterable<Uint8Array>) {
      hash.update(piece);
      size += piece.length;
    }
  } else {
    for await (const piece of unpackedChunkStream(db, c.id) as unknown as AsyncIterable<Uint8Array>) {
      hash.update(piece);
      size += piece.length;
    }
  }
  if (size !== c.sizeBytes) return `${size} bytes are stored where ${c.sizeBytes} were uploaded`;
  if (hash.digest('hex') !== c.sha256) return 'the stored bytes do not match the SHA-256 recorded at upload';
  return undefined;
}
