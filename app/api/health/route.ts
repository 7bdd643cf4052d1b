/**
 * For a load balancer or a monitor: 200 with the kind of database when it answers a query, 503 while the
 * server stops or when the database does not answer. With object storage configured, `storage` says whether the
 * bucket answers a cheap listing within 2 s ('ok') or not ('degraded'); the app still serves jobs and reports
 * then, so the answer stays 200. No session, nothing about any shop.
 */
import { sql } from 'drizzle-orm';
import { getDatabase } from '@/db/client';
import { shuttingDown } from '@/server/lifecycle.mjs';
import { captureStoreTarget, storageAnswers } from '@/db/object-store';

export const dynamic = 'force-dynamic';

/** A storage check is reused for this long, so a busy monitor does not become load on the bucket. */
const STORAGE_CHECK_MS = 10_000;
let lastStorage: { at: number; state: Promise<'ok' | 'degraded'> } | null = null;

function storageState(target: { bucket: string; prefix: string }): Promise<'ok' | 'degraded'> {
  if (!lastStorage || Date.now() - lastStorage.at > STORAGE_CHECK_MS) {
    lastStorage = { at: Date.now(), state: storageAnswers(target).then((answers) => (answers ? 'ok' : 'degraded')) };
  }
  return lastStorage.state;
}

export async function GET(): Promise<Response> {
  if (shuttingDown()) return Response.json({ ok: false, reason: 'stopping' }, { status: 503 });
  const target = captureStoreTarget();
  const storage = target ? storageState(target) : null;
  try {
    const d = await getDatabase();
    await d.db.execute(sql`select 1`);
    const database = d.kind === 'postgres' ? 'postgresql' : 'embedded';
    return Response.json(storage ? { ok: true, database, storage: await storage } : { ok: true, database });
  } catch {
    return Response.json({ ok: false, reason: 'database' }, { status: 503 });
  }
}
