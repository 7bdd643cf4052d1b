'use client';
/**
 * Uppy on the job page: drag and drop, several files, progress, cancel; raw text bodies to the captures route.
 * The file last chosen is also read on this device while it uploads, so its bars show before the upload ends.
 */
import Uppy from '@uppy/core';
import Dashboard from '@uppy/react/dashboard';
import XHRUpload from '@uppy/xhr-upload';
import '@uppy/core/css/style.min.css';
import '@uppy/dashboard/css/style.min.css';
import { useRouter } from 'next/navigation';
import { useEffect, useMemo, useState } from 'react';
import { CautionsGate } from '@/components/analysis/cautions-dialog';
import { rememberUpload } from '@/components/analysis/local-files';
import { useAnalysisWorker } from '@/components/analysis/use-analysis-worker';
import type { EngineSpec } from '@/domain/engine';
import { settingsForEngine } from '@/domain/analysis-settings';
import { type Screening } from '@/domain/screening';
import { type UploadOutcome, UploadReading } from './upload-reading';
import { MAX_CAPTURE_BYTES, MAX_CAPTURE_SIZE } from '@/signal';

interface Chosen {
  uppyId: string;
  name: string;
  file: Blob;
  outcome: UploadOutcome;
}

export function CaptureUpload({ jobId, engine, cautionsRead }: { jobId: string; engine: EngineSpec; cautionsRead: boolean }) {
  const router = useRouter();
  const [messages, setMessages] = useState<string[]>([]);
  const [chosen, setChosen] = useState<Chosen | null>(null);
  const worker = useAnalysisWorker();
  // By value: a page refresh after an upload hands over an equal engine object, which must not start a new reading.
  const engineKey = JSON.stringify(engine);
  const settings = useMemo(() => settingsForEngine(JSON.parse(engineKey) as EngineSpec), [engineKey]);
  const [uppy] = useState(() =>
    new Uppy({
      id: `captures-${jobId}`,
      autoProceed: true,
      restrictions: { maxFileSize: MAX_CAPTURE_BYTES, allowedFileTypes: ['.csv', '.tsv', '.txt', 'text/*'], maxNumberOfFiles: 10 },
    }).use(XHRUpload, {
      endpoint: `/api/jobs/${jobId}/captures`,
      method: 'POST',
      formData: false,
      limit: 2,
      shouldRetry: () => false,
      headers: (file) => ({ 'x-file-name': encodeURIComponent(file.name ?? 'capture.csv'), 'content-type': file.type || 'text/csv' }),
    }),
  );

  useEffect(() => {
    const onAdded = (file: { id: string; name?: string; data?: unknown }) => {
      if (file.data instanceof Blob) setChosen({ uppyId: file.id, name: file.name ?? 'capture', file: file.data, outcome: { state: 'sending' } });
    };
    const settle = (uppyId: string | undefined, outcome: UploadOutcome) => setChosen((c) => (c && c.uppyId === uppyId ? { ...c, outcome } : c));
    const onSuccess = (file: { id?: string; data?: unknown } | undefined, response: { body?: unknown }) => {
      const body = response.body as { capture?: { id: string }; screening?: Screening } | undefined;
      const id = body?.capture?.id;
      if (id && file?.data instanceof Blob) rememberUpload(id, file.data);
      if (id && body?.screening) settle(file?.id, { state: 'stored', captureId: id, server: body.screening });
      router.refresh();
    };
    // The server's sentence is in the response body; the network error is the fallback.
    const onError = (file: { name?: string } | undefined, error: { message: string }, response?: unknown) => {
      let text = error.message;
      try {
        text = JSON.parse((response as { responseText?: string } | undefined)?.responseText ?? '').error?.message ?? text;
      } catch {
        // not JSON: keep the network error's message
      }
      // One sentence per refused file, saying nothing was kept; the widget lets go of the file (no retry: the same
      // file would be refused again), and its reading on this device goes with it.
      setMessages((m) => [...m, `${file?.name ?? 'A file'}: ${text.replace(/\.?$/, '.')} Nothing was stored.`]);
      const id = (file as { id?: string } | undefined)?.id;
      setChosen((c) => (c && c.uppyId === id ? null : c));
      if (id && uppy.getFile(id)) uppy.removeFile(id);
    };
    uppy.on('file-added', onAdded);
    uppy.on('upload-success', onSuccess);
    uppy.on('upload-error', onError);
    return () => {
      uppy.off('file-added', onAdded);
      uppy.off('upload-success', onSuccess);
      uppy.off('upload-error', onError);
    };
  }, [uppy, router]);

  // Made once: the worker's progress re-renders this component many times a second while a file is read.
  const dashboard = useMemo(() => <Dashboard uppy={uppy} height={260} width="100%" proudlyDisplayPoweredByUppy={false} note={`Text captures (CSV or TSV) up to ${MAX_CAPTURE_SIZE}`} theme="light" hideRetryButton disableInformer />, [uppy]);

  return (
    <CautionsGate read={cautionsRead} jobId={jobId}>
    <div className="flex flex-col gap-2" data-testid="uploader">
      {dashboard}
      {messages.length > 0 && (
        <ul role="alert" className="flex flex-col gap-1" data-testid="upload-errors">
          {messages.map((m, i) => (
            <li key={i} className="rounded-lg border-2 border-danger bg-surface p-2 font-bold text-danger">
              {m}
            </li>
          ))}
        </ul>
      )}
      {chosen && <UploadReading key={chosen.uppyId} worker={worker} jobId={jobId} name={chosen.name} file={chosen.file} settings={settings} outcome={chosen.outcome} />}
    </div>
    </CautionsGate>
  );
}
