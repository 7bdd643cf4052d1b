/** The technician signs the open draft; a signed revision is frozen. */
import { recordAudit } from '@/db/queries/audit';
import { getReport, ReportStateError, signReport } from '@/db/queries/reports';
import { conflict, notFound } from '@/server/http';
import { withShop } from '@/server/with-shop';
import * as api from '@/server/api/routes/jobs';

export const POST = withShop(api.signReport, async ({ input, shop, user }) => {
  const r = await getReport(shop.id, input.reportId);
  if (!r || r.jobId !== input.jobId) throw notFound('That report');
  try {
    const signed = await signReport(shop.id, r.id, user.id, input.version);
    if (!signed) throw notFound('That report');
    await recordAudit(shop.id, user.id, 'report.sign', { type: 'report', id: r.id }, { jobId: r.jobId, revision: r.revision });
    return { report: signed };
  } catch (e) {
    if (e instanceof ReportStateError) throw conflict(e.message);
    throw e;
  }
});
