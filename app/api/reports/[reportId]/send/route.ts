/** E-mails the report PDF to the advisor or the customer; recorded in the audit log. */
import { z } from 'zod';
import { recordAudit } from '@/db/queries/audit';
import { reportBundle } from '@/db/queries/reports';
import { notFound } from '@/server/http';
import { sendMail } from '@/server/mail';
import { pdfDataFor, renderReportPdf } from '@/server/pdf/build-report';
import { withShop } from '@/server/with-shop';

export const POST = withShop(
  { report: ['send'] },
  z.object({
    reportId: z.string(),
    to: z.string().trim().toLowerCase().email('Enter the e-mail address to send the report to.'),
    note: z.string().trim().max(1000, 'Keep the note under 1,000 characters.').optional(),
  }),
  async ({ input, shop, user }) => {
    const b = await reportBundle(shop.id, input.reportId);
    if (!b) throw notFound('That report');
    const pdf = await renderReportPdf(await pdfDataFor(b));
    const name = `${b.job.repairOrder}-rev${b.report.revision}.pdf`;
    await sendMail({
      to: input.to,
      subject: `${b.shop.name}: compression test report for ${b.job.repairOrder}`,
      text: `${input.note ? `${input.note}\n\n` : ''}The relative compression report for ${[b.vehicle.year, b.vehicle.make, b.vehicle.model].filter(Boolean).join(' ')} (${b.job.repairOrder}) is attached.\nSent by ${user.name}, ${b.shop.name}.`,
      attachments: [{ filename: name, content: pdf, contentType: 'application/pdf' }],
    });
    await recordAudit(shop.id, user.id, 'report.send', { type: 'report', id: b.report.id }, { jobId: b.job.id, to: input.to, revision: b.report.revision });
    return { sent: true, to: input.to };
  },
);
