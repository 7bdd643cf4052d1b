/** One report revision as a PDF. */
import { reportBundle } from '@/db/queries/reports';
import { dispositionFor } from '@/server/file-name';
import { notFound } from '@/server/http';
import { renderPdf } from '@/server/engine/pool';
import { pdfDataFor } from '@/server/pdf/build-report';
import { withShop } from '@/server/with-shop';
import * as api from '@/server/api/routes/reports';

export const GET = withShop(api.reportPdf, async ({ input, shop, req }) => {
  const b = await reportBundle(shop.id, input.reportId);
  if (!b) throw notFound('That report');
  const pdf = await renderPdf(await pdfDataFor(b), req.signal);
  return new Response(new Uint8Array(pdf), {
    headers: {
      'content-type': 'application/pdf',
      'content-disposition': dispositionFor(`${b.job.repairOrder}-rev${b.report.revision}.pdf`, 'inline'),
      'cache-control': 'private, no-store',
    },
  });
});
