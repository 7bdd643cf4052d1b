/**
 * E-mails the report PDF to the advisor or the customer, one recipient a send, with the advisor's note and, when
 * asked, a new customer link to read the result and answer; recorded in the audit log with the recipient. Sends are limited per member and per shop over the last hour, reserved in the audit log before
 * the send under a lock every instance shares (so concurrent sends cannot pass one count), and given back when the
 * send fails.
 */
import { formatWhen } from '@/domain/time';
import { releaseAction, reserveAction } from '@/db/queries/audit';
import { moveJob } from '@/db/queries/jobs';
import { createShareLink, reportBundle, revokeShareLink } from '@/db/queries/reports';
import { recordAudit } from '@/db/queries/audit';
import { APP_URL } from '@/server/auth';
import { can } from '@/server/permissions';
import { conflict, HttpError, notFound } from '@/server/http';
import { sendMail } from '@/server/mail';
import { renderPdf } from '@/server/engine/pool';
import { pdfDataFor } from '@/server/pdf/build-report';
import { withShop } from '@/server/with-shop';
import { vehicleTitle } from '@/domain/vehicle';
import * as api from '@/server/api/routes/reports';

/** Sends allowed in an hour. */
const SENDS_PER_MEMBER_HOUR = 10;
const SENDS_PER_SHOP_HOUR = 40;

export const POST = withShop(
  api.sendReport, async ({ input, shop, user, member, req }) => {
    if (input.link && !can(member.role, { report: ['share'] })) throw new HttpError(403, 'FORBIDDEN', 'Your role cannot make customer links; send the PDF without one, or ask the advisor.');
    const b = await reportBundle(shop.id, input.reportId);
    if (!b) throw notFound('That report');
    // What goes to a customer is a record: a draft can change after it is sent.
    if (b.report.status !== 'signed') throw conflict('Sign the report before sending it; a draft can still change.');
    // The send is counted before it is made (atomically, across instances), and given back if it fails.
    const reserved = await reserveAction(
      shop.id,
      user.id,
      'report.send',
      { perMember: SENDS_PER_MEMBER_HOUR, perShop: SENDS_PER_SHOP_HOUR, sinceMs: 3_600_000 },
      { type: 'report', id: b.report.id },
      { jobId: b.job.id, to: input.to, revision: b.report.revision },
    );
    if ('spent' in reserved) {
      throw new HttpError(
        429,
        'TOO_MANY_SENDS',
        reserved.spent === 'member'
          ? `You have sent ${SENDS_PER_MEMBER_HOUR} reports in the last hour, the most one member may; try again later, or ask a colleague.`
          : `The shop has sent ${SENDS_PER_SHOP_HOUR} reports in the last hour, the most it may; try again later.`,
      );
    }
    let link: Awaited<ReturnType<typeof createShareLink>> | null = null;
    try {
      const pdf = await renderPdf(await pdfDataFor(b), req.signal);
      const name = `${b.job.repairOrder}-rev${b.report.revision}.pdf`;
      const zone = shop.settings.timeZone;
      if (input.link) link = await createShareLink(shop.id, b.report.id, user.id);
      const vehicle = vehicleTitle(b.vehicle);
      const lines = [
        ...(input.note ? [input.note, ''] : []),
        `The relative compression report for ${vehicle} (${b.job.repairOrder}) is attached (revision ${b.report.revision}, signed ${formatWhen(b.report.signedAt!, zone)}).`,
        ...(link ? [`See the result and approve or decline the next step here: ${APP_URL}/r/${link.token}`, `The link is open until ${formatWhen(link.link.expiresAt, zone)}.`] : []),
        '',
        b.shop.name,
        ...(shop.settings.address ? [shop.settings.address] : []),
        ...(shop.settings.phone ? [`Phone ${shop.settings.phone}`] : []),
        `Sent by ${user.name}, ${formatWhen(new Date(), zone)}.`,
      ];
      await sendMail({
        to: input.to,
        subject: `${b.shop.name}: compression test report for ${b.job.repairOrder}`,
        text: lines.join('\n'),
        attachments: [{ filename: name, content: pdf, contentType: 'application/pdf' }],
      });
    } catch (e) {
      await releaseAction(shop.id, reserved.id);
      if (link) await revokeShareLink(shop.id, link.link.id);
      throw e;
    }
    if (link) await recordAudit(shop.id, user.id, 'report.share', { type: 'report', id: b.report.id }, { jobId: b.job.id, linkId: link.link.id, expiresAt: link.link.expiresAt, by: 'e-mail' });
    await moveJob(shop.id, b.job.id, 'waiting', ['open'], user.id, { cause: 'report e-mailed' });
    return { sent: true, to: input.to, ...(link ? { link: { id: link.link.id, expiresAt: link.link.expiresAt } } : {}) };
  },
);
