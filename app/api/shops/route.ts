/** Create a shop (the signed-in user becomes its owner; its dates start in the creator's time zone) and list the user's shops. */
import { eq } from 'drizzle-orm';
import { getDb } from '@/db/client';
import { recordAudit } from '@/db/queries/audit';
import { saveShopSettings } from '@/db/queries/shops';
import { DEFAULT_SHOP_SETTINGS } from '@/domain/shop-settings';
import { members, organizations } from '@/db/schema';
import { getAuth } from '@/server/auth';
import { announceMembershipChange } from '@/server/membership-cache';
import { withSession } from '@/server/with-shop';
import * as api from '@/server/api/routes/shop';

export const POST = withSession(
  api.createShop, async ({ input, req, user }) => {
    const auth = await getAuth();
    const slug = `${input.name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 40) || 'shop'}-${crypto.randomUUID().slice(0, 8)}`;
    const shop = await auth.api.createOrganization({ body: { name: input.name, slug }, headers: req.headers });
    if (!shop) throw new Error('Shop not created');
    await auth.api.setActiveOrganization({ body: { organizationId: shop.id }, headers: req.headers });
    if (input.timeZone) await saveShopSettings(shop.id, { ...DEFAULT_SHOP_SETTINGS, timeZone: input.timeZone });
    await announceMembershipChange();
    await recordAudit(shop.id, user.id, 'shop.create', { type: 'shop', id: shop.id });
    return { shop: { id: shop.id, name: shop.name } };
  },
);

export const GET = withSession(api.listShops, async ({ user }) => {
  const db = await getDb();
  const rows = await db
    .select({ id: organizations.id, name: organizations.name, role: members.role })
    .from(members)
    .innerJoin(organizations, eq(members.organizationId, organizations.id))
    .where(eq(members.userId, user.id));
  return { shops: rows };
});
