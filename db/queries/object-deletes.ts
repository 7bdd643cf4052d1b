/**
 * Objects to remove from object storage once their rows are gone. The rows' transaction queues the addresses;
 * after it commits they are removed, and whatever storage did not remove (it was down, say) stays queued and is
 * retried at start and every few minutes. A removal therefore never fails after its rows are gone, and no object
 * is forgotten.
 */
import 'server-only';
import { inArray, sql } from 'drizzle-orm';
import { getDb } from '../client';
import type { Db } from '../db-type';
import { deleteObjects } from '../object-store';
import { pendingObjectDeletes } from '../schema';

/** Queues the addresses in the caller's transaction (the one that removes their rows). */
export async function queueObjectDeletes(tx: Pick<Db, 'insert'>, urls: string[]): Promise<void> {
  if (urls.length === 0) return;
  await tx.insert(pendingObjectDeletes).values(urls.map((url) => ({ url }))).onConflictDoNothing();
}

/** Removes queued objects (these `urls`, or up to 1000 of the oldest): removed ones leave the queue, failures stay with their reason. */
export async function flushObjectDeletes(urls?: string[]): Promise<{ removed: number; left: number }> {
  if (urls?.length === 0) return { removed: 0, left: 0 };
  const db = await getDb();
  const rows = urls
    ? await db.select({ url: pendingObjectDeletes.url }).from(pendingObjectDeletes).where(inArray(pendingObjectDeletes.url, urls))
    : await db.select({ url: pendingObjectDeletes.url }).from(pendingObjectDeletes).orderBy(pendingObjectDeletes.createdAt).limit(1000);
  const batch = rows.map((r) => r.url);
  if (batch.length === 0) return { removed: 0, left: 0 };
  try {
    await deleteObjects(batch);
  } catch (e) {
    const reason = (e instanceof Error ? e.message : String(e)).split('\n')[0].slice(0, 300);
    await db
      .update(pendingObjectDeletes)
      .set({ attempts: sql`${pendingObjectDeletes.attempts} + 1`, lastError: reason, triedAt: new Date() })
      .where(inArray(pendingObjectDeletes.url, batch));
    return { removed: 0, left: batch.length };
  }
  await db.delete(pendingObjectDeletes).where(inArray(pendingObjectDeletes.url, batch));
  return { removed: batch.length, left: 0 };
}

/** Removes objects no row names any more: queued first, so one that storage does not remove now is retried later. */
export async function removeObjectsNowOrLater(urls: string[]): Promise<{ removed: number; left: number }> {
  await queueObjectDeletes(await getDb(), urls);
  return flushObjectDeletes(urls);
}

/** How many objects wait to be removed (for db:check and the health of storage). */
export async function pendingObjectDeleteCount(): Promise<number> {
  const db = await getDb();
  const [row] = await db.select({ n: sql<number>`count(*)::int` }).from(pendingObjectDeletes);
  return row?.n ?? 0;
}
