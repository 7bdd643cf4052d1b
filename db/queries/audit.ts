/** Audit events: who did what to which record in which shop. */
import 'server-only';
import { desc, eq } from 'drizzle-orm';
import { getDb } from '../client';
import { auditEvents } from '../schema';

export async function recordAudit(
  shopId: string | null,
  actorId: string | null,
  action: string,
  subject?: { type: string; id: string },
  detail?: Record<string, unknown>,
): Promise<void> {
  const db = await getDb();
  await db.insert(auditEvents).values({ shopId, actorId, action, subjectType: subject?.type, subjectId: subject?.id, detail });
}

export async function listAudit(shopId: string, limit = 50) {
  const db = await getDb();
  return db.select().from(auditEvents).where(eq(auditEvents.shopId, shopId)).orderBy(desc(auditEvents.createdAt)).limit(limit);
}
