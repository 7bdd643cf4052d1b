/** Owners cancel a pending invitation. */
import { recordAudit } from '@/db/queries/audit';
import { getInvitation } from '@/db/queries/shops';
import { getAuth } from '@/server/auth';
import { notFound } from '@/server/http';
import { withShop } from '@/server/with-shop';
import * as api from '@/server/api/routes/shop';

export const DELETE = withShop(api.cancelInvitation, async ({ input, shop, user, req }) => {
  const inv = await getInvitation(shop.id, input.invitationId);
  if (!inv) throw notFound('That invitation');
  const auth = await getAuth();
  await auth.api.cancelInvitation({ body: { invitationId: inv.id }, headers: req.headers });
  await recordAudit(shop.id, user.id, 'invitation.cancel', { type: 'invitation', id: inv.id });
  return { ok: true };
});
