/** One report revision as a PDF. */
import { z } from 'zod';
import { reportBundle } from '@/db/queries/reports';
import { dispositionFor } from '@/server/file-name';
import { notFound } from '@/server/http';
import { pdfDataFor, renderReportPdf } from '@/server/pdf/build-report';
import { withShop } from '@/server/with-shop';

export const GET = withShop({ report: ['read'] }, z.object({ reportId: z.string() }), async ({ input, shop }) => {
  const b = await reportBundle(shop.id, input.reportId);
  if (!b) throw notFound('That report');
  const pdf = await renderReportPdf(await pdfDataFor(b));
  return new Response(new Uint8Array(pdf), {
    headers: {
      'content-type': 'application/pdf',
      'content-disposition': dispositionFor(`${b.job.repairOrder}-rev${b.report.revision}.pdf`, 'inline'),
      'cache-control': 'private, no-store',
    },
  });
});
