/** One job of the shop; another shop's job is a 404. Owners may remove a job with everything on it. */
import { recordAudit } from '@/db/queries/audit';
import { deleteJob, getJob, updateJob } from '@/db/queries/jobs';
import { notFound } from '@/server/http';
import { withShop } from '@/server/with-shop';
import * as api from '@/server/api/routes/jobs';

export const GET = withShop(api.getJob, async ({ input, shop }) => {
  const job = await getJob(shop.id, input.jobId);
  if (!job) throw notFound('That job');
  return { job };
});

export const PATCH = withShop(api.updateJob, async ({ input, shop, user }) => {
  const { jobId, ...patch } = input;
  const job = await updateJob(shop.id, jobId, patch);
  if (!job) throw notFound('That job');
  await recordAudit(shop.id, user.id, 'job.update', { type: 'job', id: job.id }, patch);
  return { job };
});

/** Removes the job (its activity line in the same transaction); objects storage could not remove now are retried later. */
export const DELETE = withShop(api.removeJob, async ({ input, shop, user }) => {
  const removed = await deleteJob(shop.id, input.jobId, user.id);
  if (!removed) throw notFound('That job');
  return { removed: { jobId: input.jobId, captures: removed.captures } };
});
