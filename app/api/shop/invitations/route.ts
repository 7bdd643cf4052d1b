/** Owners invite by e-mail with a role; better-auth stores the invitation and sends the link. */
import { recordAudit } from '@/db/queries/audit';
import { getAuth } from '@/server/auth';
import { HttpError } from '@/server/http';
import { withShop } from '@/server/with-shop';
import * as api from '@/server/api/routes/shop';

export const POST = withShop(
  api.invite, async ({ input, shop, user, req }) => {
    const auth = await getAuth();
    try {
      const inv = await auth.api.createInvitation({ body: { email: input.email, role: input.role, organizationId: shop.id, resend: true }, headers: req.headers });
      await recordAudit(shop.id, user.id, 'invitation.create', { type: 'invitation', id: inv.id }, { email: input.email, role: input.role });
      return { invitation: { id: inv.id, email: inv.email, role: inv.role } };
    } catch (e) {
      const message = (e as { body?: { message?: string } }).body?.message;
      if (message && /already a member/i.test(message)) throw new HttpError(409, 'CONFLICT', `${input.email} is already a member of this shop.`);
      throw e;
    }
  },
);
