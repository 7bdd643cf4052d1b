/** The words for a job's status, in lists and on the job page. */
export const JOB_STATUS_LABEL: Record<string, string> = { open: 'Open', waiting: 'Waiting on customer', done: 'Done' };
