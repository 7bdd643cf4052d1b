/**
 * Objects under the capture prefix that no capture row references: left by an instance killed between writing a
 * capture's object and its row. Only objects older than a minimum age count (an upload under way writes its
 * object before its row). Objects already queued for removal are not orphans: the sweep removes them.
 * Removing orphans writes one activity line per shop whose folder held them (the key is prefix/shop/capture).
 */
import { isNotNull } from 'drizzle-orm';
import type { Db } from './db-type';
import { deleteObjects, listObjects } from './object-store';
import { auditEvents, captures, organizations, pendingObjectDeletes } from './schema';

export interface Orphan {
  url: string;
  size: number;
  lastModified: Date;
}

export const ORPHAN_MIN_AGE_MS = 60 * 60_000;

export async function findOrphans(db: Db, target: { bucket: string; prefix: string }, minAgeMs = ORPHAN_MIN_AGE_MS, now = Date.now()): Promise<Orphan[]> {
  const referenced = new Set<string>();
  for (const r of await db.select({ url: captures.storageUrl }).from(captures).where(isNotNull(captures.storageUrl))) referenced.add(r.url!);
  for (const r of await db.select({ url: pendingObjectDeletes.url }).from(pendingObjectDeletes)) referenced.add(r.url);
  const out: Orphan[] = [];
  for await (const o of listObjects(target)) {
    if (!referenced.has(o.url) && now - o.lastModified.getTime() >= minAgeMs) out.push(o);
  }
  return out;
}

/** The shop id in an object's key (prefix/shop/capture.txt), if the key has that shape. */
function shopOf(url: string, prefix: string): string | null {
  const key = url.replace(/^s3:\/\/[^/]+\//, '');
  const rest = key.startsWith(prefix) ? key.slice(prefix.length) : key;
  const parts = rest.split('/');
  return parts.length === 2 ? parts[0] : null;
}

/** Removes the orphans and records it: one activity line per shop (none for a folder of no shop here). */
export async function removeOrphans(db: Db, target: { bucket: string; prefix: string }, orphans: Orphan[]): Promise<void> {
  if (!orphans.length) return;
  await deleteObjects(orphans.map((o) => o.url));
  const shops = new Set((await db.select({ id: organizations.id }).from(organizations)).map((r) => r.id));
  const byShop = new Map<string | null, Orphan[]>();
  for (const o of orphans) {
    const shop = shopOf(o.url, target.prefix);
    const key = shop && shops.has(shop) ? shop : null;
    const list = byShop.get(key);
    if (list) list.push(o);
    else byShop.set(key, [o]);
  }
  for (const [shopId, list] of byShop) {
    await db.insert(auditEvents).values({
      shopId,
      actorId: null,
      action: 'storage.remove-orphans',
      detail: { count: list.length, bytes: list.reduce((n, o) => n + o.size, 0), objects: list.slice(0, 100).map((o) => o.url) },
    });
  }
}
