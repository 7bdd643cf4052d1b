/**
 * Owners set how long the captures and analyses of done jobs are kept (domain/retention.ts); the daily sweep
 * (db/queries/retention.ts) removes what is older. Audited.
 */
import { recordAudit } from '@/db/queries/audit';
import { setRetention } from '@/db/queries/retention';
import { withShop } from '@/server/with-shop';
import * as api from '@/server/api/routes/shop';

export const PATCH = withShop(api.setRetention, async ({ input, shop, user }) => {
  await setRetention(shop.id, input.retentionDays);
  await recordAudit(shop.id, user.id, 'shop.retention', { type: 'shop', id: shop.id }, { days: input.retentionDays });
  return { retentionDays: input.retentionDays };
});
