/** Customer share links for a signed report: random 256-bit tokens, stored hashed, expiring (14 days by default). */
import { recordAudit } from '@/db/queries/audit';
import { moveJob } from '@/db/queries/jobs';
import { createShareLink, getReport, listShareLinks } from '@/db/queries/reports';
import { APP_URL } from '@/server/auth';
import { conflict, notFound } from '@/server/http';
import { withShop } from '@/server/with-shop';
import * as api from '@/server/api/routes/reports';

export const GET = withShop(api.listShareLinks, async ({ input, shop }) => {
  if (!(await getReport(shop.id, input.reportId))) throw notFound('That report');
  return { links: await listShareLinks(shop.id, input.reportId) };
});

export const POST = withShop(
  api.shareReport, async ({ input, shop, user }) => {
    const r = await getReport(shop.id, input.reportId);
    if (!r) throw notFound('That report');
    if (r.status !== 'signed') throw conflict('Sign the report before sharing it with the customer.');
    const { token, link } = await createShareLink(shop.id, r.id, user.id, input.days);
    await recordAudit(shop.id, user.id, 'report.share', { type: 'report', id: r.id }, { jobId: r.jobId, linkId: link.id, expiresAt: link.expiresAt });
    await moveJob(shop.id, r.jobId, 'waiting', ['open'], user.id, { cause: 'customer link made' });
    return { link: { id: link.id, expiresAt: link.expiresAt }, url: `${APP_URL}/r/${token}` };
  },
);
