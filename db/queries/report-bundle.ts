/**
 * A report revision's bundle: everything its PDF and customer page show, from the rows as they stand, and the
 * snapshot a revision keeps from its signing. Used by the report queries and by the demo seed (which signs its
 * history inside the seeding transaction).
 */
import { and, eq, inArray } from 'drizzle-orm';
import type { ShopSettings } from '@/domain/shop-settings';
import type { Db } from '../db-type';
import { analyses, captures, jobs, organizations, reports, users, vehicles } from '../schema';
import { writeSnapshot } from './report-snapshot';

/** A database or a transaction: anything that selects. */
export type Executor = Pick<Db, 'select'>;
export type ReportRow = typeof reports.$inferSelect;

/** The bundle from the rows as they stand. */
export async function liveBundle(db: Executor, shopId: string, report: ReportRow) {
  const [row] = await db
    .select({ shop: organizations, job: jobs, vehicle: vehicles })
    .from(jobs)
    .innerJoin(vehicles, eq(jobs.vehicleId, vehicles.id))
    .innerJoin(organizations, eq(jobs.shopId, organizations.id))
    .where(and(eq(jobs.shopId, shopId), eq(jobs.id, report.jobId)));
  const content = report.content;
  const included = content.analysisIds.length
    ? await db
        .select({ analysis: analyses, capture: captures, jobRepairOrder: jobs.repairOrder })
        .from(analyses)
        .innerJoin(captures, eq(analyses.captureId, captures.id))
        .innerJoin(jobs, eq(captures.jobId, jobs.id))
        .where(and(eq(analyses.shopId, shopId), inArray(analyses.id, content.analysisIds)))
    : [];
  const ordered = content.analysisIds.map((id) => included.find((i) => i.analysis.id === id)).filter((x): x is (typeof included)[number] => !!x);
  const [signer] = report.signedBy ? await db.select({ name: users.name, email: users.email }).from(users).where(eq(users.id, report.signedBy)) : [];
  return { report, content, shop: row.shop, job: row.job, vehicle: row.vehicle, analyses: ordered, signerName: signer?.name ?? null, signerEmail: signer?.email ?? null };
}

/** The snapshot of a revision being signed (its row already marked signed), with the bundle it was written from. */
export async function signedSnapshot(db: Executor, shopId: string, signedRow: ReportRow, shopSettings: ShopSettings) {
  const bundle = await liveBundle(db, shopId, signedRow);
  return { bundle, ...writeSnapshot({ ...bundle, report: { ...signedRow, snapshot: null, snapshotSha256: null }, shopSettings }) };
}
