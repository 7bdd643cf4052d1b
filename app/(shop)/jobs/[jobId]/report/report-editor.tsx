'use client';
/**
 * The report editor beside a live preview of the PDF: analyses to include, test conditions, interpretation
 * and next steps, sign-off; then send by e-mail or share a customer link. A signed revision is frozen: saving
 * starts the next one.
 */
import { reportKeys } from '@/components/data/reports/keys';
import { useShopSettings } from '@/components/shop/shop-settings-context';
import { formatWhen } from '@/domain/time';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice, TextArea } from '@/components/ui/field';
import { call, errorText } from '@/components/data/api';
import { interpretationFor, nextStepsFor } from '@/domain/report-wording';
import type { ReportContent } from '@/domain/report';
import { ConditionFields } from './condition-fields';
import { GaugeFields } from './gauge-fields';
import { EMPTY } from './report-data';
import { ReportDelivery } from './report-delivery';
import { getReport, saveReport, signReport } from '@/server/api/routes/jobs';

export function ReportEditor({ jobId, defaultName, can }: { jobId: string; defaultName: string; can: { edit: boolean; sign: boolean; send: boolean; share: boolean } }) {
  const qc = useQueryClient();
  const { timeZone } = useShopSettings();
  const key = reportKeys.forJob(jobId);
  const q = useQuery({ queryKey: key, queryFn: () => call(getReport, { params: { jobId } }), refetchInterval: 15_000 });
  const latest = q.data?.revisions[0];
  const [c, setC] = useState<ReportContent>(EMPTY);
  const [loadedFor, setLoadedFor] = useState<string | null>(null);
  /** The revision and version this editor loaded or last saved: a save or signing on anything else is refused. */
  const [base, setBase] = useState<{ id?: string; revision: number; version: number }>({ revision: 0, version: 0 });
  /** The next-steps box as typed, or null to show the stored steps one per line. */
  const [nextText, setNextText] = useState<string | null>(null);
  /** Edits not saved yet: a revision saved elsewhere never replaces them (saving then says it changed). */
  const [dirty, setDirty] = useState(false);
  const [message, setMessage] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const [previewAt, setPreviewAt] = useState(0);

  useEffect(() => {
    if (!q.data) return;
    const id = latest ? `${latest.id}:${latest.revision}` : 'new';
    if (loadedFor === id || (dirty && loadedFor !== null)) return;
    setLoadedFor(id);
    setBase(latest ? { id: latest.id, revision: latest.revision, version: latest.version } : { revision: 0, version: 0 });
    setNextText(null);
    if (latest) setC({ ...EMPTY, ...latest.content });
    else {
      const mine = q.data.candidates.find((x) => x.jobId === jobId);
      setC({ ...EMPTY, analysisIds: mine ? [mine.id] : [], technicianName: defaultName, interpretation: mine ? interpretationFor(mine.result) : '', nextSteps: mine ? nextStepsFor(mine.result) : [] });
    }
  }, [q.data, latest, loadedFor, dirty, jobId, defaultName]);

  const refresh = () => qc.invalidateQueries({ queryKey: key });
  const save = useMutation({
    mutationFn: () => call(saveReport, { params: { jobId }, json: { ...c, base: { revision: base.revision, version: base.version } } }),
    onSuccess: async (r) => {
      setMessage({ tone: 'ok', text: `Draft saved as revision ${r.report.revision}.` });
      setDirty(false);
      setLoadedFor(`${r.report.id}:${r.report.revision}`);
      setBase({ id: r.report.id, revision: r.report.revision, version: r.report.version });
      setPreviewAt(Date.now());
      await refresh();
    },
    onError: (e) => setMessage({ tone: 'error', text: errorText(e) }),
  });
  const sign = useMutation({
    mutationFn: () => call(signReport, { params: { jobId }, json: { reportId: base.id ?? latest!.id, version: base.id ? base.version : 0 } }),
    onSuccess: async (r) => {
      const revision = r.report.revision;
      setBase({ id: r.report.id, revision, version: r.report.version });
      // The page shows the signed revision everywhere before it says so.
      await refresh();
      setPreviewAt(Date.now());
      setMessage({ tone: 'ok', text: `Revision ${revision} is signed. Send it or share it with the customer below.` });
    },
    onError: (e) => setMessage({ tone: 'error', text: errorText(e) }),
  });

  if (q.isPending) return <p>Loading the report…</p>;
  if (q.isError) return <Notice tone="error">{errorText(q.error)}</Notice>;
  const data = q.data!;
  const frozen = latest?.status === 'signed';
  const readOnly = !can.edit;
  const set = (patch: Partial<ReportContent>) => {
    setDirty(true);
    setC({ ...c, ...patch });
  };
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
        <ConditionFields conditions={c.conditions} readOnly={readOnly} onChange={setCond} />
        <GaugeFields key={loadedFor ?? 'new'} gauge={c.gauge} result={first?.result} readOnly={readOnly} onChange={(gauge) => set({ gauge })} />
        <fieldset disabled={readOnly} className="flex flex-col gap-2 rounded-2xl border border-line bg-surface p-4">
          <legend className="px-1 text-lg font-bold">Interpretation and next steps</legend>
          <Field id="interp" label="Interpretation">
            <TextArea id="interp" rows={6} value={c.interpretation} onChange={(e) => set({ interpretation: e.target.value })} />
          </Field>
          {first && (
            <Button type="button" variant="secondary" onClick={() => {
                setNextText(null);
                set({ interpretation: interpretationFor(first.result), nextSteps: nextStepsFor(first.result) });
              }}>
              Fill from the first analysis
            </Button>
          )}
          <Field id="next" label="Recommended next steps, one per line">
            <TextArea
              id="next"
              rows={4}
              value={nextText ?? c.nextSteps.join('\n')}
              onChange={(e) => {
                // The text as typed stays on screen (an Enter starts an empty line); the steps are its non-empty lines.
                setNextText(e.target.value);
                set({ nextSteps: e.target.value.split(/\r?\n/).filter((l) => l.trim()) });
              }}
            />
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
        <ReportDelivery jobId={jobId} data={data} latest={latest} frozen={frozen} can={can} onMessage={setMessage} />
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
