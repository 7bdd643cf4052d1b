import type { Metadata } from 'next';
import { JobBreadcrumb } from '@/components/ui/job-breadcrumb';
import { notFound } from 'next/navigation';
import { getJob } from '@/db/queries/jobs';
import { pageMember } from '@/server/page-context';
import { ReportEditor } from './report-editor';

export const metadata: Metadata = { title: 'Report' };

export default async function ReportPage({ params }: { params: Promise<{ jobId: string }> }) {
  const { jobId } = await params;
  const m = await pageMember(`/jobs/${jobId}/report`);
  const job = await getJob(m.shop.id, jobId);
  if (!job) notFound();
  return (
    <div className="flex flex-col gap-4">
      <JobBreadcrumb jobId={job.id} repairOrder={job.repairOrder}>
        Report
      </JobBreadcrumb>
      <h1 className="text-2xl font-bold">Report for {job.repairOrder}</h1>
      <ReportEditor
        jobId={job.id}
        defaultName={m.user.name}
        can={{ edit: m.can({ report: ['edit'] }), sign: m.can({ report: ['sign'] }), send: m.can({ report: ['send'] }), share: m.can({ report: ['share'] }) }}
      />
    </div>
  );
}
