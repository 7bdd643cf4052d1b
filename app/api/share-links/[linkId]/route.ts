/** Revokes a customer share link at once. */
import { recordAudit } from '@/db/queries/audit';
import { revokeShareLink } from '@/db/queries/reports';
import { notFound } from '@/server/http';
import { withShop } from '@/server/with-shop';
import * as api from '@/server/api/routes/reports';

export const DELETE = withShop(api.withdrawShareLink, async ({ input, shop, user }) => {
  const link = await revokeShareLink(shop.id, input.linkId);
  if (!link) throw notFound('That share link');
  await recordAudit(shop.id, user.id, 'report.unshare', { type: 'share-link', id: link.id }, { reportId: link.reportId });
  return { ok: true };
});
