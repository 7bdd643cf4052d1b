/** The shop's jobs: list (search, status) and create (with an existing or a new vehicle). */
import { recordAudit } from '@/db/queries/audit';
import { createJob, DuplicateRepairOrderError, listJobs } from '@/db/queries/jobs';
import { HttpError, notFound } from '@/server/http';
import { withShop } from '@/server/with-shop';
import * as api from '@/server/api/routes/jobs';

export const GET = withShop(api.listJobs, async ({ input, shop }) => ({ jobs: await listJobs(shop.id, input) }));

export const POST = withShop(api.createJob, async ({ input, shop, user }) => {
  try {
    const job = await createJob(shop.id, user.id, input);
    if (!job) throw notFound('That vehicle');
    await recordAudit(shop.id, user.id, 'job.create', { type: 'job', id: job.id }, { repairOrder: job.repairOrder });
    return { job };
  } catch (e) {
    if (e instanceof DuplicateRepairOrderError) throw new HttpError(409, 'CONFLICT', e.message, { repairOrder: e.message });
    throw e;
  }
});
