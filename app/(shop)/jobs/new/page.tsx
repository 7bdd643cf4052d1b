import type { Metadata } from 'next';
import { Notice } from '@/components/ui/field';
import { pageMember } from '@/server/page-context';
import { ENGINE_PROFILES, profileEngine } from '@/signal';
import { NewJobForm } from './_components/new-job-form';

export const metadata: Metadata = { title: 'New job' };

export default async function NewJobPage() {
  const m = await pageMember('/jobs/new');
  if (!m.can({ job: ['create'] })) {
    return <Notice tone="error">Your role ({m.member.role}) can read jobs but not create them; ask a technician or the shop owner.</Notice>;
  }
  const profiles = ENGINE_PROFILES.map((p) => {
    const e = profileEngine(p);
    return { key: p.key, label: p.label, cylinders: e.cylinders, layout: e.layout, numbering: e.numbering, firingOrder: e.firingOrder.join('-') };
  });
  return (
    <div className="flex max-w-3xl flex-col gap-4">
      <h1 className="text-2xl font-bold">New job</h1>
      <NewJobForm profiles={profiles} />
    </div>
  );
}
