/** Outgoing e-mail through nodemailer to SMTP_URL (in development, the local sink that `npm run dev` starts). */
import 'server-only';
import nodemailer, { type Transporter } from 'nodemailer';
import { processShared } from '@/db/process-state.mjs';

const g = processShared<{ mail?: Transporter }>('mail', () => ({}));

function transport(): Transporter {
  g.mail ??= nodemailer.createTransport(process.env.SMTP_URL || 'smtp://127.0.0.1:2525');
  return g.mail;
}

export const MAIL_FROM = process.env.MAIL_FROM || 'Crankprint <no-reply@crankprint.invalid>';

export interface Mail {
  to: string;
  subject: string;
  /** Plain-text body; a link stands on a line of its own. */
  text: string;
  attachments?: { filename: string; content: Buffer; contentType: string }[];
}

export async function sendMail(mail: Mail): Promise<void> {
  const html = mail.text
    .split('\n')
    .map((line) => (/^https?:\/\//.test(line) ? `<p><a href="${escape(line)}">${escape(line)}</a></p>` : `<p>${escape(line)}</p>`))
    .join('');
  await transport().sendMail({ from: MAIL_FROM, ...mail, html });
}

function escape(s: string): string {
  return s.replace(/[&<>"]/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;' })[c]!);
}
