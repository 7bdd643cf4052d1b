/** Contracts of the report routes: the PDF, sending it, customer links and the customer's answer (server/api/contract.ts). */
import { z } from 'zod';
import { route } from '../contract';
import { decisionInput, idParam, sendReportInput, shareInput } from '../inputs';
import { ok, shareLink, when } from '../shapes';

const reportId = idParam('reportId');

export const reportPdf = route({
  method: 'GET',
  path: '/api/reports/{reportId}/pdf',
  summary: 'The report revision as a PDF.',
  access: { permission: { report: ['read'] } },
  params: reportId,
  output: 'application/pdf',
});

export const sendReport = route({
  method: 'POST',
  path: '/api/reports/{reportId}/send',
  summary: 'E-mails the signed PDF to one address, with an optional note and, with link: true, a new customer link (limits per member and shop per hour; audited).',
  access: { permission: { report: ['send'] } },
  params: reportId,
  body: sendReportInput,
  output: z.object({ sent: z.literal(true), to: z.string(), link: z.object({ id: z.string(), expiresAt: when }).optional() }),
  errors: [413, 415],
});

export const listShareLinks = route({
  method: 'GET',
  path: '/api/reports/{reportId}/share',
  summary: 'The revision’s customer links.',
  access: { permission: { report: ['share'] } },
  params: reportId,
  output: z.object({ links: z.array(shareLink) }),
});

export const shareReport = route({
  method: 'POST',
  path: '/api/reports/{reportId}/share',
  summary: 'Creates a customer link to the signed revision (the URL is shown once).',
  access: { permission: { report: ['share'] } },
  params: reportId,
  body: shareInput,
  output: z.object({ link: shareLink, url: z.url() }),
  errors: [409, 413, 415],
});

export const withdrawShareLink = route({
  method: 'DELETE',
  path: '/api/share-links/{linkId}',
  summary: 'Withdraws a customer link.',
  access: { permission: { report: ['share'] } },
  params: idParam('linkId'),
  output: ok,
});

export const answerDecision = route({
  method: 'POST',
  path: '/api/public/decision',
  summary: 'The customer approves or declines the next step through a link (one answer per revision per link).',
  access: 'link',
  body: decisionInput,
  output: z.object({ decision: z.enum(['approve', 'decline']), revision: z.number().int(), at: when }),
  errors: [409, 413, 415],
});
