/** The member's shop: name, members and pending invitations. */
import { z } from 'zod';
import { listInvitations, listMembers } from '@/db/queries/shops';
import { withShop } from '@/server/with-shop';

export const GET = withShop({ shop: ['read'] }, z.object({}), async ({ shop, member }) => ({
  shop,
  role: member.role,
  members: await listMembers(shop.id),
  invitations: member.role === 'owner' ? await listInvitations(shop.id) : [],
}));
