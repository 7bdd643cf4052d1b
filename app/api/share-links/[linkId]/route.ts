/** Revokes a customer share link at once. */
import { z } from 'zod';
import { recordAudit } from '@/db/queries/audit';
import { revokeShareLink } from '@/db/queries/reports';
import { notFound } from '@/server/http';
import { withShop } from '@/server/with-shop';

export const DELETE = withShop({ report: ['share'] }, z.object({ linkId: z.string() }), async ({ input, shop, user }) => {
  const link = await revokeShareLink(shop.id, input.linkId);
  if (!link) throw notFound('That share link');
  await recordAudit(shop.id, user.id, 'report.unshare', { type: 'share-link', id: link.id }, { reportId: link.reportId });
  return { ok: true };
});
