/** Development only: the messages the local mail sink kept, with their links, so a person can click through. */
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { notFound } from 'next/navigation';
import { Wordmark } from '@/components/brand/logo';

export const dynamic = 'force-dynamic';

interface Kept {
  id: string;
  receivedAt: string;
  to: string[];
  subject: string;
  text: string;
  links: string[];
  attachments: { filename: string; size: number }[];
}

export default function DevMailPage() {
  if (process.env.NODE_ENV === 'production') notFound();
  const dir = process.env.MAIL_SINK_DIR || '.data/mail';
  const messages: Kept[] = existsSync(/*turbopackIgnore: true*/ dir)
    ? readdirSync(/*turbopackIgnore: true*/ dir)
        .filter((f) => f.endsWith('.json'))
        .map((f) => JSON.parse(readFileSync(join(/*turbopackIgnore: true*/ dir, f), 'utf8')) as Kept)
        .sort((a, b) => b.receivedAt.localeCompare(a.receivedAt))
    : [];
  return (
    <main className="mx-auto flex max-w-4xl flex-col gap-4 px-4 py-8">
      <Wordmark />
      <h1 className="text-2xl font-bold">Development mail</h1>
      <p className="text-muted">Every message the app sent in development. This page does not exist in a production build.</p>
      {messages.length === 0 && <p>No messages yet.</p>}
      {messages.map((m) => (
        <article key={m.id} className="rounded-2xl border border-line bg-surface p-4">
          <h2 className="font-bold">{m.subject}</h2>
          <p className="figures text-sm text-muted">
            to {m.to.join(', ')} · {new Date(m.receivedAt).toLocaleString()}
          </p>
          <pre className="mt-2 whitespace-pre-wrap font-sans">{m.text}</pre>
          <ul className="mt-2 flex flex-col gap-1">
            {m.links.map((l) => (
              <li key={l}>
                <a className="break-all font-bold text-brand underline" href={l}>
                  {l}
                </a>
              </li>
            ))}
          </ul>
          {m.attachments.length > 0 && <p className="mt-2 text-sm">Attachments: {m.attachments.map((a) => `${a.filename} (${a.size} bytes)`).join(', ')}</p>}
        </article>
      ))}
    </main>
  );
}
