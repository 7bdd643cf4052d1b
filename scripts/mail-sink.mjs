// A local SMTP sink for development and tests: accepts every message on 127.0.0.1 and keeps it as JSON
// (subject, recipients, text, links, attachment names) in MAIL_SINK_DIR (default .data/mail).
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

const dir = process.env.MAIL_SINK_DIR || '.data/mail';
const port = Number(process.env.MAIL_SINK_PORT || 2525);
mkdirSync(dir, { recursive: true });

const server = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS'],
  logger: false,
  onData(stream, session, done) {
    simpleParser(stream)
      .then((mail) => {
        const text = mail.text ?? '';
        const id = `${Date.now()}-${Math.random().toString(36).slice(2, 8)}`;
        const record = {
          id,
          receivedAt: new Date().toISOString(),
          from: mail.from?.text ?? '',
          to: session.envelope.rcptTo.map((r) => r.address),
          subject: mail.subject ?? '',
          text,
          links: [...text.matchAll(/https?:\/\/[^\s<>"]+/g)].map((m) => m[0]),
          attachments: (mail.attachments ?? []).map((a) => ({ filename: a.filename, contentType: a.contentType, size: a.size })),
        };
        writeFileSync(join(dir, `${id}.json`), JSON.stringify(record, null, 2));
        for (const a of mail.attachments ?? []) writeFileSync(join(dir, `${id}-${a.filename ?? 'attachment'}`), a.content);
        done();
      })
      .catch(done);
  },
});

server.listen(port, '127.0.0.1', () => console.log(`mail sink: smtp://127.0.0.1:${port} → ${dir}`));
for (const s of ['SIGINT', 'SIGTERM']) process.on(s, () => server.close(() => process.exit(0)));
