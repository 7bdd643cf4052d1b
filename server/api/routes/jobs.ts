/** Contracts of the job routes: jobs, a job's status and cautions, its captures and its report (server/api/contract.ts). */
import { z } from 'zod';
import { JOB_STATUSES, jobSchema, jobStatusInput, jobUpdateSchema, listQuerySchema } from '@/domain/job';
import { screeningSchema } from '@/domain/screening';
import { route } from '../contract';
import { idParam, saveReportInput, signReportInput } from '../inputs';
import { approval, candidate, capture, job, jobRow, report, shareLink, vehicle, when } from '../shapes';
import { MAX_CAPTURE_SIZE } from '@/signal';

const jobId = idParam('jobId');

export const listJobs = route({
  method: 'GET',
  path: '/api/jobs',
  summary: 'The shop’s jobs, newest first (search and status filter).',
  access: { permission: { job: ['read'] } },
  query: listQuerySchema,
  output: z.object({ jobs: z.array(jobRow) }),
});

export const createJob = route({
  method: 'POST',
  path: '/api/jobs',
  summary: 'Opens a job for a repair order, with an existing or a new vehicle.',
  access: { permission: { job: ['create'] } },
  body: jobSchema,
  output: z.object({ job }),
  errors: [409, 413, 415],
});

export const getJob = route({
  method: 'GET',
  path: '/api/jobs/{jobId}',
  summary: 'One job with its vehicle.',
  access: { permission: { job: ['read'] } },
  params: jobId,
  output: z.object({ job: job.extend({ vehicle }) }),
});

export const updateJob = route({
  method: 'PATCH',
  path: '/api/jobs/{jobId}',
  summary: 'Changes a job’s status, concern or odometer.',
  access: { permission: { job: ['update'] } },
  params: jobId,
  body: jobUpdateSchema,
  output: z.object({ job }),
  errors: [413, 415],
});

export const removeJob = route({
  method: 'DELETE',
  path: '/api/jobs/{jobId}',
  summary: 'Removes the job with its captures (and their files in object storage), analyses, report and share links. Audited.',
  access: { permission: { job: ['delete'] } },
  params: jobId,
  output: z.object({ removed: z.object({ jobId: z.string(), captures: z.number().int() }) }),
});

export const moveJob = route({
  method: 'POST',
  path: '/api/jobs/{jobId}/status',
  summary:
    'Closes the job (done, with a reason) or reopens it. Sending or sharing a signed report moves an open job to waiting; the customer’s answer to approved or declined. Every move is an activity line.',
  access: { permission: { job: ['status'] } },
  params: jobId,
  body: jobStatusInput,
  output: z.object({ job: z.object({ id: z.string(), status: z.enum(JOB_STATUSES) }) }),
  errors: [409, 413, 415],
});

export const readCautions = route({
  method: 'POST',
  path: '/api/jobs/{jobId}/cautions',
  summary: 'Records that the member has read the job’s safety cautions (once per member and job, in the activity), so no other device asks again.',
  access: { permission: { job: ['read'] } },
  params: jobId,
  output: z.object({ cautions: z.object({ jobId: z.string(), readAt: z.string() }) }),
});

export const listCaptures = route({
  method: 'GET',
  path: '/api/jobs/{jobId}/captures',
  summary: 'The job’s captures.',
  access: { permission: { capture: ['read'] } },
  params: jobId,
  output: z.object({ captures: z.array(capture) }),
});

export const uploadCapture = route({
  method: 'POST',
  path: '/api/jobs/{jobId}/captures',
  summary: `Uploads a capture: the body is the CSV/TSV text itself (up to ${MAX_CAPTURE_SIZE}), its name in X-File-Name (percent-encoded UTF-8). Screened by the engine before anything is stored.`,
  access: { permission: { capture: ['upload'] } },
  params: jobId,
  upload: z.string().meta({ description: 'The capture file (Content-Type text/csv or text/tab-separated-values).' }),
  output: z.object({ capture, screening: screeningSchema.meta({ description: 'The engine’s reading with the job’s engine and default settings, made while screening (not saved).' }) }),
  errors: [409, 413, 415, 422, 503],
});

export const getReport = route({
  method: 'GET',
  path: '/api/jobs/{jobId}/report',
  summary: 'The job’s report: every revision (newest first), the analyses it may include, the customer’s answers and the share links.',
  access: { permission: { report: ['read'] } },
  params: jobId,
  output: z.object({
    revisions: z.array(report),
    candidates: z.array(candidate),
    approvals: z.array(approval),
    shareLinks: z.array(shareLink.extend({ revision: z.number().int(), revokedAt: when.nullable() })),
  }),
});

export const saveReport = route({
  method: 'PUT',
  path: '/api/jobs/{jobId}/report',
  summary: 'Edits the draft (a signed report starts a new revision); with `base`, a revision saved or signed since it was loaded answers 409.',
  access: { permission: { report: ['edit'] } },
  params: jobId,
  body: saveReportInput,
  output: z.object({ report }),
  errors: [409, 413, 415],
});

export const signReport = route({
  method: 'POST',
  path: '/api/jobs/{jobId}/report/sign',
  summary: 'Signs the draft as the signed-in member; with `version`, a draft saved since it was loaded answers 409.',
  access: { permission: { report: ['sign'] } },
  params: jobId,
  body: signReportInput,
  output: z.object({ report }),
  errors: [409, 413, 415],
});
