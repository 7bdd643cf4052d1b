import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { getVehicle, vehicleJobs } from '@/db/queries/vehicles';
import { pageMember } from '@/server/page-context';

export const metadata: Metadata = { title: 'Vehicle' };

export default async function VehiclePage({ params }: { params: Promise<{ vehicleId: string }> }) {
  const { vehicleId } = await params;
  const m = await pageMember(`/vehicles/${vehicleId}`);
  const v = await getVehicle(m.shop.id, vehicleId);
  if (!v) notFound();
  const jobs = await vehicleJobs(m.shop.id, v.id);
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-bold">{[v.year, v.make, v.model].filter(Boolean).join(' ')}</h1>
      <p className="figures">{v.vin ?? 'No VIN recorded'}</p>
      <h2 className="text-lg font-bold">Jobs on this vehicle</h2>
      <ul className="flex flex-col gap-2">
        {jobs.map((j) => (
          <li key={j.id}>
            <Link className="figures font-bold text-brand underline" href={`/jobs/${j.id}`}>
              {j.repairOrder}
            </Link>{' '}
            — {j.concern}
          </li>
        ))}
      </ul>
    </div>
  );
}
