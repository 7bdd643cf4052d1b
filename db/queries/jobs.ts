/** Jobs (repair orders) of one shop. Every function takes the shop id it is scoped to. */
import 'server-only';
import { and, desc, eq, ilike, or, type SQL } from 'drizzle-orm';
import { getDb } from '../client';
import { deleteObjects } from '../object-store';
import { captures, jobs, vehicles } from '../schema';
import type { JobValues } from '@/domain/job';
import { engineSpec } from './vehicles';

export class DuplicateRepairOrderError extends Error {}

const jobColumns = {
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

export async function listJobs(shopId: string, filter: { q?: string; status?: string } = {}) {
  const db = await getDb();
  const where: SQL[] = [eq(jobs.shopId, shopId)];
  if (filter.status && filter.status !== 'all') where.push(eq(jobs.status, filter.status));
  if (filter.q) {
    const like = `%${filter.q.replace(/[%_\\]/g, (c) => `\\${c}`)}%`;
    where.push(or(ilike(jobs.repairOrder, like), ilike(jobs.concern, like), ilike(vehicles.vin, like))!);
  }
  return db
    .select(jobColumns)
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

export async function updateJob(shopId: string, jobId: string, patch: { status?: string; concern?: string; odometer?: number }) {
  const db = await getDb();
  const [row] = await db
    .update(jobs)
    .set({ ...patch, updatedAt: new Date() })
    .where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId)))
    .returning();
  return row ?? null;
}

/**
 * Removes a job with its captures, analyses, report and share links (the rows cascade), then the captures' objects
 * in object storage. The rows go first: an object left behind by a failed delete costs storage, a row whose
 * object is gone would be a broken capture. Returns the number of captures removed, or null for another shop's job.
 */
export async function deleteJob(shopId: string, jobId: string): Promise<{ captures: number } | null> {
  const db = await getDb();
  const removed = await db.transaction(async (tx) => {
    const [job] = await tx.select({ id: jobs.id }).from(jobs).where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId)));
    if (!job) return null;
    const rows = await tx.select({ storageUrl: captures.storageUrl }).from(captures).where(and(eq(captures.shopId, shopId), eq(captures.jobId, jobId)));
    await tx.delete(jobs).where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId)));
    return rows;
  });
  if (!removed) return null;
  const urls = removed.flatMap((r) => (r.storageUrl ? [r.storageUrl] : []));
  if (urls.length) await deleteObjects(urls);
  return { captures: removed.length };
}
