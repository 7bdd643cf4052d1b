/**
 * Reports on a job: revisions (a signed revision is frozen; editing makes the next one), share links (tokens
 * stored hashed) and the customer's decisions. Every function takes the shop id, except the one that resolves a
 * share token, which the token itself scopes.
 */
import 'server-only';
import { createHash, randomBytes } from 'node:crypto';
import { and, desc, eq, gt, inArray, isNull, ne } from 'drizzle-orm';
import { getDb } from '../client';
import { analyses, approvals, captures, jobs, reports, shareLinks, users } from '../schema';
import type { ReportContent } from '@/domain/report';
import type { ShopSettings } from '@/domain/shop-settings';
import { readSnapshot } from './report-snapshot';
import { liveBundle, signedSnapshot } from './report-bundle';
import { getShopSettings } from './shops';

export class ReportStateError extends Error {}

/** The revision and version an editor loaded: `{ revision: 0, version: 0 }` when the job had no report yet. */
export interface DraftBase {
  revision: number;
  version: number;
}

const CHANGED_ELSEWHERE =
  'This report was saved or signed in another tab or by someone else since you opened it. Copy anything you want to keep, then reload the page to see the latest revision.';

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

/** A revision as the API shows it: its snapshot stays in the database (the PDF and the customer page read it). */
function withoutSnapshot<T extends { snapshot?: string | null }>(r: T): Omit<T, 'snapshot'> {
  const { snapshot, ...rest } = r;
  void snapshot;
  return rest;
}

export async function listRevisions(shopId: string, jobId: string) {
  const db = await getDb();
  const rows = await db.select().from(reports).where(and(eq(reports.shopId, shopId), eq(reports.jobId, jobId))).orderBy(desc(reports.revision));
  return rows.map(withoutSnapshot);
}

export async function getReport(shopId: string, reportId: string) {
  const db = await getDb();
  const [r] = await db.select().from(reports).where(and(eq(reports.shopId, shopId), eq(reports.id, reportId)));
  return r ?? null;
}

/** Analyses the report may include: those of captures on jobs of the same vehicle (before/after). */
async function allowedAnalyses(shopId: string, jobId: string, ids: string[]) {
  if (ids.length === 0) return [];
  const db = await getDb();
  const [job] = await db.select({ vehicleId: jobs.vehicleId }).from(jobs).where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId)));
  if (!job) return [];
  return db
    .select({ id: analyses.id })
    .from(analyses)
    .innerJoin(captures, eq(analyses.captureId, captures.id))
    .innerJoin(jobs, eq(captures.jobId, jobs.id))
    .where(and(eq(analyses.shopId, shopId), eq(jobs.vehicleId, job.vehicleId), inArray(analyses.id, ids)));
}

/**
 * Saves the draft: updates the open draft, or starts the next revision after a signed one. The latest revision is
 * locked first, so a save and a signing of the same draft happen one after the other, never interleaved. With a
 * `base`, the save is refused (ReportStateError) unless the latest revision is still the one the editor loaded:
 * two tabs saving the same draft, the second is told; a save made on a draft signed meanwhile is told.
 */
export async function saveDraft(shopId: string, jobId: string, content: ReportContent, base?: DraftBase) {
  const allowed = new Set((await allowedAnalyses(shopId, jobId, content.analysisIds)).map((a) => a.id));
  const clean = { ...content, analysisIds: content.analysisIds.filter((id) => allowed.has(id)) };
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [latest] = await tx.select().from(reports).where(and(eq(reports.shopId, shopId), eq(reports.jobId, jobId))).orderBy(desc(reports.revision)).limit(1).for('update');
    if (base && (base.revision !== (latest?.revision ?? 0) || base.version !== (latest?.version ?? 0))) throw new ReportStateError(CHANGED_ELSEWHERE);
    if (latest && latest.status === 'draft') {
      const [r] = await tx
        .update(reports)
        .set({ content: clean, version: latest.version + 1 })
        .where(eq(reports.id, latest.id))
        .returning();
      return withoutSnapshot(r);
    }
    const [r] = await tx
      .insert(reports)
      .values({ shopId, jobId, revision: (latest?.revision ?? 0) + 1, status: 'draft', content: clean })
      .returning();
    return withoutSnapshot(r);
  });
}

/**
 * Signs a draft that includes at least one saved analysis. In one transaction, with the revision locked: the
 * bundle as it stands is copied into the revision (the snapshot and its SHA-256), and the revision is marked
 * signed, so a save racing the signing either lands before it (and is what is signed) or starts the next revision.
 */
export async function signReport(shopId: string, reportId: string, userId: string, version?: number) {
  const db = await getDb();
  // Read before the transaction: the embedded database serves one connection, which the transaction holds.
  const shopSettings = await getShopSettings(shopId);
  return db.transaction(async (tx) => {
    const [r] = await tx.select().from(reports).where(and(eq(reports.shopId, shopId), eq(reports.id, reportId))).for('update');
    if (!r) return null;
    if (r.status !== 'draft') throw new ReportStateError('This revision is already signed; edit the report to start a new revision.');
    if (version !== undefined && version !== r.version) throw new ReportStateError(CHANGED_ELSEWHERE);
    if (r.content.analysisIds.length === 0) throw new ReportStateError('A report needs at least one saved analysis before it can be signed; include one.');
    const signedAt = new Date();
    const signedRow = { ...r, status: 'signed', signedBy: userId, signedAt };
    const { bundle, text, sha256 } = await signedSnapshot(tx, shopId, signedRow, shopSettings);
    if (bundle.analyses.length === 0) throw new ReportStateError('The analyses this report includes are no longer on file; include a saved analysis, then sign.');
    const [signed] = await tx
      .update(reports)
      .set({ status: 'signed', signedBy: userId, signedAt, snapshot: text, snapshotSha256: sha256, version: r.version + 1 })
      .where(and(eq(reports.id, r.id), eq(reports.status, 'draft')))
      .returning();
    return signed ? withoutSnapshot(signed) : null;
  });
}

/**
 * Everything the PDF and the customer view show for one revision: a signed revision's snapshot (what was signed,
 * whatever changed since), or a draft's rows as they stand.
 */
export async function reportBundle(shopId: string, reportId: string) {
  const report = await getReport(shopId, reportId);
  if (!report) return null;
  if (report.status === 'signed' && report.snapshot) return readSnapshot<LiveBundle & { shopSettings?: ShopSettings }>(report.snapshot);
  return { ...(await liveBundle(await getDb(), shopId, report)), shopSettings: undefined as ShopSettings | undefined };
}

type LiveBundle = Awaited<ReturnType<typeof liveBundle>>;

export type ReportBundle = NonNullable<Awaited<ReturnType<typeof reportBundle>>>;

/** A new share link: 256 random bits, only the hash stored. Returns the token once. */
export async function createShareLink(shopId: string, reportId: string, userId: string, days = 14) {
  const token = randomBytes(32).toString('base64url');
  const db = await getDb();
  const [link] = await db
    .insert(shareLinks)
    .values({ shopId, reportId, tokenHash: hashToken(token), expiresAt: new Date(Date.now() + days * 86_400_000), createdBy: userId })
    .returning();
  return { token, link };
}

/** Share links of one report revision, or of every revision of a job, newest first. */
async function shareLinkRows(shopId: string, scope: { reportId: string } | { jobId: string }) {
  const db = await getDb();
  return db
    .select({ id: shareLinks.id, revision: reports.revision, expiresAt: shareLinks.expiresAt, revokedAt: shareLinks.revokedAt, createdAt: shareLinks.createdAt })
    .from(shareLinks)
    .innerJoin(reports, eq(shareLinks.reportId, reports.id))
    .where(and(eq(shareLinks.shopId, shopId), 'reportId' in scope ? eq(reports.id, scope.reportId) : eq(reports.jobId, scope.jobId)))
    .orderBy(desc(shareLinks.createdAt));
}

export function listShareLinks(shopId: string, reportId: string) {
  return shareLinkRows(shopId, { reportId });
}

export function listShareLinksForJob(shopId: string, jobId: string) {
  return shareLinkRows(shopId, { jobId });
}

export async function revokeShareLink(shopId: string, linkId: string) {
  const db = await getDb();
  const [l] = await db.update(shareLinks).set({ revokedAt: new Date() }).where(and(eq(shareLinks.shopId, shopId), eq(shareLinks.id, linkId))).returning();
  return l ?? null;
}

/** The live link for a token (not expired, not revoked), or null; the caller answers 404 either way. */
export async function findShareLink(token: string) {
  if (!/^[A-Za-z0-9_-]{40,64}$/.test(token)) return null;
  const db = await getDb();
  const [l] = await db
    .select()
    .from(shareLinks)
    .where(and(eq(shareLinks.tokenHash, hashToken(token)), isNull(shareLinks.revokedAt), gt(shareLinks.expiresAt, new Date())));
  return l ?? null;
}

/**
 * Records the customer's answer through a link, once per revision: returns the new answer, or `earlier` with
 * the answer that stands when one was already given through this link for this revision.
 */
export async function recordApproval(link: { id: string; shopId: string; reportId: string }, revision: number, decision: 'approve' | 'decline', typedName: string) {
  const db = await getDb();
  const [a] = await db
    .insert(approvals)
    .values({ shopId: link.shopId, reportId: link.reportId, revision, shareLinkId: link.id, decision, typedName })
    .onConflictDoNothing({ target: [approvals.shareLinkId, approvals.revision] })
    .returning();
  if (a) return { created: a, earlier: null };
  const [earlier] = await db
    .select()
    .from(approvals)
    .where(and(eq(approvals.shopId, link.shopId), eq(approvals.shareLinkId, link.id), eq(approvals.revision, revision)));
  return { created: null, earlier };
}

/** The answer given through this link for this revision, if any (the customer's page shows it instead of the buttons). */
export async function approvalThroughLink(link: { id: string; shopId: string }, revision: number) {
  const db = await getDb();
  const [a] = await db
    .select({ decision: approvals.decision, typedName: approvals.typedName, createdAt: approvals.createdAt })
    .from(approvals)
    .where(and(eq(approvals.shopId, link.shopId), eq(approvals.shareLinkId, link.id), eq(approvals.revision, revision)));
  return a ?? null;
}

/** Who made a share link, to tell them the customer answered (null when that account is gone). */
export async function shareLinkMaker(link: { createdBy: string | null }) {
  if (!link.createdBy) return null;
  const db = await getDb();
  const [u] = await db.select({ name: users.name, email: users.email }).from(users).where(eq(users.id, link.createdBy));
  return u ?? null;
}

export async function listApprovalsForJob(shopId: string, jobId: string) {
  const db = await getDb();
  return db
    .select({ id: approvals.id, decision: approvals.decision, typedName: approvals.typedName, revision: approvals.revision, createdAt: approvals.createdAt })
    .from(approvals)
    .innerJoin(reports, eq(approvals.reportId, reports.id))
    .where(and(eq(approvals.shopId, shopId), eq(reports.jobId, jobId)))
    .orderBy(desc(approvals.createdAt));
}

/**
 * Report revisions on other jobs that include an analysis of this job's captures, for the removal dialog: signed
 * ones keep what they cite (their snapshot), drafts lose it. Oldest job first, then by revision.
 */
export async function reportsCitingJob(shopId: string, jobId: string) {
  const db = await getDb();
  const [job] = await db.select({ vehicleId: jobs.vehicleId }).from(jobs).where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId)));
  if (!job) return [];
  const own = await db
    .select({ id: analyses.id })
    .from(analyses)
    .innerJoin(captures, eq(analyses.captureId, captures.id))
    .where(and(eq(analyses.shopId, shopId), eq(captures.jobId, jobId)));
  if (own.length === 0) return [];
  const ids = new Set(own.map((a) => a.id));
  // A report cites analyses of its own vehicle only: the other jobs of this vehicle are all there is to read.
  const rows = await db
    .select({ jobId: jobs.id, repairOrder: jobs.repairOrder, revision: reports.revision, status: reports.status, content: reports.content })
    .from(reports)
    .innerJoin(jobs, eq(reports.jobId, jobs.id))
    .where(and(eq(reports.shopId, shopId), eq(jobs.vehicleId, job.vehicleId), ne(jobs.id, jobId)))
    .orderBy(jobs.createdAt, reports.revision);
  return rows.filter((r) => r.content.analysisIds.some((id) => ids.has(id))).map(({ content, ...r }) => (void content, r as typeof r & { status: 'draft' | 'signed' }));
}

/** Saved analyses the report can include: every capture on jobs of this job's vehicle, newest first. */
export async function candidateAnalyses(shopId: string, jobId: string) {
  const db = await getDb();
  const [job] = await db.select({ vehicleId: jobs.vehicleId }).from(jobs).where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId)));
  return job ? candidateAnalysesForVehicle(shopId, job.vehicleId) : [];
}

/** Every saved analysis of a vehicle's captures, newest first (its test history, before and after). */
export async function candidateAnalysesForVehicle(shopId: string, vehicleId: string) {
  const db = await getDb();
  return db
    .select({ id: analyses.id, createdAt: analyses.createdAt, verdict: analyses.verdict, crankingRpm: analyses.crankingRpm, result: analyses.result, fileName: captures.fileName, repairOrder: jobs.repairOrder, jobId: jobs.id })
    .from(analyses)
    .innerJoin(captures, eq(analyses.captureId, captures.id))
    .innerJoin(jobs, eq(captures.jobId, jobs.id))
    .where(and(eq(analyses.shopId, shopId), eq(jobs.vehicleId, vehicleId)))
    .orderBy(desc(analyses.createdAt));
}
