/** Contracts of the shop routes: settings, removal, export, retention, members, invitations, and the user's shops (server/api/contract.ts). */
import { z } from 'zod';
import { removeShopInput, shopSettingsSchema } from '@/domain/shop-settings';
import { retentionInput } from '@/domain/retention';
import { route } from '../contract';
import { createShopInput, idParam, inviteInput, memberRoleInput } from '../inputs';
import { ROLE_NAMES } from '@/server/permissions';
import { id, invitation, member, memberRow, ok, shop } from '../shapes';

export const getShop = route({
  method: 'GET',
  path: '/api/shop',
  summary: 'The member’s shop: settings, members, pending invitations (owners).',
  access: { permission: { shop: ['read'] } },
  output: z.looseObject({ shop: shop.extend({ settings: shopSettingsSchema }), role: z.enum(ROLE_NAMES), members: z.array(memberRow), invitations: z.array(invitation) }),
});

export const updateShop = route({
  method: 'PATCH',
  path: '/api/shop',
  summary: 'Sets the shop’s time zone, units, phone, address and starting-system limits.',
  access: { permission: { shop: ['manage'] } },
  body: shopSettingsSchema,
  output: z.object({ settings: shopSettingsSchema }),
  errors: [413, 415],
});

export const removeShop = route({
  method: 'DELETE',
  path: '/api/shop',
  summary:
    'Removes the shop and everything in it (jobs, captures with their objects, reports, members, settings, activity) when confirmName is the shop’s name. Recorded outside the shop.',
  access: { permission: { organization: ['delete'] } },
  body: removeShopInput,
  output: z.object({ removed: z.object({ jobs: z.number().int(), captures: z.number().int(), objectsLeft: z.number().int() }) }),
  errors: [413, 415],
});

export const exportShop = route({
  method: 'GET',
  path: '/api/shop/export',
  summary: 'Everything the shop holds as one zip: shop.json, jobs.json, each capture as uploaded and each signed report’s PDF. Audited.',
  access: { permission: { shop: ['manage'] } },
  output: 'application/zip',
});

export const setRetention = route({
  method: 'PATCH',
  path: '/api/shop/retention',
  summary:
    'Sets how many days (30 to 3650) the captures and analyses of a done job are kept, or null to keep them for ever. A daily sweep removes older ones; signed reports and the activity stay. Audited.',
  access: { permission: { shop: ['retention'] } },
  body: retentionInput,
  output: z.object({ retentionDays: z.number().int().nullable() }),
  errors: [413, 415],
});

const memberId = idParam('memberId');

export const changeMember = route({
  method: 'PATCH',
  path: '/api/shop/members/{memberId}',
  summary: 'Changes a member’s role (the last owner stays owner).',
  access: { permission: { member: ['update'] } },
  params: memberId,
  body: memberRoleInput,
  output: z.object({ member }),
  errors: [409, 413, 415],
});

export const removeMember = route({
  method: 'DELETE',
  path: '/api/shop/members/{memberId}',
  summary: 'Removes a member (not the last owner).',
  access: { permission: { member: ['delete'] } },
  params: memberId,
  output: ok,
  errors: [409],
});

export const invite = route({
  method: 'POST',
  path: '/api/shop/invitations',
  summary: 'Invites someone by e-mail with a role.',
  access: { permission: { invitation: ['create'] } },
  body: inviteInput,
  output: z.object({ invitation: z.object({ id, email: z.string(), role: z.string() }) }),
  errors: [409, 413, 415],
});

export const cancelInvitation = route({
  method: 'DELETE',
  path: '/api/shop/invitations/{invitationId}',
  summary: 'Cancels a pending invitation.',
  access: { permission: { invitation: ['cancel'] } },
  params: idParam('invitationId'),
  output: ok,
});

export const listShops = route({
  method: 'GET',
  path: '/api/shops',
  summary: 'The shops the signed-in user belongs to, with their role.',
  access: 'signed-in',
  output: z.object({ shops: z.array(shop.extend({ role: z.string() })) }),
});

export const createShop = route({
  method: 'POST',
  path: '/api/shops',
  summary: 'Creates a shop; the user becomes its owner.',
  access: 'signed-in',
  body: createShopInput,
  output: z.object({ shop }),
  errors: [413, 415],
});
