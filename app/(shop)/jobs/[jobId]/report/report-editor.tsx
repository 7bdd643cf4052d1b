'use client';
/**
 * The report editor beside a live preview of the PDF: analyses to include, test conditions, interpretation
 * and next steps, sign-off; then send by e-mail or share a customer link. A signed revision is frozen: saving
 * starts the next one.
 */
import { reportKeys } from '@/components/data/reports/keys';
import { useShopSettings } from '@/components/shop/shop-settings-context';
import { formatWhen } from '@/domain/time';
import { temperatureFrom, temperatureIn } from '@/domain/units';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice, Select, TextArea } from '@/components/ui/field';
import { api, ApiError } from '@/components/data/api';
import { interpretationFor, nextStepsFor } from '@/domain/report-wording';
import type { ReportContent } from '@/db/validators/report';
import type { AnalysisResult } from '@/signal';

interface Revision {
  id: string;
  revision: number;
  status: 'draft' | 'signed';
  content: ReportContent;
  signedAt: string | null;
}
interface Candidate {
  id: string;
  createdAt: string;
  verdict: string;
  fileName: string;
  repairOrder: string;
  jobId: string;
  result: AnalysisResult;
}
interface ReportData {
  revisions: Revision[];
  candidates: Candidate[];
  approvals: { id: string; decision: string; typedName: string; revision: number; createdAt: string }[];
  shareLinks: { id: string; revision: number; expiresAt: string; revokedAt: string | null }[];
}

const EMPTY: ReportContent = { analysisIds: [], conditions: {}, interpretation: '', nextSteps: [], technicianName: undefined };
const errorText = (e: unknown) => (e instanceof ApiError ? e.message : 'That did not work; try again.');

export function ReportEditor({ jobId, defaultName, can }: { jobId: string; defaultName: string; can: { edit: boolean; sign: boolean; send: boolean; share: boolean } }) {
  const qc = useQueryClient();
  const { timeZone, temperatureUnit } = useShopSettings();
  const key = reportKeys.forJob(jobId);
  const q = useQuery({ queryKey: key, queryFn: () => api<ReportData>(`/api/jobs/${jobId}/report`), refetchInterval: 15_000 });
  const latest = q.data?.revisions[0];
  const [c, setC] = useState<ReportContent>(EMPTY);
  const [loadedFor, setLoadedFor] = useState<string | null>(null);
  const [to, setTo] = useState('');
  const [shareUrl, setShareUrl] = useState<string | null>(null);
  const [message, setMessage] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const [previewAt, setPreviewAt] = useState(0);

  useEffect(() => {
    if (!q.data) return;
    const id = latest ? `${latest.id}:${latest.revision}` : 'new';
    if (loadedFor === id) return;
    setLoadedFor(id);
    if (latest) setC({ ...EMPTY, ...latest.content });
    else {
      const mine = q.data.candidates.find((x) => x.jobId === jobId);
      setC({ ...EMPTY, analysisIds: mine ? [mine.id] : [], technicianName: defaultName, interpretation: mine ? interpretationFor(mine.result) : '', nextSteps: mine ? nextStepsFor(mine.result) : [] });
    }
  }, [q.data, latest, loadedFor, jobId, defaultName]);

  const refresh = () => qc.invalidateQueries({ queryKey: key });
  const save = useMutation({
    mutationFn: () => api<{ report: Revision }>(`/api/jobs/${jobId}/report`, { method: 'PUT', json: c }),
    onSuccess: async (r) => {
      setMessage({ tone: 'ok', text: `Draft saved as revision ${r.report.revision}.` });
      setLoadedFor(`${r.report.id}:${r.report.revision}`);
      setPreviewAt(Date.now());
      await refresh();
    },
    onError: (e) => setMessage({ tone: 'error', text: errorText(e) }),
  });
  const sign = useMutation({
    mutationFn: () => api(`/api/jobs/${jobId}/report/sign`, { method: 'POST', json: { reportId: latest!.id } }),
    onSuccess: async () => {
      const revision = latest!.revision;
      // The page shows the signed revision everywhere before it says so.
      await refresh();
      setPreviewAt(Date.now());
      setMessage({ tone: 'ok', text: `Revision ${revision} is signed and frozen.` });
    },
    onError: (e) => setMessage({ tone: 'error', text: errorText(e) }),
  });
  const send = useMutation({
    mutationFn: () => api(`/api/reports/${latest!.id}/send`, { method: 'POST', json: { to } }),
    onSuccess: () => setMessage({ tone: 'ok', text: `Report sent to ${to}.` }),
    onError: (e) => setMessage({ tone: 'error', text: errorText(e) }),
  });
  const share = useMutation({
    mutationFn: () => api<{ url: string }>(`/api/reports/${latest!.id}/share`, { method: 'POST', json: {} }),
    onSuccess: async (r) => {
      setShareUrl(r.url);
      await refresh();
    },
    onError: (e) => setMessage({ tone: 'error', text: errorText(e) }),
  });
  const revoke = useMutation({
    mutationFn: (id: string) => api(`/api/share-links/${id}`, { method: 'DELETE' }),
    onSuccess: refresh,
  });

  if (q.isPending) return <p>Loading the report…</p>;
  if (q.isError) return <Notice tone="error">{errorText(q.error)}</Notice>;
  const data = q.data!;
  const frozen = latest?.status === 'signed';
  const readOnly = !can.edit;
  const set = (patch: Partial<ReportContent>) => setC({ ...c, ...patch });
  const setCond = (patch: Partial<ReportContent['conditions']>) => set({ conditions: { ...c.conditions, ...patch } });
  const first = data.candidates.find((x) => x.id === c.analysisIds[0]);

  return (
    <div className="grid gap-4 xl:grid-cols-2">
      <div className="flex flex-col gap-4">
        {message && <Notice tone={message.tone}>{message.text}</Notice>}
        {frozen && (
          <Notice>
            Revision {latest!.revision} is signed and frozen{can.edit ? '; saving changes starts revision ' + (latest!.revision + 1) : ''}.
          </Notice>
        )}
        <fieldset disabled={readOnly} className="flex flex-col gap-3 rounded-2xl border border-line bg-surface p-4">
          <legend className="px-1 text-lg font-bold">Analyses to include</legend>
          {data.candidates.length === 0 && <p className="text-muted">No saved analysis on this vehicle yet: save one from a capture first.</p>}
          {data.candidates.map((a) => (
            <label key={a.id} className="flex min-h-touch items-center gap-3">
              <input
                type="checkbox"
                className="size-5"
                checked={c.analysisIds.includes(a.id)}
                onChange={(e) => set({ analysisIds: e.target.checked ? [...c.analysisIds, a.id] : c.analysisIds.filter((x) => x !== a.id) })}
              />
              <span>
                <span className="figures font-bold">{a.repairOrder}</span> · {a.fileName} · {formatWhen(a.createdAt, timeZone)} · <span className="font-bold">{a.verdict}</span>
              </span>
            </label>
          ))}
          <p className="text-sm text-muted">Two analyses of the vehicle (before and after a repair) are shown side by side.</p>
        </fieldset>
        <fieldset disabled={readOnly} className="grid gap-x-3 rounded-2xl border border-line bg-surface p-4 md:grid-cols-3">
          <legend className="px-1 text-lg font-bold">Test conditions</legend>
          <Field id="coolant" label={`Coolant (°${temperatureUnit})`}>
            <Input
              id="coolant"
              inputMode="decimal"
              className="figures"
              value={c.conditions.coolantTempC === undefined ? '' : temperatureIn(c.conditions.coolantTempC, temperatureUnit)}
              onChange={(e) => setCond({ coolantTempC: e.target.value === '' ? undefined : temperatureFrom(Number(e.target.value), temperatureUnit) })}
            />
          </Field>
          <Field id="rest" label="Battery at rest (V)">
            <Input id="rest" inputMode="decimal" className="figures" value={c.conditions.batteryRestV ?? ''} onChange={(e) => setCond({ batteryRestV: e.target.value === '' ? undefined : Number(e.target.value) })} />
          </Field>
          <Field id="crankv" label="Lowest cranking (V)">
            <Input id="crankv" inputMode="decimal" className="figures" value={c.conditions.lowestCrankingV ?? ''} onChange={(e) => setCond({ lowestCrankingV: e.target.value === '' ? undefined : Number(e.target.value) })} />
          </Field>
          <Field id="throttle" label="Throttle">
            <Select id="throttle" value={c.conditions.throttle ?? ''} onChange={(e) => setCond({ throttle: (e.target.value || undefined) as 'closed' })}>
              <option value="">not recorded</option>
              <option value="closed">closed</option>
              <option value="wide-open">wide open</option>
            </Select>
          </Field>
          <div className="md:col-span-2">
            <Field id="fuel" label="Fuel disabled by">
              <Input id="fuel" value={c.conditions.fuelDisabledBy ?? ''} placeholder="e.g. fuel pump fuse removed" onChange={(e) => setCond({ fuelDisabledBy: e.target.value || undefined })} />
            </Field>
          </div>
          <Field id="sync" label="Sync source">
            <Input id="sync" value={c.conditions.syncSource ?? ''} placeholder="e.g. cylinder 1 coil trigger" onChange={(e) => setCond({ syncSource: e.target.value || undefined })} />
          </Field>
          <div className="md:col-span-2">
            <Field id="numbering" label="Cylinder numbering convention">
              <Input id="numbering" value={c.conditions.numbering ?? ''} placeholder="as the service information numbers them" onChange={(e) => setCond({ numbering: e.target.value || undefined })} />
            </Field>
          </div>
        </fieldset>
        <fieldset disabled={readOnly} className="flex flex-col gap-2 rounded-2xl border border-line bg-surface p-4">
          <legend className="px-1 text-lg font-bold">Interpretation and next steps</legend>
          <Field id="interp" label="Interpretation">
            <TextArea id="interp" rows={6} value={c.interpretation} onChange={(e) => set({ interpretation: e.target.value })} />
          </Field>
          {first && (
            <Button type="button" variant="secondary" onClick={() => set({ interpretation: interpretationFor(first.result), nextSteps: nextStepsFor(first.result) })}>
              Fill from the first analysis
            </Button>
          )}
          <Field id="next" label="Recommended next steps, one per line">
            <TextArea id="next" rows={4} value={c.nextSteps.join('\n')} onChange={(e) => set({ nextSteps: e.target.value.split('\n').filter((l) => l.trim()) })} />
          </Field>
          <Field id="tech" label="Technician signing">
            <Input id="tech" value={c.technicianName ?? ''} onChange={(e) => set({ technicianName: e.target.value || undefined })} />
          </Field>
        </fieldset>
        <div className="flex flex-wrap gap-2">
          {can.edit && (
            <Button onClick={() => save.mutate()} disabled={save.isPending}>
              {frozen ? 'Save as a new revision' : 'Save draft'}
            </Button>
          )}
          {can.sign && latest && !frozen && (
            <Button variant="secondary" onClick={() => sign.mutate()} disabled={sign.isPending}>
              Sign revision {latest.revision}
            </Button>
          )}
        </div>
        {latest && (can.send || can.share) && (
          <section className="flex flex-col gap-3 rounded-2xl border border-line bg-surface p-4">
            <h2 className="text-lg font-bold">Send and share revision {latest.revision}</h2>
            {can.send && (
              <form
                className="flex flex-wrap items-end gap-2"
                onSubmit={(e) => {
                  e.preventDefault();
                  send.mutate();
                }}
              >
                <div className="min-w-64 flex-1">
                  <Field id="send-to" label="E-mail the PDF to">
                    <Input id="send-to" type="email" value={to} onChange={(e) => setTo(e.target.value)} />
                  </Field>
                </div>
                <Button type="submit" className="mb-6" disabled={!to || send.isPending}>
                  Send
                </Button>
              </form>
            )}
            {can.share && (
              <div className="flex flex-col gap-2">
                <Button variant="secondary" onClick={() => share.mutate()} disabled={!frozen || share.isPending}>
                  Create a customer link (14 days)
                </Button>
                {!frozen && <p className="text-sm text-muted">Sign the report before sharing it.</p>}
                {shareUrl && (
                  <Notice tone="ok">
                    Link for the customer (shown once): <span className="figures break-all" data-testid="share-url">{shareUrl}</span>
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
      </div>
      <section aria-label="PDF preview" className="min-h-[70vh] rounded-2xl border border-line bg-surface p-2">
        {latest ? (
          <iframe title="Report preview" className="h-[80vh] w-full rounded-xl" src={`/api/reports/${latest.id}/pdf?v=${previewAt}`} />
        ) : (
          <p className="p-4 text-muted">Save a draft to see the PDF here.</p>
        )}
      </section>
    </div>
  );
}
