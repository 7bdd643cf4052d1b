/** The shop's vehicles: list and create. */
import { recordAudit } from '@/db/queries/audit';
import { createVehicle, listVehicles } from '@/db/queries/vehicles';
import { withShop } from '@/server/with-shop';
import * as api from '@/server/api/routes/catalog';

export const GET = withShop(api.listVehicles, async ({ shop }) => ({ vehicles: await listVehicles(shop.id) }));

export const POST = withShop(api.addVehicle, async ({ input, shop, user }) => {
  const vehicle = await createVehicle(shop.id, input);
  await recordAudit(shop.id, user.id, 'vehicle.create', { type: 'vehicle', id: vehicle.id });
  return { vehicle };
});
