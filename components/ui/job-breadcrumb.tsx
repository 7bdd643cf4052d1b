/** "RO-1234 / where you are", linking back to the job. */
import Link from 'next/link';

export function JobBreadcrumb({ jobId, repairOrder, children }: { jobId: string; repairOrder: string; children: React.ReactNode }) {
  return (
    <nav aria-label="Breadcrumb" className="text-sm">
      <Link className="font-bold text-brand underline" href={`/jobs/${jobId}`}>
        {repairOrder}
      </Link>{' '}
      / {children}
    </nav>
  );
}
