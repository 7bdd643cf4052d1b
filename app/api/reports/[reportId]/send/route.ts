/**
 * E-mails the report PDF to the advisor or the customer, one recipient a send; recorded in the audit log with
 * the recipient. Sends are limited per member and per shop over the last hour (counted in the audit log, so
 * every instance sees the same count).
 */
import { sendReportInput } from '@/server/api/inputs';
import { formatWhen } from '@/domain/time';
import { z } from 'zod';
import { countRecentActions, recordAudit } from '@/db/queries/audit';
import { reportBundle } from '@/db/queries/reports';
import { HttpError, notFound } from '@/server/http';
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
    const hourAgo = new Date(Date.now() - 3_600_000);
    if ((await countRecentActions(shop.id, 'report.send', hourAgo, user.id)) >= SENDS_PER_MEMBER_HOUR) {
      throw new HttpError(429, 'TOO_MANY_SENDS', `You have sent ${SENDS_PER_MEMBER_HOUR} reports in the last hour, the most one member may; try again later, or ask a colleague.`);
    }
    if ((await countRecentActions(shop.id, 'report.send', hourAgo)) >= SENDS_PER_SHOP_HOUR) {
      throw new HttpError(429, 'TOO_MANY_SENDS', `The shop has sent ${SENDS_PER_SHOP_HOUR} reports in the last hour, the most it may; try again later.`);
    }
    const b = await reportBundle(shop.id, input.reportId);
    if (!b) throw notFound('That report');
    const pdf = await renderPdf(await pdfDataFor(b), req.signal);
    const name = `${b.job.repairOrder}-rev${b.report.revision}.pdf`;
    await sendMail({
      to: input.to,
      subject: `${b.shop.name}: compression test report for ${b.job.repairOrder}`,
      text: `${input.note ? `${input.note}\n\n` : ''}The relative compression report for ${[b.vehicle.year, b.vehicle.make, b.vehicle.model].filter(Boolean).join(' ')} (${b.job.repairOrder}) is attached (revision ${b.report.revision}${b.report.signedAt ? `, signed ${formatWhen(b.report.signedAt, shop.settings.timeZone)}` : ', a draft'}).\nSent by ${user.name}, ${b.shop.name}, ${formatWhen(new Date(), shop.settings.timeZone)}.`,
      attachments: [{ filename: name, content: pdf, contentType: 'application/pdf' }],
    });
    await recordAudit(shop.id, user.id, 'report.send', { type: 'report', id: b.report.id }, { jobId: b.job.id, to: input.to, revision: b.report.revision });
    return { sent: true, to: input.to };
  },
);
