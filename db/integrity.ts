/**
 * The stored captures checked against themselves: every chunk row or object present, the bytes the stated
 * size, and their SHA-256 the one recorded at upload; every saved analysis pointing at its capture's hash. After
 * a crash or a restore, this is how a shop knows its files are whole.
 */
import { asc, sql } from 'drizzle-orm';
import { storedProblem } from './capture-store';
import type { Db } from './db-type';
import { analyses, captures } from './schema';

export interface CaptureCheck {
  id: string;
  fileName: string;
  sha256: string;
  chunkCount: number;
  chunksFound: number;
  /** s3://bucket/key when the bytes are in object storage. */
  storageUrl: string | null;
  ok: boolean;
  problem?: string;
}

export interface IntegrityReport {
  captures: CaptureCheck[];
  analyses: { id: string; captureId: string }[];
  /** Analyses whose recorded file hash is not their capture's. */
  mismatchedAnalyses: string[];
  ok: boolean;
}

/** `onProgress` hears (captures checked, captures in all) as the check goes. */
export async function checkIntegrity(db: Db, onProgress?: (done: number, total: number) => void): Promise<IntegrityReport> {
  const rows = await db
    .select({
      id: captures.id,
      fileName: captures.fileName,
      sha256: captures.sha256,
      sizeBytes: captures.sizeBytes,
      chunkCount: captures.chunkCount,
      storageUrl: captures.storageUrl,
      chunksFound: sql<number>`(select count(*)::int from capture_chunks c where c.capture_id = ${captures.id})`,
    })
    .from(captures)
    .orderBy(asc(captures.createdAt));
  const checks: CaptureCheck[] = [];
  for (const r of rows) {
    const problem = await captureProblem(db, r);
    checks.push({ id: r.id, fileName: r.fileName, sha256: r.sha256, chunkCount: r.chunkCount, chunksFound: r.chunksFound, storageUrl: r.storageUrl, ok: !problem, problem });
    onProgress?.(checks.length, rows.length);
  }
  const saved = await db.select({ id: analyses.id, captureId: analyses.captureId, fileSha256: analyses.fileSha256 }).from(analyses);
  const byId = new Map(checks.map((c) => [c.id, c]));
  const mismatchedAnalyses = saved.filter((a) => byId.get(a.captureId)?.sha256 !== a.fileSha256).map((a) => a.id);
  return {
    captures: checks,
    analyses: saved.map(({ id, captureId }) => ({ id, captureId })),
    mismatchedAnalyses,
    ok: checks.every((c) => c.ok) && mismatchedAnalyses.length === 0,
  };
}

/** What is wrong with one stored capture, or undefined when it is whole. */
async function captureProblem(db: Db, r: { id: string; sha256: string; sizeBytes: number; chunkCount: number; chunksFound: number; storageUrl: string | null }): Promise<string | undefined> {
  if (r.chunksFound !== r.chunkCount) return `${r.chunksFound} of ${r.chunkCount} chunks are stored`;
  try {
    return await storedProblem(db, r);
  } catch (e) {
    return `the stored bytes cannot be read (${(e as Error).message})`;
  }
}
