/** The job's report: revisions, the analyses it can include, share links and the customer's decisions; save a draft. */
import { recordAudit } from '@/db/queries/audit';
import { getJob } from '@/db/queries/jobs';
import { candidateAnalyses, listApprovalsForJob, listRevisions, listShareLinksForJob, ReportStateError, saveDraft } from '@/db/queries/reports';
import { conflict, notFound } from '@/server/http';
import { withShop } from '@/server/with-shop';
import * as api from '@/server/api/routes/jobs';

export const GET = withShop(api.getReport, async ({ input, shop }) => {
  if (!(await getJob(shop.id, input.jobId))) throw notFound('That job');
  const revisions = await listRevisions(shop.id, input.jobId);
  return {
    revisions,
    candidates: await candidateAnalyses(shop.id, input.jobId),
    approvals: await listApprovalsForJob(shop.id, input.jobId),
    shareLinks: await listShareLinksForJob(shop.id, input.jobId),
  };
});

/** Saves the draft; `base` (what the editor loaded) makes a save on a revision changed meanwhile a 409. */
export const PUT = withShop(api.saveReport, async ({ input, shop, user }) => {
  const { jobId, base, ...content } = input;
  if (!(await getJob(shop.id, jobId))) throw notFound('That job');
  const report = await saveDraft(shop.id, jobId, content, base).catch((e) => {
    throw e instanceof ReportStateError ? conflict(e.message) : e;
  });
  await recordAudit(shop.id, user.id, 'report.save', { type: 'report', id: report.id }, { jobId, revision: report.revision });
  return { report };
});
