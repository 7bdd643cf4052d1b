/** Query keys for a job's report. */
export const reportKeys = {
  all: ['reports'] as const,
  forJob: (jobId: string) => ['reports', 'job', jobId] as const,
};
