/** Owners download everything the shop holds as one zip (server/shop-export.ts). Audited. */
import { recordAudit } from '@/db/queries/audit';
import { getRetention } from '@/db/queries/retention';
import { listMembers } from '@/db/queries/shops';
import { dispositionFor } from '@/server/file-name';
import { shopExportStream } from '@/server/shop-export';
import { withShop } from '@/server/with-shop';
import * as api from '@/server/api/routes/shop';

export const GET = withShop(api.exportShop, async ({ shop, user, req }) => {
  const members = (await listMembers(shop.id)).map(({ name, email, role, createdAt }) => ({ name, email, role, createdAt }));
  const about = { id: shop.id, name: shop.name, settings: shop.settings, retentionDays: await getRetention(shop.id), members };
  await recordAudit(shop.id, user.id, 'shop.export', { type: 'shop', id: shop.id });
  const day = new Date().toISOString().slice(0, 10);
  return new Response(shopExportStream(shop.id, about, req.signal), {
    headers: {
      'content-type': 'application/zip',
      'content-disposition': dispositionFor(`${shop.name} export ${day}.zip`),
      'cache-control': 'private, no-store',
    },
  });
});
