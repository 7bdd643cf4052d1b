/**
 * A member says they have read the safety cautions for a job. Recorded once per member and job, in the audit
 * trail, so the cautions are not asked again on another device and the job's activity shows who read them.
 */
import { CAUTIONS_READ, cautionsReadAt, recordAudit } from '@/db/queries/audit';
import { getJob } from '@/db/queries/jobs';
import { notFound } from '@/server/http';
import { withShop } from '@/server/with-shop';
import * as api from '@/server/api/routes/jobs';

export const POST = withShop(api.readCautions, async ({ input, shop, user }) => {
  const job = await getJob(shop.id, input.jobId);
  if (!job) throw notFound('That job');
  const before = await cautionsReadAt(shop.id, user.id, job.id);
  if (!before) await recordAudit(shop.id, user.id, CAUTIONS_READ, { type: 'job', id: job.id });
  return { cautions: { jobId: job.id, readAt: (before ?? new Date()).toISOString() } };
});
