/** One vehicle of the shop with its jobs; another shop's vehicle is a 404. */
import { getVehicle, vehicleJobs } from '@/db/queries/vehicles';
import { notFound } from '@/server/http';
import { withShop } from '@/server/with-shop';
import * as api from '@/server/api/routes/catalog';

export const GET = withShop(api.getVehicle, async ({ input, shop }) => {
  const vehicle = await getVehicle(shop.id, input.vehicleId);
  if (!vehicle) throw notFound('That vehicle');
  return { vehicle, jobs: await vehicleJobs(shop.id, vehicle.id) };
});
