/**
 * E-mails the report PDF to the advisor or the customer, one recipient a send; recorded in the audit log with
 * the recipient. Sends are limited per member and per shop over the last hour, reserved in the audit log before
 * the send under a lock every instance shares (so concurrent sends cannot pass one count), and given back when the
 * send fails.
 */
import { sendReportInput } from '@/server/api/inputs';
import { formatWhen } from '@/domain/time';
import { z } from 'zod';
import { releaseAction, reserveAction } from '@/db/queries/audit';
import { moveJob } from '@/db/queries/jobs';
import { reportBundle } from '@/db/queries/reports';
import { conflict, HttpError, notFound } from '@/server/http';
import { sendMail } from '@/server/mail';
import { renderPdf } from '@/server/engine/pool';
import { pdfDataFor } from '@/server/pdf/build-report';
import { withShop } from '@/server/with-shop';

/** Sends allowed in an hour. */
const SENDS_PER_MEMBER_HOUR = 10;
const SENDS_PER_SHOP_HOUR = 40;

export const POST = withShop(
  { report: ['send'] },
  sendReportInput.extend({ reportId: z.string() }),
  async ({ input, shop, user, req }) => {
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
    try {
      const pdf = await renderPdf(await pdfDataFor(b), req.signal);
      const name = `${b.job.repairOrder}-rev${b.report.revision}.pdf`;
      await sendMail({
        to: input.to,
        subject: `${b.shop.name}: compression test report for ${b.job.repairOrder}`,
        text: `${input.note ? `${input.note}\n\n` : ''}The relative compression report for ${[b.vehicle.year, b.vehicle.make, b.vehicle.model].filter(Boolean).join(' ')} (${b.job.repairOrder}) is attached (revision ${b.report.revision}${b.report.signedAt ? `, signed ${formatWhen(b.report.signedAt, shop.settings.timeZone)}` : ', a draft'}).\nSent by ${user.name}, ${b.shop.name}, ${formatWhen(new Date(), shop.settings.timeZone)}.`,
        attachments: [{ filename: name, content: pdf, contentType: 'application/pdf' }],
      });
    } catch (e) {
      await releaseAction(shop.id, reserved.id);
      throw e;
    }
    await moveJob(shop.id, b.job.id, 'waiting', ['open'], user.id, { cause: 'report e-mailed' });
    return { sent: true, to: input.to };
  },
);
