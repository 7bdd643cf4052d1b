/** Vehicles of one shop. Every function takes the shop id it is scoped to. */
import 'server-only';
import { and, desc, eq } from 'drizzle-orm';
import { getDb } from '../client';
import { engineSpec } from '@/domain/engine';
import { jobs, vehicles } from '../schema';
import type { VehicleValues } from '@/domain/vehicle';

export async function listVehicles(shopId: string) {
  const db = await getDb();
  return db.select().from(vehicles).where(eq(vehicles.shopId, shopId)).orderBy(desc(vehicles.updatedAt));
}

export async function getVehicle(shopId: string, vehicleId: string) {
  const db = await getDb();
  const [v] = await db.select().from(vehicles).where(and(eq(vehicles.shopId, shopId), eq(vehicles.id, vehicleId)));
  return v ?? null;
}

export async function createVehicle(shopId: string, v: VehicleValues) {
  const db = await getDb();
  const [row] = await db
    .insert(vehicles)
    .values({ shopId, vin: v.vin ?? null, year: v.year ?? null, make: v.make, model: v.model, engine: engineSpec(v.engine) })
    .returning();
  return row;
}

/** The vehicle's jobs, newest first, for its history. */
export async function vehicleJobs(shopId: string, vehicleId: string) {
  const db = await getDb();
  return db.select().from(jobs).where(and(eq(jobs.shopId, shopId), eq(jobs.vehicleId, vehicleId))).orderBy(desc(jobs.createdAt));
}
