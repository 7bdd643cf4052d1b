/** The member's shop: name, settings, members and pending invitations; owners change the settings. */
import { z } from 'zod';
import { recordAudit } from '@/db/queries/audit';
import { listInvitations, listMembers, saveShopSettings } from '@/db/queries/shops';
import { shopSettingsSchema } from '@/domain/shop-settings';
import { forgetMemberships } from '@/server/membership-cache';
import { withShop } from '@/server/with-shop';

export const GET = withShop({ shop: ['read'] }, z.object({}), async ({ shop, member }) => ({
  shop,
  role: member.role,
  members: await listMembers(shop.id),
  invitations: member.role === 'owner' ? await listInvitations(shop.id) : [],
}));

export const PATCH = withShop({ shop: ['manage'] }, shopSettingsSchema, async ({ input, shop, user }) => {
  await saveShopSettings(shop.id, input);
  forgetMemberships();
  await recordAudit(shop.id, user.id, 'shop.settings', { type: 'shop', id: shop.id }, { ...input });
  return { settings: input };
});
