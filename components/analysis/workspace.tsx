'use client';
/**
 * The analysis workspace: the worker parses the capture, the trace and the per-cylinder chart show the result,
 * and every setting change re-runs the engine at once. Settings live in the URL, so a reload or a hand-over
 * keeps them. Saving asks the server to re-run the same engine on the stored file.
 */
import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/field';
import { call, errorText } from '@/components/data/api';
import { type AnalysisSettingsValues, engineSettings, importOptions } from '@/domain/analysis-settings';
import { type AnalysisResult, identityWords, METHOD_NAMES } from '@/signal';
import type { WorkerError } from '@/workers/analysis-api';
import { CautionsGate } from './cautions-dialog';
import { CylinderBars } from './cylinder-bars';
import { Findings } from './findings';
import { StartingPanel } from './starting-panel';
import { BaselineNote } from './baseline-note';
import type { Baseline } from '@/domain/baseline';
import { MappingDialog } from './mapping-dialog';
import { ResultsTable } from './results-table';
import { sameSettings } from './settings-differences';
import { type ProfileOption, SettingsPanel } from './settings-panel';
import { useSettingsHistory } from './use-settings-history';
import { methodBlocks } from './method-availability';
import { type TraceData, type TraceHandle, TraceChart, type TraceSeries } from './trace-chart';
import { localUpload } from './local-files';
import { CHANNELS } from './trace-channels';
import { useAnalysisWorker } from './use-analysis-worker';
import { useUrlSettings } from './use-url-settings';
import { saveAnalysis } from '@/server/api/routes/captures';
import { SURE_MAPPING } from '@/domain/capture-policy';

interface Props {
  captureId: string;
  rawUrl: string;
  initialSettings: AnalysisSettingsValues;
  /** The settings the job's vehicle gives (its engine), for "Back to the job's engine". */
  jobSettings: AnalysisSettingsValues;
  /** The saved analysis this page was opened on, if any: the page says whether the settings still match it. */
  savedAs?: { when: string; settings: AnalysisSettingsValues };
  profiles: ProfileOption[];
  /** The shop's healthy captures of this engine (domain/baseline.ts): each figure that has enough of them. */
  baseline?: Baseline;
  /** Whether this member has read the job's safety cautions (on any device). */
  cautionsRead: boolean;
  /** The job the capture belongs to: its cautions, once read, are not asked again. */
  jobId: string;
  canSave: boolean;
}

export function Workspace({ captureId, rawUrl, initialSettings, jobSettings, savedAs, baseline, profiles, cautionsRead, jobId, canSave }: Props) {
  const router = useRouter();
  const [settings, applySettings] = useUrlSettings(initialSettings);
  const history = useSettingsHistory(settings, applySettings);
  const setSettings = history.change;
  const w = useAnalysisWorker();
  const [result, setResult] = useState<AnalysisResult | null>(null);
  const [error, setError] = useState<WorkerError | null>(null);
  const [highlighted, setHighlighted] = useState<number | null>(null);
  const [views, setViews] = useState(0);
  const [askMapping, setAskMapping] = useState(false);
  const trace = useRef<TraceHandle>(null);

  // Load the capture into each worker this page starts: a file this tab just uploaded is read locally, else the
  // server's copy is downloaded.
  const { generation, open, restart } = w;
  const loadOptions = useRef(importOptions(settings));
  const serverCopy = useRef(false);
  useEffect(() => {
    if (generation === 0) return;
    const { mapping, sampleRateHz } = loadOptions.current;
    let current = true;
    const local = serverCopy.current ? undefined : localUpload(captureId);
    void open(local ?? rawUrl, { mapping, sampleRateHz }).then((summary) => {
      if (current && summary && summary.confidence < SURE_MAPPING && !mapping) setAskMapping(true);
    });
    return () => {
      current = false;
    };
  }, [generation, open, rawUrl, captureId]);
  // A read that makes no progress for a while is started again in a new worker, on the server's copy; twice at most.
  const stalls = useRef(0);
  const [stalled, setStalled] = useState(false);
  useEffect(() => {
    if (w.load.phase !== 'loading') return;
    const t = setTimeout(() => {
      if (stalls.current >= MAX_RESTARTS) return setStalled(true);
      stalls.current += 1;
      serverCopy.current = true;
      restart();
    }, READ_PATIENCE_MS);
    return () => clearTimeout(t);
  }, [w.load, restart]);

  // Re-run the engine whenever the settings change.
  const ready = w.load.phase === 'ready';
  const { analyze, decimate } = w;
  useEffect(() => {
    if (!ready || askMapping) return;
    let current = true;
    void analyze(engineSettings(settings)).then((out) => {
      if (!current) return;
      if (out.ok) {
        setResult(out.value);
        setError(null);
      } else setError(out.error);
    });
    return () => {
      current = false;
    };
  }, [ready, askMapping, settings, analyze, w.load]);

  const summary = w.load.phase === 'ready' ? w.load.summary : null;
  const shown = useMemo(() => CHANNELS.filter((c) => summary?.traces.includes(c.channel)), [summary]);
  const fetchView = useCallback(
    async (fromS: number, toS: number, columns: number): Promise<TraceData | null> => {
      const parts = await Promise.all(shown.map((c) => decimate(c.channel, fromS, toS, columns)));
      const first = parts.find(Boolean);
      if (!first) return null;
      const series: TraceSeries[] = [];
      parts.forEach((p, i) => {
        if (p && p.x.length === first.x.length) series.push({ label: shown[i].label, unit: shown[i].unit, token: shown[i].token, right: shown[i].right, min: p.min, max: p.max });
      });
      return { x: first.x, series };
    },
    [shown, decimate],
  );

  // "Saved." speaks of the settings that were saved: a later change takes it away.
  const settingsKey = JSON.stringify(settings);
  const [savedWith, setSavedWith] = useState<string | null>(null);
  const save = useMutation({
    mutationFn: (key: string) => call(saveAnalysis, { params: { captureId }, json: { settings } }).then(() => key),
    // The saved-analyses list is rendered on the server: refresh it.
    onSuccess: (key) => {
      setSavedWith(key);
      router.refresh();
    },
  });
  const openedMatches = savedAs ? sameSettings(settings, savedAs.settings) : null;

  const events = result?.events ?? [];
  const onKey = (e: React.KeyboardEvent) => {
    // A field keeps its own undo for what is typed in it.
    if ((e.target as HTMLElement).closest('input, select, textarea')) return;
    const key = e.key.toLowerCase();
    if ((e.ctrlKey || e.metaKey) && (key === 'z' || key === 'y')) {
      if (key === 'y' || e.shiftKey) history.redo();
      else history.undo();
      e.preventDefault();
      return;
    }
    const t = trace.current;
    if (!t) return;
    if (e.key === '+' || e.key === '=') t.zoom(0.5);
    else if (e.key === '-') t.zoom(2);
    else if (e.key === '0') t.resetZoom();
    else if (e.key === 'ArrowRight' || e.key === 'ArrowLeft') {
      const used = events.filter((x) => x.used);
      if (used.length === 0) return;
      const idx = Math.max(0, Math.min(used.length - 1, (stepIndex.current += e.key === 'ArrowRight' ? 1 : -1)));
      stepIndex.current = idx;
      t.centreOn(used[idx].timeS);
      setHighlighted(used[idx].cylinder);
    } else if (e.key === 'r' && result?.identity === 'assumed') setSettings({ ...settings, rotation: settings.rotation + 1 });
    else return;
    e.preventDefault();
  };
  const stepIndex = useRef(-1);

  const body = (
    <div className="flex flex-col gap-4" onKeyDown={onKey} tabIndex={-1}>
      {w.load.phase === 'loading' && (
        <div role="status" aria-live="polite" className="rounded-xl border border-line bg-surface p-4">
          <p className="font-bold">{LOAD_WORDS[w.load.stage] ?? 'Analysing…'}</p>
          <progress className="mt-2 w-full" value={w.load.fraction} max={1} />
        </div>
      )}
      {stalled && <Notice tone="error">Reading the capture stopped making progress; check the connection and reload the page.</Notice>}
      {w.load.phase === 'error' && (
        <Notice tone="error">
          <span data-testid="capture-error">
            {w.load.error.message}
            {w.load.error.line ? ` (line ${w.load.error.line}${w.load.error.column ? `, column ${w.load.error.column}` : ''})` : ''}
          </span>
        </Notice>
      )}
      {askMapping && summary && (
        <MappingDialog
          summary={summary}
          onApply={async (roles, sampleRateHz) => {
            const s = await w.open(rawUrl, { mapping: roles, sampleRateHz });
            if (s) {
              setAskMapping(false);
              setSettings({ ...settings, mapping: roles, sampleRateHz });
            }
          }}
        />
      )}
      {error && <Notice tone="error">{error.message}</Notice>}
      {summary && !askMapping && (
        <div className="grid gap-4 xl:grid-cols-[1fr_20rem]">
          <div className="flex min-w-0 flex-col gap-4">
            <section aria-labelledby="trace-title" className="rounded-2xl border border-line bg-surface p-3">
              <div className="flex flex-wrap items-center justify-between gap-2">
                <h2 id="trace-title" className="font-bold">
                  Trace
                </h2>
                <div className="flex gap-1">
                  <Button variant="secondary" onClick={() => trace.current?.zoom(0.5)} aria-label="Zoom in">
                    +
                  </Button>
                  <Button variant="secondary" onClick={() => trace.current?.zoom(2)} aria-label="Zoom out">
                    −
                  </Button>
                  <Button variant="secondary" onClick={() => trace.current?.resetZoom()}>
                    Whole capture
                  </Button>
                </div>
              </div>
              <p className="text-sm text-muted">
                Drag across the trace to zoom; drag the edges of the shaded cranking window to move it. Keys: + − 0, ← → step through events
                {result?.identity === 'assumed' ? ', R rotates the cylinders' : ''}.
              </p>
              <TraceChart
                ref={trace}
                range={[0, summary.durationS + 1e-9]}
                fetchView={fetchView}
                events={events}
                window={result?.window.endS ? result.window : undefined}
                onWindowChange={(win) => setSettings({ ...settings, window: win })}
                highlighted={highlighted}
                onView={() => setViews((v) => v + 1)}
              />
              <span className="sr-only" data-testid="views">
                {views}
              </span>
            </section>
            {result && (
              <section aria-labelledby="chart-title" className="rounded-2xl border border-line bg-surface p-4" data-testid="cylinder-chart">
                <div className="flex flex-wrap items-baseline justify-between gap-2">
                  <h2 id="chart-title" className="text-lg font-bold">
                    Relative compression
                  </h2>
                  <p className="figures text-sm">
                    {METHOD_NAMES[result.method]} · {result.crankingRpm} rpm · spread {result.spreadPercent} points · cylinder numbers {identityWords(result.identity)}
                  </p>
                </div>
                {result.wheel && (
                  <p className="figures text-sm text-muted" data-testid="wheel-read">
                    Crank wheel: {result.wheel.description} ({result.wheel.learned ? 'learned from the capture' : 'as set'}, written {result.wheel.notation})
                    {result.wheel.glitchesDropped + result.wheel.teethInserted > 0
                      ? ` · repaired: ${result.wheel.glitchesDropped} glitch edge(s) dropped, ${result.wheel.teethInserted} missing tooth edge(s) inserted`
                      : ' · no edges repaired'}
                  </p>
                )}
                {result.identityNote && <p className="text-sm text-muted">{result.identityNote}</p>}
                {savedAs && (
                  <p className="text-sm font-bold" data-testid="opened-saved">
                    {openedMatches ? `The saved analysis of ${savedAs.when}, with its settings.` : `Settings changed since the analysis of ${savedAs.when} was saved.`}
                  </p>
                )}
                <CylinderBars cylinders={result.cylinders} lowLimit={settings.lowLimitPercent} highLimit={settings.highLimitPercent} onHover={setHighlighted} highlighted={highlighted} />
                <Findings result={result} onTryCylinders={(k) => setSettings({ ...settings, engine: engineOf(k, profiles, settings.engine.layout), rotation: 0 })} />
                <div className="mt-4">
                  <ResultsTable cylinders={result.cylinders} rawUnit={result.rawUnit} />
                </div>
              </section>
            )}
            {result && baseline && <BaselineNote result={result} baseline={baseline} />}
            {result?.startingSystem && <StartingPanel system={result.startingSystem} />}
          </div>
          <aside aria-labelledby="setup-title" className="flex flex-col gap-3 rounded-2xl border border-line bg-surface p-4">
            <h2 id="setup-title" className="text-lg font-bold">
              Engine setup and limits
            </h2>
            <div className="flex flex-wrap gap-2" role="group" aria-label="Settings history">
              <Button variant="secondary" onClick={history.undo} disabled={!history.canUndo} title="Ctrl+Z">
                Undo
              </Button>
              <Button variant="secondary" onClick={history.redo} disabled={!history.canRedo} title="Ctrl+Shift+Z">
                Redo
              </Button>
              {!sameSettings(settings.engine, jobSettings.engine) && (
                <Button variant="ghost" onClick={() => setSettings({ ...settings, engine: jobSettings.engine, rotation: 0 })}>
                  Back to the job’s engine
                </Button>
              )}
            </div>
            <SettingsPanel settings={settings} onChange={setSettings} profiles={profiles} identityAssumed={result?.identity === 'assumed'} blocked={methodBlocks(summary?.traces)} />
            {canSave ? (
              <div className="flex flex-col gap-2 border-t border-line pt-3">
                <Button onClick={() => save.mutate(settingsKey)} disabled={!result || save.isPending}>
                  {save.isPending ? 'Saving…' : 'Save this analysis'}
                </Button>
                {save.isSuccess && savedWith === settingsKey && (
                  <Notice tone="ok">
                    <span data-testid="saved">Saved. The server re-ran the engine on the stored file.</span>
                  </Notice>
                )}
                {save.isError && <Notice tone="error">{errorText(save.error, 'Could not save; try again.')}</Notice>}
              </div>
            ) : (
              <p className="border-t border-line pt-3 text-sm text-muted">Your role can read analyses but not save them.</p>
            )}
          </aside>
        </div>
      )}
    </div>
  );
  return (
    <CautionsGate read={cautionsRead} jobId={jobId}>
      {body}
    </CautionsGate>
  );
}

/** What the page says while the capture loads, by stage. */
const LOAD_WORDS: Partial<Record<string, string>> = { starting: 'Starting the analysis…', downloading: 'Fetching the capture…', parsing: 'Reading the numbers…' };

/** How long reading the capture may go without progress before it is started again in a new worker. */
const READ_PATIENCE_MS = 15_000;
/** New workers started for one page's reading before the page says it stopped. */
const MAX_RESTARTS = 2;

/** An engine of `cylinders`: the first profile with that count, else even firing in number order on the same layout. */
function engineOf(cylinders: number, profiles: ProfileOption[], layout: AnalysisSettingsValues['engine']['layout']): AnalysisSettingsValues['engine'] {
  const profile = profiles.find((p) => p.engine.cylinders === cylinders);
  if (profile) return profile.engine;
  return { cylinders, firingOrder: Array.from({ length: cylinders }, (_, i) => i + 1), layout, numbering: 'along-crank' };
}
