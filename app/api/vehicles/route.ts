/** The shop's vehicles: list and create. */
import { z } from 'zod';
import { recordAudit } from '@/db/queries/audit';
import { createVehicle, listVehicles } from '@/db/queries/vehicles';
import { vehicleSchema } from '@/domain/vehicle';
import { withShop } from '@/server/with-shop';

export const GET = withShop({ vehicle: ['read'] }, z.object({}), async ({ shop }) => ({ vehicles: await listVehicles(shop.id) }));

export const POST = withShop({ vehicle: ['create'] }, vehicleSchema, async ({ input, shop, user }) => {
  const vehicle = await createVehicle(shop.id, input);
  await recordAudit(shop.id, user.id, 'vehicle.create', { type: 'vehicle', id: vehicle.id });
  return { vehicle };
});
