import { formatWhen } from '@/domain/time';
import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { cautionsReadAt, listShopActivity } from '@/db/queries/audit';
import { ActivityList } from '@/components/activity/activity-list';
import { latestAnalysesForJob, listCaptures } from '@/db/queries/captures';
import { getJob } from '@/db/queries/jobs';
import { listApprovalsForJob, listRevisions, reportsCitingJob } from '@/db/queries/reports';
import { buttonClass } from '@/components/ui/button';
import { JOB_STATUS_LABEL } from '@/components/data/jobs/status';
import type { JobStatus } from '@/domain/job';
import { CaptureUpload } from './_components/capture-upload';
import { MiniBars } from './_components/mini-bars';
import { JobStatusControl } from './_components/job-status';
import { RemoveJob } from './_components/remove-job';
import { pageMember } from '@/server/page-context';
import { engineLine, vehicleTitle } from '@/domain/vehicle';

export const metadata: Metadata = { title: 'Job' };


export default async function JobPage({ params }: { params: Promise<{ jobId: string }> }) {
  const { jobId } = await params;
  const m = await pageMember(`/jobs/${jobId}`);
  const job = await getJob(m.shop.id, jobId);
  if (!job) notFound();
  const [captures, latest, audit, cautionsRead] = await Promise.all([
    listCaptures(m.shop.id, job.id),
    latestAnalysesForJob(m.shop.id, job.id),
    listShopActivity(m.shop.id, 300),
    cautionsReadAt(m.shop.id, m.user.id, job.id),
  ]);
  const captureIds = new Set(captures.map((c) => c.id));
  const activity = audit
    .filter((a) => a.subjectId === job.id || (a.detail as { jobId?: string } | null)?.jobId === job.id || (a.detail as { captureId?: string } | null)?.captureId && captureIds.has((a.detail as { captureId: string }).captureId))
    .slice(0, 20);
  const canUpload = m.can({ capture: ['upload'] });
  const [revisions, approvals, citing] = await Promise.all([listRevisions(m.shop.id, job.id), listApprovalsForJob(m.shop.id, job.id), reportsCitingJob(m.shop.id, job.id)]);
  const v = job.vehicle;
  const e = v.engine;
  return (
    <div className="flex flex-col gap-6">
      <header className="rounded-2xl border border-line bg-surface p-5">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h1 className="text-2xl font-bold">
            <span className="figures">{job.repairOrder}</span> · {vehicleTitle(v)}
          </h1>
          <span className="rounded-md bg-raised px-2 py-1 font-bold">{JOB_STATUS_LABEL[job.status as JobStatus] ?? job.status}</span>
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
            <dd className="font-bold">{engineLine(e)}</dd>
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
        <p className="mt-3 whitespace-pre-line">
          <span className="text-sm text-muted">Customer concern: </span>
          {job.concern}
        </p>
      </header>
      <section aria-labelledby="captures" className="flex flex-col gap-3 rounded-2xl border border-line bg-surface p-5">
        <h2 id="captures" className="text-lg font-bold">
          Captures
        </h2>
        {captures.length === 0 && <p className="text-muted">{canUpload ? 'No capture yet: drop the exported CSV or TSV below.' : 'No capture on this job yet.'}</p>}
        {captures.length > 0 && (
          <ul className="grid gap-3 md:grid-cols-2" data-testid="capture-list">
            {captures.map((c) => {
              const a = latest.get(c.id);
              const r = a?.result;
              return (
                <li key={c.id}>
                  <Link href={`/jobs/${job.id}/captures/${c.id}`} className="flex min-h-touch items-center gap-4 rounded-xl border border-line p-3 hover:border-brand">
                    {r ? <MiniBars cylinders={r.cylinders} label={`Last result: ${r.verdict}`} /> : <span className="text-sm text-muted">uploaded, not analysed yet</span>}
                    <span className="flex-1">
                      <span className="figures block font-bold">{c.fileName}</span>
                      <span className="figures block text-sm text-muted">
                        {(c.sizeBytes / 1024).toFixed(0)} KB · {formatWhen(c.createdAt, m.shop.settings.timeZone)} {r ? `· ${r.verdict}` : ''}
                      </span>
                    </span>
                  </Link>
                </li>
              );
            })}
          </ul>
        )}
        {canUpload ? <CaptureUpload jobId={job.id} engine={job.vehicle.engine} cautionsRead={cautionsRead !== null} /> : <p className="text-sm text-muted">Your role can read captures but not upload them.</p>}
      </section>
      <section aria-labelledby="report" className="flex flex-wrap items-center justify-between gap-3 rounded-2xl border border-line bg-surface p-5">
        <div>
          <h2 id="report" className="text-lg font-bold">
            Report
          </h2>
          <p className="text-muted">
            {revisions[0] ? `Revision ${revisions[0].revision}, ${revisions[0].status === 'signed' ? 'signed' : 'draft'}.` : 'No report yet.'}{' '}
            {approvals[0] ? `Customer ${approvals[0].decision === 'approve' ? 'approved' : 'declined'} (${approvals[0].typedName}, revision ${approvals[0].revision}).` : ''}
          </p>
        </div>
        <Link className={buttonClass('primary')} href={`/jobs/${job.id}/report`}>
          {revisions[0] ? 'Open the report' : m.can({ report: ['edit'] }) ? 'Write the report' : 'Report'}
        </Link>
      </section>
      {m.can({ job: ['status'] }) && (
        <section aria-labelledby="job-status" className="flex flex-col gap-2 rounded-2xl border border-line bg-surface p-5">
          <h2 id="job-status" className="text-lg font-bold">
            Status: {JOB_STATUS_LABEL[job.status as JobStatus] ?? job.status}
          </h2>
          <p className="text-sm text-muted">Sending or sharing a signed report sets it to waiting on the customer, and the customer’s answer to approved or declined.</p>
          <JobStatusControl jobId={job.id} status={job.status} />
        </section>
      )}
      <section aria-labelledby="activity" className="rounded-2xl border border-line bg-surface p-5">
        <h2 id="activity" className="text-lg font-bold">
          Activity
        </h2>
        <ActivityList items={activity} timeZone={m.shop.settings.timeZone} />
      </section>
      {m.can({ job: ['delete'] }) && (
        <section aria-labelledby="remove" className="flex flex-col items-start gap-3 rounded-2xl border border-line bg-surface p-5">
          <h2 id="remove" className="text-lg font-bold">
            Remove
          </h2>
          <RemoveJob jobId={job.id} repairOrder={job.repairOrder} captures={captures.length} citedBy={citing} />
        </section>
      )}
    </div>
  );
}
