import type { Metadata } from 'next';
import Link from 'next/link';
import { listVehicles } from '@/db/queries/vehicles';
import { pageMember } from '@/server/page-context';
import { engineLine, vehicleTitle } from '@/domain/vehicle';

export const metadata: Metadata = { title: 'Vehicles' };

export default async function VehiclesPage() {
  const m = await pageMember('/vehicles');
  const vehicles = await listVehicles(m.shop.id);
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-bold">Vehicles</h1>
      {vehicles.length === 0 ? (
        <p className="text-muted">No vehicles yet: they are added with a new job.</p>
      ) : (
        <div className="overflow-x-auto rounded-xl border border-line bg-surface">
          <table className="w-full text-left">
            <thead className="bg-raised">
              <tr>
                <th scope="col" className="px-3 py-3">Vehicle</th>
                <th scope="col" className="px-3 py-3">VIN</th>
                <th scope="col" className="px-3 py-3">Engine</th>
              </tr>
            </thead>
            <tbody>
              {vehicles.map((v) => (
                <tr key={v.id} className="border-t border-line">
                  <td className="px-3 py-3">
                    <Link className="font-bold text-brand underline" href={`/vehicles/${v.id}`}>
                      {vehicleTitle(v)}
                    </Link>
                  </td>
                  <td className="figures px-3 py-3">{v.vin ?? '—'}</td>
                  <td className="px-3 py-3">{engineLine(v.engine)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
