/** The capture's raw file as uploaded, streamed from where it is stored, for the browser's worker and for integrations. */
import { getCapture, readCaptureStream } from '@/db/queries/captures';
import { dispositionFor } from '@/server/file-name';
import { notFound } from '@/server/http';
import { withShop } from '@/server/with-shop';
import * as api from '@/server/api/routes/captures';

export const GET = withShop(api.downloadCapture, async ({ input, shop, req }) => {
  const capture = await getCapture(shop.id, input.captureId);
  const stream = capture && (await readCaptureStream(shop.id, capture.id, req.signal));
  if (!capture || !stream) throw notFound('That capture');
  return new Response(stream, {
    headers: {
      'content-type': 'text/plain; charset=utf-8',
      'content-length': String(capture.sizeBytes),
      'content-disposition': dispositionFor(capture.fileName),
      'x-content-sha256': capture.sha256,
      'cache-control': 'private, no-store',
    },
  });
});
