/**
 * For a load balancer or a monitor: 200 with the kind of database when it answers a query, 503 while the
 * server stops or when the database does not answer. No session, nothing about any shop.
 */
import { sql } from 'drizzle-orm';
import { getDatabase, shuttingDown } from '@/db/client';

export const dynamic = 'force-dynamic';

export async function GET(): Promise<Response> {
  if (shuttingDown()) return Response.json({ ok: false, reason: 'stopping' }, { status: 503 });
  try {
    const d = await getDatabase();
    await d.db.execute(sql`select 1`);
    return Response.json({ ok: true, database: d.kind === 'postgres' ? 'postgresql' : 'embedded' });
  } catch {
    return Response.json({ ok: false, reason: 'database' }, { status: 503 });
  }
}
