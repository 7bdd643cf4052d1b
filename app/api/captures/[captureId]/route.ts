/** One capture's metadata and its analysis history. */
import { z } from 'zod';
import { getCapture, listAnalyses } from '@/db/queries/captures';
import { notFound } from '@/server/http';
import { withShop } from '@/server/with-shop';

export const GET = withShop({ capture: ['read'] }, z.object({ captureId: z.string() }), async ({ input, shop }) => {
  const capture = await getCapture(shop.id, input.captureId);
  if (!capture) throw notFound('That capture');
  return { capture, analyses: await listAnalyses(shop.id, capture.id) };
});
