import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { listAudit } from '@/db/queries/audit';
import { getJob } from '@/db/queries/jobs';
import { pageMember } from '@/server/page-context';

export const metadata: Metadata = { title: 'Job' };

const STATUS_LABEL: Record<string, string> = { open: 'Open', waiting: 'Waiting on customer', done: 'Done' };

export default async function JobPage({ params }: { params: Promise<{ jobId: string }> }) {
  const { jobId } = await params;
  const m = await pageMember(`/jobs/${jobId}`);
  const job = await getJob(m.shop.id, jobId);
  if (!job) notFound();
  const activity = (await listAudit(m.shop.id, 200)).filter((a) => a.subjectId === job.id).slice(0, 20);
  const v = job.vehicle;
  const e = v.engine;
  return (
    <div className="flex flex-col gap-6">
      <header className="rounded-2xl border border-line bg-surface p-5">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h1 className="text-2xl font-bold">
            <span className="figures">{job.repairOrder}</span> · {[v.year, v.make, v.model].filter(Boolean).join(' ')}
          </h1>
          <span className="rounded-md bg-raised px-2 py-1 font-bold">{STATUS_LABEL[job.status] ?? job.status}</span>
        </div>
        <dl className="mt-3 grid gap-3 sm:grid-cols-4">
          <div>
            <dt className="text-sm text-muted">VIN</dt>
            <dd className="figures font-bold">{v.vin ?? 'not recorded'}</dd>
          </div>
          <div>
            <dt className="text-sm text-muted">Odometer</dt>
            <dd className="figures font-bold">{job.odometer !== null ? `${job.odometer.toLocaleString()} ${job.odometerUnit}` : 'not recorded'}</dd>
          </div>
          <div>
            <dt className="text-sm text-muted">Engine</dt>
            <dd className="font-bold">
              {e.cylinders} cyl {e.layout === 'v' ? 'V' : e.layout}, firing <span className="figures">{e.firingOrder.join('-')}</span>
              {e.displacementL ? <span className="figures"> · {e.displacementL} L</span> : null}
            </dd>
          </div>
          <div>
            <dt className="text-sm text-muted">Vehicle history</dt>
            <dd>
              <Link className="font-bold text-brand underline" href={`/vehicles/${v.id}`}>
                All tests on this vehicle
              </Link>
            </dd>
          </div>
        </dl>
        <p className="mt-3">
          <span className="text-sm text-muted">Customer concern: </span>
          {job.concern}
        </p>
      </header>
      <section aria-labelledby="captures" className="rounded-2xl border border-line bg-surface p-5">
        <h2 id="captures" className="text-lg font-bold">
          Captures
        </h2>
        <p className="text-muted">No capture on this job yet. Uploads arrive with the capture workflow.</p>
      </section>
      <section aria-labelledby="activity" className="rounded-2xl border border-line bg-surface p-5">
        <h2 id="activity" className="text-lg font-bold">
          Activity
        </h2>
        {activity.length === 0 ? (
          <p className="text-muted">Nothing recorded yet.</p>
        ) : (
          <ul className="mt-2 flex flex-col gap-1">
            {activity.map((a) => (
              <li key={a.id} className="figures text-sm">
                {a.createdAt.toLocaleString()} — {a.action}
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
