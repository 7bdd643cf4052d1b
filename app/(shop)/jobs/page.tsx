import type { Metadata } from 'next';
import Link from 'next/link';
import { Suspense } from 'react';
import { buttonClass } from '@/components/ui/button';
import { pageMember } from '@/server/page-context';
import { JobsTable } from './_components/jobs-table';

export const metadata: Metadata = { title: 'Jobs' };

export default async function JobsPage() {
  const m = await pageMember('/jobs');
  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h1 className="text-2xl font-bold">Jobs</h1>
        {m.can({ job: ['create'] }) && (
          <Link href="/jobs/new" className={buttonClass('primary')}>
            New job
          </Link>
        )}
      </div>
      <Suspense>
        <JobsTable role={m.member.role} />
      </Suspense>
    </div>
  );
}
