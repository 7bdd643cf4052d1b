/**
 * The database a data-layer test runs on, with the demo shop seeded: the embedded one in `dataDir`, or, in the
 * PostgreSQL pass, the database tests/support/pg-database.ts set up. Returns it with the demo shop and a user.
 */
import { type Db, getDb } from '@/db/client';
import { organizations, users } from '@/db/schema';
import { seedDemoIfEmpty } from '@/db/seed';

export async function seededDemo(dataDir: string): Promise<{ db: Db; shopId: string; userId: string }> {
  if (!process.env.DATABASE_URL) process.env.CRANKPRINT_DATA_DIR = dataDir;
  const db = await getDb();
  await seedDemoIfEmpty(db);
  const [{ id: shopId }] = await db.select({ id: organizations.id }).from(organizations).limit(1);
  const [{ id: userId }] = await db.select({ id: users.id }).from(users).limit(1);
  return { db, shopId, userId };
}
