import { formatWhen } from '@/domain/time';
import type { Metadata } from 'next';
import { JobBreadcrumb } from '@/components/ui/job-breadcrumb';
import { notFound } from 'next/navigation';
import { Suspense } from 'react';
import { Workspace } from '@/components/analysis/workspace';
import { getCapture, listAnalyses } from '@/db/queries/captures';
import { getJob } from '@/db/queries/jobs';
import { listProfiles } from '@/db/queries/profiles';
import { type AnalysisSettingsValues, analysisSettingsSchema, settingsForEngine } from '@/domain/analysis-settings';
import { pageMember } from '@/server/page-context';
import { ENGINE_PROFILES, profileEngine } from '@/signal/engine/profiles';

export const metadata: Metadata = { title: 'Analysis' };

export default async function CapturePage({ params }: { params: Promise<{ jobId: string; captureId: string }> }) {
  const { jobId, captureId } = await params;
  const m = await pageMember(`/jobs/${jobId}/captures/${captureId}`);
  const [job, capture] = await Promise.all([getJob(m.shop.id, jobId), getCapture(m.shop.id, captureId)]);
  if (!job || !capture || capture.jobId !== job.id) notFound();
  const history = await listAnalyses(m.shop.id, capture.id);
  const fromVehicle = settingsForEngine(job.vehicle.engine);
  const saved = history[0] ? analysisSettingsSchema.safeParse(history[0].settings) : null;
  const initial = saved?.success ? saved.data : fromVehicle;
  const own = await listProfiles(m.shop.id);
  const profiles = [
    ...own.map((p) => ({ key: `shop-${p.id}`, label: `${p.label} (shop)`, engine: { ...p.engine, numbering: p.engine.numbering ?? 'along-crank' } })),
    ...ENGINE_PROFILES.map((p) => ({ key: p.key, label: p.label, engine: profileEngine(p) })),
  ] as { key: string; label: string; engine: AnalysisSettingsValues['engine'] }[];
  return (
    <div className="flex flex-col gap-4">
      <JobBreadcrumb jobId={job.id} repairOrder={job.repairOrder}>
        <span className="figures">{capture.fileName}</span>
      </JobBreadcrumb>
      <h1 className="text-2xl font-bold">
        {[job.vehicle.year, job.vehicle.make, job.vehicle.model].filter(Boolean).join(' ')} — <span className="figures">{capture.fileName}</span>
      </h1>
      <Suspense>
        <Workspace captureId={capture.id} rawUrl={`/api/captures/${capture.id}/raw`} initialSettings={initial} profiles={profiles} userId={m.user.id} canSave={m.can({ analysis: ['save'] })} />
      </Suspense>
      <section aria-labelledby="history" className="rounded-2xl border border-line bg-surface p-4">
        <h2 id="history" className="text-lg font-bold">
          Saved analyses of this capture
        </h2>
        {history.length === 0 ? (
          <p className="text-muted">None yet. Each save adds one; none is overwritten.</p>
        ) : (
          <ul className="mt-2 flex flex-col divide-y divide-line">
            {history.map((a) => (
              <li key={a.id} className="figures py-2 text-sm">
                {formatWhen(a.createdAt, m.shop.settings.timeZone)} · verdict {a.verdict} · {a.crankingRpm?.toFixed(0)} rpm · engine {a.engineVersion} · file {a.fileSha256.slice(0, 12)}…
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
