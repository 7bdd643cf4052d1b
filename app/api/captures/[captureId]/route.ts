/** One capture's metadata and its analysis history. */
import { getCapture, listAnalyses } from '@/db/queries/captures';
import { notFound } from '@/server/http';
import { withShop } from '@/server/with-shop';
import * as api from '@/server/api/routes/captures';

export const GET = withShop(api.getCapture, async ({ input, shop }) => {
  const capture = await getCapture(shop.id, input.captureId);
  if (!capture) throw notFound('That capture');
  return { capture, analyses: await listAnalyses(shop.id, capture.id) };
});
