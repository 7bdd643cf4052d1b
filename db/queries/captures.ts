/**
 * Captures of one shop: raw bytes gzip-compressed in chunk rows written in the same transaction as the row, or
 * (CAPTURE_STORE) one object written before the row and removed again when the row cannot be written, so a
 * failed or cancelled upload leaves nothing. Every function takes the shop id it is scoped to.
 */
import 'server-only';
import { and, desc, eq } from 'drizzle-orm';
import { readStoredPieces, type StoredPieces, storedStream } from '../capture-store';
import { insertChunks } from '../chunks';
import { getDb } from '../client';
import { captureStoreTarget, newCaptureUrl, putObject } from '../object-store';
import { removeObjectsNowOrLater } from './object-deletes';
import { analyses, captures, jobs } from '../schema';
import type { AnalysisSettingsValues } from '@/domain/analysis-settings';
import type { TraceExcerpt } from '@/domain/trace-excerpt';
import type { AnalysisResult } from '@/signal';

export interface NewCapture {
  jobId: string;
  fileName: string;
  contentType: string;
  sizeBytes: number;
  sha256: string;
  /** The file's bytes in pieces, in order. */
  pieces: Uint8Array[];
  /** The same pieces gzip-compressed for chunk rows (see db/chunks.ts); empty when CAPTURE_STORE is set. */
  chunks: Uint8Array[];
  uploadedBy: string;
}

export class DuplicateCaptureError extends Error {
  readonly captureId: string;
  constructor(captureId: string) {
    super('This file was already uploaded to this job.');
    this.captureId = captureId;
  }
}

const captureColumns = {
  id: captures.id,
  jobId: captures.jobId,
  fileName: captures.fileName,
  contentType: captures.contentType,
  sizeBytes: captures.sizeBytes,
  sha256: captures.sha256,
  createdAt: captures.createdAt,
  uploadedBy: captures.uploadedBy,
};

/** Stores a capture; throws DuplicateCaptureError when the same file is already on the job. Null when the job is not the shop's. */
export async function createCapture(shopId: string, c: NewCapture, signal?: AbortSignal) {
  const db = await getDb();
  const target = captureStoreTarget();
  const id = crypto.randomUUID();
  const storageUrl = target ? newCaptureUrl(target, shopId, id) : null;
  // Inside the transaction the job row is locked for the update of its time below (FOR NO KEY UPDATE): a removal
  // of the job waits for this capture (and then removes it with its object), or this insert waits for the removal
  // and finds no job. Two uploads to one job take turns here; a share lock upgraded by the update deadlocked them.
  const check = async (tx: Pick<typeof db, 'select'>, lock = false) => {
    const query = tx.select({ id: jobs.id }).from(jobs).where(and(eq(jobs.shopId, shopId), eq(jobs.id, c.jobId)));
    const [job] = lock ? await query.for('no key update') : await query;
    if (!job) return false;
    const [dupe] = await tx.select({ id: captures.id }).from(captures).where(and(eq(captures.jobId, c.jobId), eq(captures.sha256, c.sha256)));
    if (dupe) throw new DuplicateCaptureError(dupe.id);
    return true;
  };
  if (storageUrl) {
    // The object first (outside any transaction, which would hold the embedded database for the whole upload).
    if (!(await check(db))) return null;
    await putObject(storageUrl, c.pieces, { sha256: c.sha256, contentType: c.contentType }, signal);
  }
  try {
    const row = await db.transaction(async (tx) => {
      if (!(await check(tx, true))) return null;
      const [row] = await tx
        .insert(captures)
        .values({
          id,
          shopId,
          jobId: c.jobId,
          fileName: c.fileName,
          contentType: c.contentType,
          sizeBytes: c.sizeBytes,
          sha256: c.sha256,
          compression: storageUrl ? 'none' : 'gzip',
          chunkCount: storageUrl ? 0 : c.chunks.length,
          storageUrl,
          uploadedBy: c.uploadedBy,
        })
        .returning(captureColumns);
      if (!storageUrl) await insertChunks(tx, row.id, c.chunks);
      await tx.update(jobs).set({ updatedAt: new Date() }).where(eq(jobs.id, c.jobId));
      return row;
    });
    // The job went while the object was written: the object goes too, before the answer.
    if (!row && storageUrl) await removeObjectsNowOrLater([storageUrl]);
    return row;
  } catch (e) {
    if (storageUrl) await removeObjectsNowOrLater([storageUrl]);
    throw e;
  }
}

export async function listCaptures(shopId: string, jobId: string) {
  const db = await getDb();
  return db.select(captureColumns).from(captures).where(and(eq(captures.shopId, shopId), eq(captures.jobId, jobId))).orderBy(desc(captures.createdAt));
}

export async function getCapture(shopId: string, captureId: string) {
  const db = await getDb();
  const [row] = await db.select(captureColumns).from(captures).where(and(eq(captures.shopId, shopId), eq(captures.id, captureId)));
  return row ?? null;
}

async function storedRef(shopId: string, captureId: string) {
  const db = await getDb();
  const [row] = await db
    .select({ id: captures.id, sizeBytes: captures.sizeBytes, storageUrl: captures.storageUrl })
    .from(captures)
    .where(and(eq(captures.shopId, shopId), eq(captures.id, captureId)));
  return row ?? null;
}

/** The capture's raw file as a stream, or null when it is not the shop's. */
export async function readCaptureStream(shopId: string, captureId: string, signal?: AbortSignal): Promise<ReadableStream<Uint8Array> | null> {
  const ref = await storedRef(shopId, captureId);
  return ref && storedStream(await getDb(), ref, signal);
}

/** A capture's stored pieces, for the engine's thread pool; null for another shop's capture. */
export async function readCapturePacked(shopId: string, captureId: string, signal?: AbortSignal): Promise<StoredPieces | null> {
  const ref = await storedRef(shopId, captureId);
  return ref && readStoredPieces(await getDb(), ref, signal);
}

/** Stores an analysis; null when its capture no longer exists (removed while the analysis ran). */
export async function saveAnalysis(
  shopId: string,
  a: { captureId: string; settings: AnalysisSettingsValues; engineVersion: string; fileSha256: string; result: AnalysisResult; trace: TraceExcerpt | null; verdict: string; crankingRpm: number; createdBy: string },
) {
  const db = await getDb();
  try {
    const [row] = await db.insert(analyses).values({ shopId, ...a }).returning();
    return row;
  } catch (e) {
    // The capture (its job removed) went while the analysis ran: there is nothing to save it on.
    if (sqlState(e) === FOREIGN_KEY_VIOLATION) return null;
    throw e;
  }
}

const FOREIGN_KEY_VIOLATION = '23503';

/** The PostgreSQL error code of a failed query (drizzle wraps the driver's error in `cause`). */
function sqlState(e: unknown): string | undefined {
  for (let x: unknown = e; x && typeof x === 'object'; x = (x as { cause?: unknown }).cause) {
    const code = (x as { code?: unknown }).code;
    if (typeof code === 'string' && /^[0-9A-Z]{5}$/.test(code)) return code;
  }
  return undefined;
}

export async function listAnalyses(shopId: string, captureId: string) {
  const db = await getDb();
  return db.select().from(analyses).where(and(eq(analyses.shopId, shopId), eq(analyses.captureId, captureId))).orderBy(desc(analyses.createdAt));
}

/** The newest analysis of each capture on a job, for thumbnails. */
export async function latestAnalysesForJob(shopId: string, jobId: string) {
  const db = await getDb();
  const rows = await db
    .select({ captureId: analyses.captureId, result: analyses.result, verdict: analyses.verdict, createdAt: analyses.createdAt })
    .from(analyses)
    .innerJoin(captures, eq(analyses.captureId, captures.id))
    .where(and(eq(analyses.shopId, shopId), eq(captures.jobId, jobId)))
    .orderBy(desc(analyses.createdAt));
  const latest = new Map<string, (typeof rows)[number]>();
  for (const r of rows) if (!latest.has(r.captureId)) latest.set(r.captureId, r);
  return latest;
}
