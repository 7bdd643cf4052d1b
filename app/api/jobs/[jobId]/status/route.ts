/**
 * A member closes a job (done, with a reason) or reopens it; sending, sharing and the customer's answer move it
 * on their own (waiting, approved, declined). Every move is one activity line.
 */
import { getJob, moveJob } from '@/db/queries/jobs';
import { JOB_STATUSES } from '@/domain/job';
import { conflict, HttpError, notFound } from '@/server/http';
import { withShop } from '@/server/with-shop';
import * as api from '@/server/api/routes/jobs';

export const POST = withShop(api.moveJob, async ({ input, shop, user }) => {
  const job = await getJob(shop.id, input.jobId);
  if (!job) throw notFound('That job');
  if (input.status === 'done' && (input.reason ?? '').length < 3) {
    throw new HttpError(400, 'VALIDATION', 'Say why the job is done (for example "repaired and retested" or "customer declined the work").', { reason: 'Say why the job is done.' });
  }
  const from = input.status === 'done' ? JOB_STATUSES.filter((s) => s !== 'done') : JOB_STATUSES.filter((s) => s !== 'open');
  const moved = await moveJob(shop.id, job.id, input.status, from, user.id, { reason: input.reason });
  if (!moved) throw conflict(`The job is already ${input.status === 'done' ? 'done' : 'open'}.`);
  return { job: { id: job.id, status: moved } };
});
