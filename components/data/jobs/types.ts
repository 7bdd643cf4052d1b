import type { OutputOf } from '@/server/api/contract';
import type { listJobs } from '@/server/api/routes/jobs';

/** A job row as the jobs route returns it (its contract's output). */
export type JobRow = OutputOf<typeof listJobs>['jobs'][number];
