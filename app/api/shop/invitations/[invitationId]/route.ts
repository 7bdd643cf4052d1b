/** Owners cancel a pending invitation. */
import { z } from 'zod';
import { recordAudit } from '@/db/queries/audit';
import { getInvitation } from '@/db/queries/shops';
import { getAuth } from '@/server/auth';
import { notFound } from '@/server/http';
import { withShop } from '@/server/with-shop';

export const DELETE = withShop({ invitation: ['cancel'] }, z.object({ invitationId: z.string() }), async ({ input, shop, user, req }) => {
  const inv = await getInvitation(shop.id, input.invitationId);
  if (!inv) throw notFound('That invitation');
  const auth = await getAuth();
  await auth.api.cancelInvitation({ body: { invitationId: inv.id }, headers: req.headers });
  await recordAudit(shop.id, user.id, 'invitation.cancel', { type: 'invitation', id: inv.id });
  return { ok: true };
});
