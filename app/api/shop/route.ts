/** The member's shop: name, settings, members and pending invitations; owners change the settings, or remove the shop by typing its name. */
import { recordAudit } from '@/db/queries/audit';
import { removeShop } from '@/db/queries/shop-data';
import { HttpError, notFound } from '@/server/http';
import { listInvitations, listMembers, saveShopSettings } from '@/db/queries/shops';
import { announceMembershipChange } from '@/server/membership-cache';
import { withShop } from '@/server/with-shop';
import * as api from '@/server/api/routes/shop';

export const GET = withShop(api.getShop, async ({ shop, member }) => ({
  shop,
  role: member.role,
  members: await listMembers(shop.id),
  invitations: member.role === 'owner' ? await listInvitations(shop.id) : [],
}));

export const PATCH = withShop(api.updateShop, async ({ input, shop, user }) => {
  await saveShopSettings(shop.id, input);
  await announceMembershipChange();
  await recordAudit(shop.id, user.id, 'shop.settings', { type: 'shop', id: shop.id }, { ...input });
  return { settings: input };
});

export const DELETE = withShop(api.removeShop, async ({ input, shop, user }) => {
  const r = await removeShop(shop.id, user.id, input.confirmName);
  if (!r) throw notFound('That shop');
  if ('wrongName' in r) {
    throw new HttpError(400, 'VALIDATION', `Type the shop’s name exactly as it is shown (“${r.wrongName}”) to remove it; nothing was removed.`, { confirmName: 'Type the shop’s name to remove it.' });
  }
  await announceMembershipChange();
  return { removed: r.removed };
});
