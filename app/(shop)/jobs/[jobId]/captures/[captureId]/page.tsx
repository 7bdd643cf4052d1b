import { formatWhen } from '@/domain/time';
import type { Metadata } from 'next';
import { JobBreadcrumb } from '@/components/ui/job-breadcrumb';
import { notFound } from 'next/navigation';
import { Suspense } from 'react';
import Link from 'next/link';
import { settingsDifferences } from '@/components/analysis/settings-differences';
import { Workspace } from '@/components/analysis/workspace';
import { shopBaseline } from '@/db/queries/baselines';
import { getCapture, listAnalyses } from '@/db/queries/captures';
import { getJob } from '@/db/queries/jobs';
import { cautionsReadAt } from '@/db/queries/audit';
import { listProfiles } from '@/db/queries/profiles';
import { type AnalysisSettingsValues, analysisSettingsSchema, settingsForEngine } from '@/domain/analysis-settings';
import { pageMember } from '@/server/page-context';
import { ENGINE_PROFILES, profileEngine } from '@/signal';
import { vehicleTitle } from '@/domain/vehicle';

export const metadata: Metadata = { title: 'Analysis' };

export default async function CapturePage({ params, searchParams }: { params: Promise<{ jobId: string; captureId: string }>; searchParams: Promise<{ a?: string }> }) {
  const { jobId, captureId } = await params;
  const { a: openedId } = await searchParams;
  const m = await pageMember(`/jobs/${jobId}/captures/${captureId}`);
  const [job, capture, cautionsRead] = await Promise.all([getJob(m.shop.id, jobId), getCapture(m.shop.id, captureId), cautionsReadAt(m.shop.id, m.user.id, jobId)]);
  if (!job || !capture || capture.jobId !== job.id) notFound();
  const history = await listAnalyses(m.shop.id, capture.id);
  const fromVehicle = settingsForEngine(job.vehicle.engine, m.shop.settings.startingLimits);
  // A saved analysis opened from the list (?a=…) starts from its settings; otherwise the latest save's, or the job's engine.
  const opened = history.find((h) => h.id === openedId) ?? null;
  const settingsOf = (h: (typeof history)[number] | undefined) => {
    const parsed = h ? analysisSettingsSchema.safeParse(h.settings) : null;
    return parsed?.success ? parsed.data : null;
  };
  const openedSettings = opened ? settingsOf(opened) : null;
  const initial = (opened ? openedSettings : settingsOf(history[0])) ?? fromVehicle;
  const savedAs = opened && openedSettings ? { when: formatWhen(opened.createdAt, m.shop.settings.timeZone), settings: openedSettings } : undefined;
  const own = await listProfiles(m.shop.id);
  const baseline = await shopBaseline(m.shop.id, job.vehicle.engine);
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
        {vehicleTitle(job.vehicle)} — <span className="figures">{capture.fileName}</span>
      </h1>
      <Suspense>
        <Workspace
          captureId={capture.id}
          rawUrl={`/api/captures/${capture.id}/raw`}
          initialSettings={initial}
          jobSettings={fromVehicle}
          savedAs={savedAs}
          baseline={baseline}
          profiles={profiles}
          cautionsRead={cautionsRead !== null}
          jobId={job.id}
          canSave={m.can({ analysis: ['save'] })}
        />
      </Suspense>
      <section aria-labelledby="history" className="rounded-2xl border border-line bg-surface p-4">
        <h2 id="history" className="text-lg font-bold">
          Saved analyses of this capture
        </h2>
        {history.length === 0 ? (
          <p className="text-muted">None yet. Each save adds one; none is overwritten.</p>
        ) : (
          <ul className="mt-2 flex flex-col divide-y divide-line">
            {history.map((a) => {
              const s = settingsOf(a);
              const differs = s ? settingsDifferences(s, fromVehicle) : [];
              return (
                <li key={a.id} className="flex flex-wrap items-baseline justify-between gap-2 py-2 text-sm">
                  <span>
                    <span className="figures">{formatWhen(a.createdAt, m.shop.settings.timeZone)}</span> · verdict {a.verdict} · <span className="figures">{a.crankingRpm?.toFixed(0)} rpm</span> ·{' '}
                    {differs.length ? `settings: ${differs.join(', ')}` : 'the job’s engine and default limits'} · analysis version <span className="figures">{a.engineVersion}</span>
                  </span>
                  {s && (
                    <Link className="font-bold underline" href={`/jobs/${job.id}/captures/${capture.id}?a=${a.id}&s=${encodeURIComponent(JSON.stringify(s))}`} data-testid="open-saved">
                      Open with its settings
                    </Link>
                  )}
                </li>
              );
            })}
          </ul>
        )}
      </section>
    </div>
  );
}
