/** The capture's raw file as uploaded (decompressed), for the browser's worker and for integrations. */
import { z } from 'zod';
import { getCapture, readCaptureBytes } from '@/db/queries/captures';
import { dispositionFor } from '@/server/file-name';
import { notFound } from '@/server/http';
import { withShop } from '@/server/with-shop';

export const GET = withShop({ capture: ['read'] }, z.object({ captureId: z.string() }), async ({ input, shop }) => {
  const capture = await getCapture(shop.id, input.captureId);
  const bytes = capture && (await readCaptureBytes(shop.id, capture.id));
  if (!capture || !bytes) throw notFound('That capture');
  return new Response(bytes as unknown as BodyInit, {
    headers: {
      'content-type': 'text/plain; charset=utf-8',
      'content-length': String(bytes.length),
      'content-disposition': dispositionFor(capture.fileName),
      'x-content-sha256': capture.sha256,
      'cache-control': 'private, no-store',
    },
  });
});
