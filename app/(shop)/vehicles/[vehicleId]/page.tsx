import { formatDay, formatWhen } from '@/domain/time';
import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { CylinderBars } from '@/components/analysis/cylinder-bars';
import { candidateAnalysesForVehicle } from '@/db/queries/reports';
import { getVehicle, vehicleJobs } from '@/db/queries/vehicles';
import { pageMember } from '@/server/page-context';
import { compareResults } from '@/signal';
import { vehicleTitle } from '@/domain/vehicle';

export const metadata: Metadata = { title: 'Vehicle' };

export default async function VehiclePage({ params, searchParams }: { params: Promise<{ vehicleId: string }>; searchParams: Promise<{ a?: string; b?: string }> }) {
  const { vehicleId } = await params;
  const pick = await searchParams;
  const m = await pageMember(`/vehicles/${vehicleId}`);
  const v = await getVehicle(m.shop.id, vehicleId);
  if (!v) notFound();
  const [jobs, tests] = await Promise.all([vehicleJobs(m.shop.id, v.id), candidateAnalysesForVehicle(m.shop.id, v.id)]);
  // Before and after: the chosen pair, else the two newest saved analyses (older on the left).
  const byId = new Map(tests.map((t) => [t.id, t]));
  const after = (pick.b && byId.get(pick.b)) || tests[0];
  const before = (pick.a && byId.get(pick.a)) || tests.find((t) => t.id !== after?.id);
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-bold">{vehicleTitle(v)}</h1>
      <p className="figures">{v.vin ?? 'No VIN recorded'}</p>
      {before && after && (
        <section aria-labelledby="compare" className="rounded-2xl border border-line bg-surface p-4" data-testid="before-after">
          <h2 id="compare" className="text-lg font-bold">
            Before and after
          </h2>
          <div className="grid gap-4 md:grid-cols-2">
            {[before, after].map((t, i) => {
              const r = t.result;
              return (
                <figure key={t.id}>
                  <figcaption className="font-bold">
                    {i === 0 ? 'Before' : 'After'}: <span className="figures">{t.repairOrder}</span> · {formatDay(t.createdAt, m.shop.settings.timeZone)} · {t.fileName}
                  </figcaption>
                  <CylinderBars cylinders={r.cylinders} lowLimit={r.settings.lowLimitPercent} highLimit={r.settings.highLimitPercent} />
                </figure>
              );
            })}
          </div>
          <ul className="mt-3 flex flex-col gap-1" data-testid="changes">
            {compareResults(before.result, after.result).map((c) => (
              <li key={c.cylinder} className={c.change === 'none' || c.change === 'unknown' ? 'text-muted' : 'font-bold'}>
                {c.sentence}
              </li>
            ))}
          </ul>
        </section>
      )}
      <section aria-labelledby="tests" className="rounded-2xl border border-line bg-surface p-4">
        <h2 id="tests" className="text-lg font-bold">
          Tests on this vehicle
        </h2>
        {tests.length === 0 ? (
          <p className="text-muted">No saved analysis yet.</p>
        ) : (
          <ul className="flex flex-col divide-y divide-line">
            {tests.map((t) => (
              <li key={t.id} className="flex flex-wrap items-center gap-3 py-2">
                <span className="figures flex-1">
                  {t.repairOrder} · {t.fileName} · {formatWhen(t.createdAt, m.shop.settings.timeZone)} · {t.verdict}
                </span>
                {t.id === after?.id ? (
                  <span className="text-sm text-muted">{tests.length > 1 ? 'shown as “after”' : 'the only test so far: a test after the repair can be compared with it'}</span>
                ) : (
                  <Link className="font-bold text-brand underline" href={`/vehicles/${v.id}?a=${t.id}&b=${after?.id ?? ''}`}>
                    Use as “before”
                  </Link>
                )}
              </li>
            ))}
          </ul>
        )}
      </section>
      <section aria-labelledby="jobs" className="rounded-2xl border border-line bg-surface p-4">
        <h2 id="jobs" className="text-lg font-bold">
          Jobs on this vehicle
        </h2>
        <ul className="flex flex-col gap-2">
          {jobs.map((j) => (
            <li key={j.id}>
              <Link className="figures font-bold text-brand underline" href={`/jobs/${j.id}`}>
                {j.repairOrder}
              </Link>{' '}
              — <span className="whitespace-pre-line">{j.concern}</span>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
