/** A shop's members and invitations. Every function takes the shop id it is scoped to. */
import 'server-only';
import { and, asc, eq } from 'drizzle-orm';
import { getDb } from '../client';
import { type ShopSettings, shopSettingsFrom } from '@/domain/shop-settings';
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

export async function countOwners(shopId: string): Promise<number> {
  const db = await getDb();
  const rows = await db.select({ id: members.id }).from(members).where(and(eq(members.organizationId, shopId), eq(members.role, 'owner')));
  return rows.length;
}

export async function setMemberRole(shopId: string, memberId: string, role: string) {
  const db = await getDb();
  const [m] = await db.update(members).set({ role }).where(and(eq(members.organizationId, shopId), eq(members.id, memberId))).returning();
  return m ?? null;
}

export async function removeMember(shopId: string, memberId: string) {
  const db = await getDb();
  const [m] = await db.delete(members).where(and(eq(members.organizationId, shopId), eq(members.id, memberId))).returning();
  return m ?? null;
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

/** Sets the shop's time zone and temperature unit (one row per shop, created on first save). */
export async function saveShopSettings(shopId: string, settings: ShopSettings) {
  const db = await getDb();
  await db
    .insert(shopSettings)
    .values({ shopId, ...settings })
    .onConflictDoUpdate({ target: shopSettings.shopId, set: { ...settings, updatedAt: new Date() } });
}

/** The shop's settings, or the defaults when its owner has not chosen any. */
export async function getShopSettings(shopId: string): Promise<ShopSettings> {
  const db = await getDb();
  const [row] = await db.select({ timeZone: shopSettings.timeZone, temperatureUnit: shopSettings.temperatureUnit }).from(shopSettings).where(eq(shopSettings.shopId, shopId));
  return shopSettingsFrom(row);
}
