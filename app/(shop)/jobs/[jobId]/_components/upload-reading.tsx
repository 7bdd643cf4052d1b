'use client';
/**
 * The bars of a file being uploaded, read on this device by the analysis worker while Uppy sends it, with the
 * job's engine and default settings. When the upload answers, the server's own reading of the same file is
 * compared with it: agreement is said, and any difference is listed, not hidden.
 */
import Link from 'next/link';
import { useEffect, useState } from 'react';
import { CylinderBars } from '@/components/analysis/cylinder-bars';
import type { AnalysisWorkerHandle } from '@/components/analysis/use-analysis-worker';
import { type AnalysisSettingsValues, engineSettings, importOptions } from '@/domain/analysis-settings';
import { type Screening, screeningDifferences, screeningSummary } from '@/domain/screening';
import type { AnalysisResult } from '@/signal';

/** A refused upload has no outcome here: the job page says why in one sentence and drops the reading. */
export type UploadOutcome = { state: 'sending' } | { state: 'stored'; captureId: string; server: Screening };

export function UploadReading({
  worker: w,
  jobId,
  name,
  file,
  settings,
  outcome,
}: {
  /** Started with the page, so choosing a file does not wait for a worker to load. */
  worker: AnalysisWorkerHandle;
  jobId: string;
  name: string;
  file: Blob;
  settings: AnalysisSettingsValues;
  outcome: UploadOutcome;
}) {
  const [result, setResult] = useState<AnalysisResult | null>(null);
  const [error, setError] = useState<string | null>(null);
  const { generation, open, analyze } = w;

  useEffect(() => {
    if (generation === 0) return;
    let current = true;
    void (async () => {
      const summary = await open(file, importOptions(settings));
      if (!current || !summary) return;
      const out = await analyze(engineSettings(settings));
      if (!current) return;
      if (out.ok) setResult(out.value);
      else setError(out.error.message);
    })();
    return () => {
      current = false;
    };
  }, [generation, open, analyze, file, settings]);

  const loadError = w.load.phase === 'error' ? w.load.error.message : null;
  const differences = result && outcome.state === 'stored' ? screeningDifferences(screeningSummary(result), outcome.server) : null;

  return (
    <section aria-label={`First reading of ${name}`} className="flex flex-col gap-2 rounded-xl border border-line p-3" data-testid="upload-reading">
      <p className="font-bold">
        <span className="figures">{name}</span>
      </p>
      {!result && !error && !loadError && <p className="text-muted">Reading the file on this device…</p>}
      {(error || loadError) && <p className="text-muted">This device could not read the file ({error ?? loadError}); the server’s check decides.</p>}
      {result && (
        <div data-testid="local-bars">
          <CylinderBars cylinders={result.cylinders} lowLimit={result.settings.lowLimitPercent} />
          <p className="text-sm">
            Verdict on this device: <strong>{result.verdict}</strong> at <span className="figures">{result.crankingRpm.toFixed(0)}</span> rpm, with this job’s engine and the
            default settings. Not saved: open the capture to check the settings and save.
          </p>
          {result.warnings.length > 0 && (
            <ul className="mt-1 list-disc pl-5 text-sm text-muted">
              {result.warnings.slice(0, 2).map((w) => (
                <li key={w.code}>{w.message}</li>
              ))}
            </ul>
          )}
        </div>
      )}
      <p className="text-sm" role="status" data-testid="upload-confirmation">
        {outcome.state === 'sending' && 'The server is receiving and checking the same file…'}
        {outcome.state === 'stored' && differences?.length === 0 && 'Stored. The server read the same file and got the same figures.'}
        {outcome.state === 'stored' && !result && 'Stored and checked by the server.'}
      </p>
      {differences && differences.length > 0 && (
        <div role="alert" className="rounded-lg border-2 border-uncertain p-2" data-testid="upload-differences">
          <p className="font-bold">The server’s reading differs from this device’s; the server’s figures are the ones a saved analysis will use:</p>
          <ul className="list-disc pl-5">
            {differences.map((d) => (
              <li key={d}>{d}</li>
            ))}
          </ul>
        </div>
      )}
      {outcome.state === 'stored' && (
        <Link className="font-bold text-brand underline" href={`/jobs/${jobId}/captures/${outcome.captureId}`}>
          Open the capture
        </Link>
      )}
    </section>
  );
}
