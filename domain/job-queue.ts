/**
 * What a job needs from each role, so each sees that first: the technician, captures not analysed yet; the
 * advisor, a signed report not yet sent or shared and a customer's answer in; the owner, all of them.
 */
import type { JobStatus } from './job';

export interface JobWork {
  status: JobStatus | string;
  /** Captures with no saved analysis. */
  unanalysed: number;
  /** Whether a revision of the job's report is signed. */
  signedReport: boolean;
}

const TECHNICIAN = ['owner', 'technician'];
const ADVISOR = ['owner', 'advisor'];

/** The sentence saying what the job needs from `role`, or null when it needs nothing from them now. */
export function jobNeeds(job: JobWork, role: string): string | null {
  if (TECHNICIAN.includes(role) && job.unanalysed > 0 && job.status !== 'done') {
    return job.unanalysed === 1 ? '1 capture not analysed yet' : `${job.unanalysed} captures not analysed yet`;
  }
  if (ADVISOR.includes(role)) {
    if (job.status === 'open' && job.signedReport) return 'Signed report ready to send';
    if (job.status === 'approved') return 'Customer approved: book the work';
    if (job.status === 'declined') return 'Customer declined: follow up or close';
  }
  return null;
}
