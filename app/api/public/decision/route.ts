/** The customer approves or declines the recommended next step through the share link (no account). */
import { getShopSettings } from '@/db/queries/shops';
import { formatWhen } from '@/domain/time';
import { recordAudit } from '@/db/queries/audit';
import { moveJob } from '@/db/queries/jobs';
import { findShareLink, recordApproval, reportBundle, shareLinkMaker } from '@/db/queries/reports';
import { sendMail } from '@/server/mail';
import { HttpError } from '@/server/http';
import { withPublic } from '@/server/with-shop';
import * as api from '@/server/api/routes/reports';

export const POST = withPublic(
  api.answerDecision, async ({ input }) => {
    const link = await findShareLink(input.token);
    const b = link && (await reportBundle(link.shopId, link.reportId));
    if (!link || !b) throw new HttpError(404, 'NOT_FOUND', 'This link does not open a report; ask the shop for a new one.');
    const { created: a, earlier } = await recordApproval(link, b.report.revision, input.decision, input.typedName);
    if (!a) {
      const when = earlier ? ` on ${formatWhen(earlier.createdAt, (await getShopSettings(link.shopId)).timeZone)}` : '';
      throw new HttpError(409, 'ALREADY_ANSWERED', `An answer${earlier ? ` (${earlier.decision})` : ''} was already given through this link for this revision${when}; it stands. Ask the shop if it should change.`);
    }
    await recordAudit(link.shopId, null, `report.${input.decision}`, { type: 'report', id: link.reportId }, { jobId: b.job.id, typedName: input.typedName, revision: b.report.revision });
    // The member who made the link hears of it (not awaited: the customer's answer does not wait on mail).
    const maker = await shareLinkMaker(link);
    if (maker) {
      void sendMail({
        to: maker.email,
        subject: `${b.job.repairOrder}: the customer ${input.decision === 'approve' ? 'approved' : 'declined'} the recommended next step`,
        text: `${input.typedName} ${input.decision === 'approve' ? 'approved' : 'declined'} the recommended next step on revision ${b.report.revision} of the report for ${b.job.repairOrder}, through the link you made.\nOpen the job in Crankprint to follow up.`,
      }).catch(() => {});
    }
    await moveJob(link.shopId, b.job.id, input.decision === 'approve' ? 'approved' : 'declined', ['open', 'waiting', 'approved', 'declined'], null, { cause: 'customer answered' });
    return { decision: a.decision, revision: a.revision, at: a.createdAt };
  },
);
