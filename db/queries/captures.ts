/**
 * Captures of one shop: raw bytes gzip-compressed in chunk rows, written in one transaction (a failed or
 * cancelled upload leaves nothing), read back in order. Every function takes the shop id it is scoped to.
 */
import 'server-only';
import { and, desc, eq } from 'drizzle-orm';
import { insertChunks, readChunks, readPackedChunks } from '../chunks';
import { getDb } from '../client';
import { analyses, captures, jobs } from '../schema';

export interface NewCapture {
  jobId: string;
  fileName: string;
  contentType: string;
  sizeBytes: number;
  sha256: string;
  /** gzip-compressed pieces, in order (see db/chunks.ts). */
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
export async function createCapture(shopId: string, c: NewCapture) {
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [job] = await tx.select({ id: jobs.id }).from(jobs).where(and(eq(jobs.shopId, shopId), eq(jobs.id, c.jobId)));
    if (!job) return null;
    const [dupe] = await tx.select({ id: captures.id }).from(captures).where(and(eq(captures.jobId, c.jobId), eq(captures.sha256, c.sha256)));
    if (dupe) throw new DuplicateCaptureError(dupe.id);
    const [row] = await tx
      .insert(captures)
      .values({ shopId, jobId: c.jobId, fileName: c.fileName, contentType: c.contentType, sizeBytes: c.sizeBytes, sha256: c.sha256, chunkCount: c.chunks.length, uploadedBy: c.uploadedBy })
      .returning(captureColumns);
    await insertChunks(tx, row.id, c.chunks);
    await tx.update(jobs).set({ updatedAt: new Date() }).where(eq(jobs.id, c.jobId));
    return row;
  });
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

/** The capture's raw bytes, decompressed, or null when it is not the shop's. */
export async function readCaptureBytes(shopId: string, captureId: string): Promise<Uint8Array | null> {
  const capture = await getCapture(shopId, captureId);
  if (!capture) return null;
  return readChunks(await getDb(), captureId, capture.sizeBytes);
}

/** A capture's stored gzip pieces and size, for the engine's thread pool; null for another shop's capture. */
export async function readCapturePacked(shopId: string, captureId: string): Promise<{ gz: Uint8Array[]; size: number } | null> {
  const capture = await getCapture(shopId, captureId);
  if (!capture) return null;
  return { gz: await readPackedChunks(await getDb(), captureId), size: capture.sizeBytes };
}

export async function saveAnalysis(
  shopId: string,
  a: { captureId: string; settings: unknown; engineVersion: string; fileSha256: string; result: unknown; verdict: string; crankingRpm: number; createdBy: string },
) {
  const db = await getDb();
  const [row] = await db.insert(analyses).values({ shopId, ...a }).returning();
  return row;
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
