/** Audit events: who did what to which record in which shop. */
import 'server-only';
import { and, count, desc, eq, gte, inArray, isNull, or, sql } from 'drizzle-orm';
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

/**
 * Reserves one `action` against an hourly budget per member and per shop, atomically: a transaction-scoped
 * advisory lock on the shop and action serialises every instance's check-and-record, so concurrent requests
 * cannot all pass a count taken before any of them was recorded. Returns the recorded event's id, or which
 * budget is spent. A reservation whose work then fails is given back with `releaseAction`.
 */
export async function reserveAction(
  shopId: string,
  actorId: string,
  action: string,
  limits: { perMember: number; perShop: number; sinceMs: number },
  subject: { type: string; id: string },
  detail: Record<string, unknown>,
): Promise<{ id: string } | { spent: 'member' | 'shop' }> {
  const db = await getDb();
  const since = new Date(Date.now() - limits.sinceMs);
  return db.transaction(async (tx) => {
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`${shopId}:${action}`}))`);
    const counted = async (who?: string) => {
      const [row] = await tx
        .select({ n: count() })
        .from(auditEvents)
        .where(and(eq(auditEvents.shopId, shopId), eq(auditEvents.action, action), gte(auditEvents.createdAt, since), who ? eq(auditEvents.actorId, who) : undefined));
      return row?.n ?? 0;
    };
    if ((await counted(actorId)) >= limits.perMember) return { spent: 'member' as const };
    if ((await counted()) >= limits.perShop) return { spent: 'shop' as const };
    const [e] = await tx.insert(auditEvents).values({ shopId, actorId, action, subjectType: subject.type, subjectId: subject.id, detail }).returning({ id: auditEvents.id });
    return { id: e.id };
  });
}

/** Gives back a reservation whose work failed (the e-mail was not sent). */
export async function releaseAction(shopId: string, eventId: string): Promise<void> {
  const db = await getDb();
  await db.delete(auditEvents).where(and(eq(auditEvents.shopId, shopId), eq(auditEvents.id, eventId)));
}

/** The audit action that records a member reading a job's safety cautions. */
export const CAUTIONS_READ = 'job.cautions-read';

/** When this member read the cautions for this job (on any device), or null if they have not. */
export async function cautionsReadAt(shopId: string, userId: string, jobId: string): Promise<Date | null> {
  const db = await getDb();
  const [row] = await db
    .select({ at: auditEvents.createdAt })
    .from(auditEvents)
    .where(and(eq(auditEvents.shopId, shopId), eq(auditEvents.subjectId, jobId), eq(auditEvents.action, CAUTIONS_READ), eq(auditEvents.actorId, userId)))
    .orderBy(auditEvents.createdAt)
    .limit(1);
  return row?.at ?? null;
}
