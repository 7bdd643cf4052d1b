/**
 * A shop's data as a whole, for its owner: everything it holds, read for the export, and its removal (every row
 * and object, recorded outside the shop since the shop's own activity goes with it).
 */
import 'server-only';
import { and, asc, count, eq } from 'drizzle-orm';
import { getDb } from '../client';
import { analyses, approvals, auditEvents, captures, jobs, organizations, reports, vehicles } from '../schema';
import { jobColumns } from './jobs';
import { flushObjectDeletes, queueObjectDeletes } from './object-deletes';

/** Every job of the shop with its vehicle, oldest first (the export reads each one's details in turn). */
export async function shopJobList(shopId: string) {
  const db = await getDb();
  return db.select({ ...jobColumns, doneAt: jobs.doneAt }).from(jobs).innerJoin(vehicles, eq(jobs.vehicleId, vehicles.id)).where(eq(jobs.shopId, shopId)).orderBy(asc(jobs.createdAt));
}

/** One job's captures (without their bytes), analyses, report revisions and the customer's answers. */
export async function jobDetailsForExport(shopId: string, jobId: string) {
  const db = await getDb();
  const files = await db
    .select({ id: captures.id, fileName: captures.fileName, contentType: captures.contentType, sizeBytes: captures.sizeBytes, sha256: captures.sha256, createdAt: captures.createdAt })
    .from(captures)
    .where(and(eq(captures.shopId, shopId), eq(captures.jobId, jobId)))
    .orderBy(asc(captures.createdAt));
  const saved = await db
    .select({ id: analyses.id, captureId: analyses.captureId, settings: analyses.settings, result: analyses.result, verdict: analyses.verdict, fileSha256: analyses.fileSha256, createdAt: analyses.createdAt })
    .from(analyses)
    .innerJoin(captures, eq(analyses.captureId, captures.id))
    .where(and(eq(analyses.shopId, shopId), eq(captures.jobId, jobId)))
    .orderBy(asc(analyses.createdAt));
  const revisions = await db
    .select({ id: reports.id, revision: reports.revision, status: reports.status, content: reports.content, signedAt: reports.signedAt, snapshotSha256: reports.snapshotSha256, createdAt: reports.createdAt })
    .from(reports)
    .where(and(eq(reports.shopId, shopId), eq(reports.jobId, jobId)))
    .orderBy(asc(reports.revision));
  const answers = await db
    .select({ reportId: approvals.reportId, revision: approvals.revision, decision: approvals.decision, typedName: approvals.typedName, createdAt: approvals.createdAt })
    .from(approvals)
    .innerJoin(reports, eq(approvals.reportId, reports.id))
    .where(and(eq(approvals.shopId, shopId), eq(reports.jobId, jobId)));
  return { captures: files, analyses: saved, reports: revisions, answers };
}

export type RemoveShopResult = { removed: { jobs: number; captures: number; objectsLeft: number } } | { wrongName: string } | null;

/**
 * Removes the shop and everything in it when `typedName` is its name (spaces at either end aside): jobs first
 * (their vehicles are held by them), then the shop, whose members, invitations, settings, profiles and activity
 * go with it. Its objects are queued in the same transaction and removed after it (retried while storage is down).
 * The removal is recorded under no shop, with who removed it.
 */
export async function removeShop(shopId: string, actorId: string, typedName: string): Promise<RemoveShopResult> {
  const db = await getDb();
  const done = await db.transaction(async (tx): Promise<{ wrongName: string } | { jobs: number; captures: number; urls: string[] } | null> => {
    const [shop] = await tx.select({ id: organizations.id, name: organizations.name }).from(organizations).where(eq(organizations.id, shopId)).for('update');
    if (!shop) return null;
    if (typedName.trim() !== shop.name.trim()) return { wrongName: shop.name };
    const rows = await tx.select({ storageUrl: captures.storageUrl }).from(captures).where(eq(captures.shopId, shopId));
    const urls = rows.flatMap((r) => (r.storageUrl ? [r.storageUrl] : []));
    const [{ n: jobCount }] = await tx.select({ n: count() }).from(jobs).where(eq(jobs.shopId, shopId));
    await queueObjectDeletes(tx, urls);
    await tx.insert(auditEvents).values({ shopId: null, actorId, action: 'shop.remove', subjectType: 'shop', subjectId: shopId, detail: { name: shop.name, jobs: jobCount, captures: rows.length } });
    await tx.delete(jobs).where(eq(jobs.shopId, shopId));
    await tx.delete(organizations).where(eq(organizations.id, shopId));
    return { jobs: jobCount, captures: rows.length, urls };
  });
  if (!done || 'wrongName' in done) return done;
  const { left } = await flushObjectDeletes(done.urls);
  return { removed: { jobs: done.jobs, captures: done.captures, objectsLeft: left } };
}
