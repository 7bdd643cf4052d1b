/** Owners change a member's role or remove them; the last owner can be neither demoted nor removed, even at once from two instances. */
import { recordAudit } from '@/db/queries/audit';
import { changeMember } from '@/db/queries/shops';
import { conflict, notFound } from '@/server/http';
import { announceMembershipChange } from '@/server/membership-cache';
import { withShop } from '@/server/with-shop';
import * as api from '@/server/api/routes/shop';

export const PATCH = withShop(
  api.changeMember, async ({ input, shop, user }) => {
    const r = await changeMember(shop.id, input.memberId, { role: input.role });
    if (!r) throw notFound('That member');
    if (r.lastOwner) throw conflict('This is the shop’s last owner; make another member owner first.');
    await announceMembershipChange();
    await recordAudit(shop.id, user.id, 'member.role', { type: 'member', id: r.member.id }, { from: r.member.role, to: input.role });
    return { member: r.updated };
  },
);

export const DELETE = withShop(api.removeMember, async ({ input, shop, user }) => {
  const r = await changeMember(shop.id, input.memberId, 'remove');
  if (!r) throw notFound('That member');
  if (r.lastOwner) throw conflict('This is the shop’s last owner and cannot be removed; make another member owner first.');
  await announceMembershipChange();
  await recordAudit(shop.id, user.id, 'member.remove', { type: 'member', id: r.member.id }, { userId: r.member.userId, role: r.member.role });
  return { ok: true };
});
