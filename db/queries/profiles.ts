/** The shop's own engine profiles, beside the built-in library. Every function takes the shop id. */
import 'server-only';
import { asc, eq } from 'drizzle-orm';
import { getDb } from '../client';
import type { EngineSpec } from '@/domain/engine';
import { engineProfiles } from '../schema';

export async function listProfiles(shopId: string) {
  const db = await getDb();
  return db.select().from(engineProfiles).where(eq(engineProfiles.shopId, shopId)).orderBy(asc(engineProfiles.label));
}

export async function createProfile(shopId: string, label: string, engine: EngineSpec) {
  const db = await getDb();
  const [row] = await db.insert(engineProfiles).values({ shopId, label, engine }).returning();
  return row;
}
