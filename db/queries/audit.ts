/** Audit events: who did what to which record in which shop. */
import 'server-only';
import { and, count, desc, eq, gte, inArray, isNull, or } from 'drizzle-orm';
import { getDb } from '../client';
import { auditEvents, members, users } from '../schema';

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

/**
 * The shop's activity for its owner, newest first, with who did it: the shop's own events and the sign-ins of
 * its current members (a sign-in belongs to no shop).
 */
export async function listShopActivity(shopId: string, limit = 100) {
  const db = await getDb();
  const memberIds = db.select({ id: members.userId }).from(members).where(eq(members.organizationId, shopId));
  return db
    .select({
      id: auditEvents.id,
      action: auditEvents.action,
      subjectType: auditEvents.subjectType,
      subjectId: auditEvents.subjectId,
      detail: auditEvents.detail,
      createdAt: auditEvents.createdAt,
      actorName: users.name,
    })
    .from(auditEvents)
    .leftJoin(users, eq(auditEvents.actorId, users.id))
    .where(or(eq(auditEvents.shopId, shopId), and(isNull(auditEvents.shopId), eq(auditEvents.action, 'auth.sign-in'), inArray(auditEvents.actorId, memberIds))))
    .orderBy(desc(auditEvents.createdAt))
    .limit(limit);
}

/** How many times `action` was recorded in the shop (and by `actorId`, when given) since `since`. */
export async function countRecentActions(shopId: string, action: string, since: Date, actorId?: string): Promise<number> {
  const db = await getDb();
  const [row] = await db
    .select({ n: count() })
    .from(auditEvents)
    .where(and(eq(auditEvents.shopId, shopId), eq(auditEvents.action, action), gte(auditEvents.createdAt, since), actorId ? eq(auditEvents.actorId, actorId) : undefined));
  return row?.n ?? 0;
}
