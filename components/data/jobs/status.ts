/** The words for a job's status, in lists and on the job page. */
import type { JobStatus } from '@/domain/job';

export const JOB_STATUS_LABEL: Record<JobStatus, string> = { open: 'Open', waiting: 'Waiting on customer', approved: 'Customer approved', declined: 'Customer declined', done: 'Done' };
