/** Jobs (repair orders) of one shop. Every function takes the shop id it is scoped to. */
import 'server-only';
import { and, desc, eq, ilike, or, type SQL, sql } from 'drizzle-orm';
import { getDb } from '../client';
import { analyses, auditEvents, captures, jobs, reports, vehicles } from '../schema';
import type { JobStatus, JobValues } from '@/domain/job';
import { flushObjectDeletes, queueObjectDeletes } from './object-deletes';
import { engineSpec } from '@/domain/engine';

export class DuplicateRepairOrderError extends Error {}

export const jobColumns = {
  id: jobs.id,
  repairOrder: jobs.repairOrder,
  odometer: jobs.odometer,
  odometerUnit: jobs.odometerUnit,
  concern: jobs.concern,
  status: jobs.status,
  createdAt: jobs.createdAt,
  updatedAt: jobs.updatedAt,
  vehicle: {
    id: vehicles.id,
    vin: vehicles.vin,
    year: vehicles.year,
    make: vehicles.make,
    model: vehicles.model,
    engine: vehicles.engine,
  },
};

/** What a job waits on, for the queues each role sees first: captures not analysed, a signed report. */
const workColumns = {
  unanalysed: sql<number>`(select count(*)::int from ${captures} where ${captures.jobId} = ${jobs.id} and not exists (select 1 from ${analyses} where ${analyses.captureId} = ${captures.id}))`.mapWith(Number),
  signedReport: sql<boolean>`exists (select 1 from ${reports} where ${reports.jobId} = ${jobs.id} and ${reports.status} = 'signed')`.mapWith(Boolean),
};

export async function listJobs(shopId: string, filter: { q?: string; status?: string } = {}) {
  const db = await getDb();
  const where: SQL[] = [eq(jobs.shopId, shopId)];
  if (filter.status && filter.status !== 'all') where.push(eq(jobs.status, filter.status));
  if (filter.q) {
    const like = `%${filter.q.replace(/[%_\\]/g, (c) => `\\${c}`)}%`;
    where.push(or(ilike(jobs.repairOrder, like), ilike(jobs.concern, like), ilike(vehicles.vin, like))!);
  }
  return db
    .select({ ...jobColumns, ...workColumns })
    .from(jobs)
    .innerJoin(vehicles, eq(jobs.vehicleId, vehicles.id))
    .where(and(...where))
    .orderBy(desc(jobs.updatedAt))
    .limit(500);
}

export async function getJob(shopId: string, jobId: string) {
  const db = await getDb();
  const [row] = await db
    .select(jobColumns)
    .from(jobs)
    .innerJoin(vehicles, eq(jobs.vehicleId, vehicles.id))
    .where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId)));
  return row ?? null;
}

/** Creates a job, and its vehicle when one is given inline, in one transaction: nothing half-written. */
export async function createJob(shopId: string, userId: string, j: JobValues) {
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [dupe] = await tx.select({ id: jobs.id }).from(jobs).where(and(eq(jobs.shopId, shopId), eq(jobs.repairOrder, j.repairOrder)));
    if (dupe) throw new DuplicateRepairOrderError(`Repair order ${j.repairOrder} already exists in this shop.`);
    let vehicleId = j.vehicleId;
    if (vehicleId) {
      const [v] = await tx.select({ id: vehicles.id }).from(vehicles).where(and(eq(vehicles.shopId, shopId), eq(vehicles.id, vehicleId)));
      if (!v) return null;
    } else {
      const v = j.vehicle!;
      const [row] = await tx
        .insert(vehicles)
        .values({ shopId, vin: v.vin ?? null, year: v.year ?? null, make: v.make, model: v.model, engine: engineSpec(v.engine) })
        .returning({ id: vehicles.id });
      vehicleId = row.id;
    }
    const [job] = await tx
      .insert(jobs)
      .values({ shopId, vehicleId: vehicleId!, repairOrder: j.repairOrder, odometer: j.odometer ?? null, odometerUnit: j.odometerUnit, concern: j.concern, createdBy: userId })
      .returning();
    return job;
  });
}

/** A job moved to done is done from now (the shop's retention counts from here); any other status is not done. */
const doneAtFor = (status: string): Date | null => (status === 'done' ? new Date() : null);

export async function updateJob(shopId: string, jobId: string, patch: { status?: string; concern?: string; odometer?: number }) {
  const db = await getDb();
  const [row] = await db
    .update(jobs)
    .set({ ...patch, updatedAt: new Date(), ...(patch.status ? { doneAt: doneAtFor(patch.status) } : {}) })
    .where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId)))
    .returning();
  return row ?? null;
}

/**
 * Moves a job to `to` when its status is one of `from`, with its activity line in the same transaction (who, or
 * the customer when `actorId` is null; from, to, and the cause or reason). Returns the new status, or null when
 * the job is not the shop's or was not in a status it moves from.
 */
export async function moveJob(shopId: string, jobId: string, to: JobStatus, from: readonly JobStatus[], actorId: string | null, why: { cause?: string; reason?: string } = {}) {
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [job] = await tx.select({ status: jobs.status }).from(jobs).where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId))).for('update');
    if (!job || !from.includes(job.status as JobStatus) || job.status === to) return null;
    await tx.update(jobs).set({ status: to, updatedAt: new Date(), doneAt: doneAtFor(to) }).where(eq(jobs.id, jobId));
    await tx.insert(auditEvents).values({ shopId, actorId, action: 'job.status', subjectType: 'job', subjectId: jobId, detail: { from: job.status, to, ...why } });
    return to;
  });
}

/**
 * Removes a job with its captures, analyses, report and share links, in one transaction with its activity line:
 * the job row is locked, the captures' objects are queued for removal, the rows go (they cascade). Then the
 * objects are removed from object storage; any that storage does not remove now stay queued and are retried
 * (db/queries/object-deletes.ts), so the removal never fails once its rows are gone. A signed report elsewhere
 * that cites these analyses keeps its snapshot. Returns the number of captures removed, or null for another
 * shop's job.
 */
export async function deleteJob(shopId: string, jobId: string, actorId: string | null = null): Promise<{ captures: number; objectsLeft: number } | null> {
  const db = await getDb();
  const removed = await db.transaction(async (tx) => {
    const [job] = await tx.select({ id: jobs.id, repairOrder: jobs.repairOrder }).from(jobs).where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId))).for('update');
    if (!job) return null;
    const rows = await tx.select({ storageUrl: captures.storageUrl }).from(captures).where(and(eq(captures.shopId, shopId), eq(captures.jobId, jobId)));
    const urls = rows.flatMap((r) => (r.storageUrl ? [r.storageUrl] : []));
    await tx.insert(auditEvents).values({ shopId, actorId, action: 'job.delete', subjectType: 'job', subjectId: job.id, detail: { repairOrder: job.repairOrder, captures: rows.length } });
    await queueObjectDeletes(tx, urls);
    await tx.delete(jobs).where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId)));
    return { captures: rows.length, urls };
  });
  if (!removed) return null;
  const { left } = await flushObjectDeletes(removed.urls);
  return { captures: removed.captures, objectsLeft: left };
}
