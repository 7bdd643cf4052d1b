/** Owners change a member's role or remove them; the last owner can be neither demoted nor removed. */
import { memberRoleInput } from '@/server/api/inputs';
import { z } from 'zod';
import { recordAudit } from '@/db/queries/audit';
import { countOwners, getMember, removeMember, setMemberRole } from '@/db/queries/shops';
import { conflict, notFound } from '@/server/http';
import { forgetMemberships } from '@/server/membership-cache';
import { withShop } from '@/server/with-shop';

export const PATCH = withShop(
  { member: ['update'] },
  memberRoleInput.extend({ memberId: z.string() }),
  async ({ input, shop, user }) => {
    const m = await getMember(shop.id, input.memberId);
    if (!m) throw notFound('That member');
    if (m.role === 'owner' && input.role !== 'owner' && (await countOwners(shop.id)) <= 1) {
      throw conflict('This is the shop’s last owner; make another member owner first.');
    }
    const updated = await setMemberRole(shop.id, m.id, input.role);
    forgetMemberships();
    await recordAudit(shop.id, user.id, 'member.role', { type: 'member', id: m.id }, { from: m.role, to: input.role });
    return { member: updated };
  },
);

export const DELETE = withShop({ member: ['delete'] }, z.object({ memberId: z.string() }), async ({ input, shop, user }) => {
  const m = await getMember(shop.id, input.memberId);
  if (!m) throw notFound('That member');
  if (m.role === 'owner' && (await countOwners(shop.id)) <= 1) {
    throw conflict('This is the shop’s last owner and cannot be removed; make another member owner first.');
  }
  await removeMember(shop.id, m.id);
  forgetMemberships();
  await recordAudit(shop.id, user.id, 'member.remove', { type: 'member', id: m.id }, { userId: m.userId, role: m.role });
  return { ok: true };
});
