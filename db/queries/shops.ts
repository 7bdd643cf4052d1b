/** A shop's members and invitations. Every function takes the shop id it is scoped to. */
import 'server-only';
import { and, asc, eq } from 'drizzle-orm';
import { getDb } from '../client';
import { type ShopSettings, type ShopSettingsInput, shopSettingsFrom } from '@/domain/shop-settings';
import { invitations, members, shopSettings, users } from '../schema';

export async function listMembers(shopId: string) {
  const db = await getDb();
  return db
    .select({ id: members.id, role: members.role, createdAt: members.createdAt, userId: users.id, name: users.name, email: users.email })
    .from(members)
    .innerJoin(users, eq(members.userId, users.id))
    .where(eq(members.organizationId, shopId))
    .orderBy(asc(members.createdAt));
}

export async function getMember(shopId: string, memberId: string) {
  const db = await getDb();
  const [m] = await db.select().from(members).where(and(eq(members.organizationId, shopId), eq(members.id, memberId)));
  return m ?? null;
}

/**
 * Changes a member's role, or removes them, keeping "every shop has at least one owner" true under concurrency:
 * the shop's member rows are locked, the owners counted and the change made in one transaction, so two owners
 * demoting each other at once through two instances cannot both succeed. Null when there is no such member;
 * `lastOwner` when the change would leave the shop without one.
 */
export async function changeMember(shopId: string, memberId: string, change: { role: string } | 'remove') {
  const db = await getDb();
  return db.transaction(async (tx) => {
    const all = await tx.select().from(members).where(eq(members.organizationId, shopId)).for('update');
    const m = all.find((x) => x.id === memberId);
    if (!m) return null;
    const owners = all.filter((x) => x.role === 'owner').length;
    const losesOwner = m.role === 'owner' && (change === 'remove' || change.role !== 'owner');
    if (losesOwner && owners <= 1) return { lastOwner: true as const, member: m, updated: null };
    if (change === 'remove') {
      await tx.delete(members).where(and(eq(members.organizationId, shopId), eq(members.id, m.id)));
      return { lastOwner: false as const, member: m, updated: null };
    }
    const [updated] = await tx.update(members).set({ role: change.role }).where(and(eq(members.organizationId, shopId), eq(members.id, m.id))).returning();
    return { lastOwner: false as const, member: m, updated };
  });
}

export async function listInvitations(shopId: string) {
  const db = await getDb();
  return db
    .select({ id: invitations.id, email: invitations.email, role: invitations.role, status: invitations.status, expiresAt: invitations.expiresAt })
    .from(invitations)
    .where(and(eq(invitations.organizationId, shopId), eq(invitations.status, 'pending')))
    .orderBy(asc(invitations.createdAt));
}

export async function getInvitation(shopId: string, invitationId: string) {
  const db = await getDb();
  const [i] = await db.select().from(invitations).where(and(eq(invitations.organizationId, shopId), eq(invitations.id, invitationId)));
  return i ?? null;
}

/** Sets the shop's settings and contact details (one row per shop, created on first save). */
export async function saveShopSettings(shopId: string, settings: ShopSettingsInput) {
  const db = await getDb();
  await db
    .insert(shopSettings)
    .values({ shopId, ...settings })
    .onConflictDoUpdate({ target: shopSettings.shopId, set: { ...settings, updatedAt: new Date() } });
}

/** The shop's settings, or the defaults when its owner has not chosen any. */
export async function getShopSettings(shopId: string): Promise<ShopSettings> {
  const db = await getDb();
  const [row] = await db.select().from(shopSettings).where(eq(shopSettings.shopId, shopId));
  return shopSettingsFrom(row);
}
