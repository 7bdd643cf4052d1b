'use client';
/**
 * After the draft: e-mail the PDF, make or withdraw customer links (signed revisions only), the customer's
 * answer, and every revision's PDF.
 */
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { call, errorText } from '@/components/data/api';
import { reportKeys } from '@/components/data/reports/keys';
import { useShopSettings } from '@/components/shop/shop-settings-context';
import { formatWhen } from '@/domain/time';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice, TextArea } from '@/components/ui/field';
import { type ReportData, type Revision } from './report-data';
import { sendReport, shareReport, withdrawShareLink } from '@/server/api/routes/reports';

export function ReportDelivery({
  jobId,
  data,
  latest,
  frozen,
  can,
  onMessage,
}: {
  jobId: string;
  data: ReportData;
  latest: Revision | undefined;
  frozen: boolean;
  can: { send: boolean; share: boolean };
  onMessage: (m: { tone: 'ok' | 'error'; text: string }) => void;
}) {
  const qc = useQueryClient();
  const { timeZone } = useShopSettings();
  const [to, setTo] = useState('');
  const [note, setNote] = useState('');
  const [withLink, setWithLink] = useState(true);
  const [shareUrl, setShareUrl] = useState<string | null>(null);
  const [copied, setCopied] = useState(false);
  const refresh = () => qc.invalidateQueries({ queryKey: reportKeys.forJob(jobId) });
  const send = useMutation({
    mutationFn: () =>
      call(sendReport, { params: { reportId: latest!.id }, json: { to, note: note || undefined, link: can.share && withLink } }),
    onSuccess: async (r) => {
      onMessage({ tone: 'ok', text: r.link ? `Report sent to ${to}, with a link to answer from, open until ${formatWhen(r.link.expiresAt, timeZone)}.` : `Report sent to ${to}.` });
      if (r.link) await refresh();
    },
    onError: (e) => onMessage({ tone: 'error', text: errorText(e) }),
  });
  const share = useMutation({
    mutationFn: () => call(shareReport, { params: { reportId: latest!.id } }),
    onSuccess: async (r) => {
      setShareUrl(r.url);
      setCopied(false);
      await refresh();
    },
    onError: (e) => onMessage({ tone: 'error', text: errorText(e) }),
  });
  const revoke = useMutation({
    mutationFn: (id: string) => call(withdrawShareLink, { params: { linkId: id } }),
    onSuccess: refresh,
  });
  return (
    <>
      {latest && (can.send || can.share) && (
        <section className="flex flex-col gap-3 rounded-2xl border border-line bg-surface p-4">
          <h2 className="text-lg font-bold">Send and share revision {latest.revision}</h2>
          {can.send && (
            <form
              className="flex flex-col gap-2"
              onSubmit={(e) => {
                e.preventDefault();
                send.mutate();
              }}
            >
              <Field id="send-to" label="E-mail the PDF to">
                <Input id="send-to" type="email" value={to} onChange={(e) => setTo(e.target.value)} />
              </Field>
              <Field id="send-note" label="Note to go with it (optional)" hint="Shown first in the e-mail, line by line as typed.">
                <TextArea id="send-note" rows={3} maxLength={1000} value={note} onChange={(e) => setNote(e.target.value)} />
              </Field>
              {can.share && (
                <label className="flex items-center gap-2">
                  <input type="checkbox" checked={withLink} onChange={(e) => setWithLink(e.target.checked)} />
                  Include a link the customer can answer from (open 14 days)
                </label>
              )}
              <div>
                <Button type="submit" disabled={!to || !frozen || send.isPending} title={frozen ? undefined : 'Sign the report first: a draft can still change.'}>
                  Send
                </Button>
              </div>
            </form>
          )}
          {!frozen && <p className="text-sm text-muted">Sign the report before sending or sharing it: a draft can still change.</p>}
          {can.share && (
            <div className="flex flex-col gap-2">
              <Button variant="secondary" onClick={() => share.mutate()} disabled={!frozen || share.isPending}>
                Create a customer link (14 days)
              </Button>
              {shareUrl && (
                <Notice tone="ok">
                  Link for the customer (shown once; copy it now): <span className="figures break-all" data-testid="share-url">{shareUrl}</span>{' '}
                  <Button variant="secondary" onClick={() => void navigator.clipboard?.writeText(shareUrl).then(() => setCopied(true), () => setCopied(false))}>
                    {copied ? 'Copied' : 'Copy the link'}
                  </Button>
                </Notice>
              )}
              <ul className="flex flex-col gap-1">
                {data.shareLinks.map((l) => (
                  <li key={l.id} className="flex items-center gap-2 text-sm">
                    <span className="flex-1">
                      Revision {l.revision} link: {l.revokedAt ? 'withdrawn' : new Date(l.expiresAt) < new Date() ? 'expired' : `open until ${formatWhen(l.expiresAt, timeZone)}`}
                    </span>
                    {!l.revokedAt && (
                      <Button variant="ghost" onClick={() => revoke.mutate(l.id)}>
                        Withdraw
                      </Button>
                    )}
                  </li>
                ))}
              </ul>
            </div>
          )}
        </section>
      )}
      <section className="rounded-2xl border border-line bg-surface p-4" data-testid="approvals">
        <h2 className="text-lg font-bold">Customer’s answer</h2>
        {data.approvals.length === 0 ? (
          <p className="text-muted">No answer yet.</p>
        ) : (
          <ul>
            {data.approvals.map((a) => (
              <li key={a.id}>
                <span className="font-bold">{a.decision === 'approve' ? 'Approved' : 'Declined'}</span> by {a.typedName}, revision {a.revision}, {formatWhen(a.createdAt, timeZone)}
              </li>
            ))}
          </ul>
        )}
      </section>
      {data.revisions.length > 0 && (
        <section className="rounded-2xl border border-line bg-surface p-4">
          <h2 className="text-lg font-bold">Revisions</h2>
          <ul>
            {data.revisions.map((r) => (
              <li key={r.id}>
                <a className="font-bold text-brand underline" href={`/api/reports/${r.id}/pdf`} target="_blank" rel="noreferrer">
                  Revision {r.revision}
                </a>{' '}
                · {r.status === 'signed' ? `signed ${r.signedAt ? formatWhen(r.signedAt, timeZone) : ''}` : 'draft'}
              </li>
            ))}
          </ul>
        </section>
      )}
    </>
  );
}
