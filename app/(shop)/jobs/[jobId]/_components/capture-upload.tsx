'use client';
/** Uppy on the job page: drag and drop, several files, progress, cancel; raw text bodies to the captures route. */
import Uppy from '@uppy/core';
import Dashboard from '@uppy/react/dashboard';
import XHRUpload from '@uppy/xhr-upload';
import '@uppy/core/css/style.min.css';
import '@uppy/dashboard/css/style.min.css';
import { useRouter } from 'next/navigation';
import { useEffect, useState } from 'react';
import { rememberUpload } from '@/components/analysis/local-files';

export function CaptureUpload({ jobId }: { jobId: string }) {
  const router = useRouter();
  const [messages, setMessages] = useState<string[]>([]);
  const [uppy] = useState(() =>
    new Uppy({
      id: `captures-${jobId}`,
      autoProceed: true,
      restrictions: { maxFileSize: 256 * 1024 * 1024, allowedFileTypes: ['.csv', '.tsv', '.txt', 'text/*'], maxNumberOfFiles: 10 },
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
    const onSuccess = (file: { data?: unknown } | undefined, response: { body?: unknown }) => {
      const id = (response.body as { capture?: { id: string } } | undefined)?.capture?.id;
      if (id && file?.data instanceof Blob) rememberUpload(id, file.data);
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
      setMessages((m) => [...m, `${file?.name ?? 'A file'}: ${text}`]);
    };
    uppy.on('upload-success', onSuccess);
    uppy.on('upload-error', onError);
    return () => {
      uppy.off('upload-success', onSuccess);
      uppy.off('upload-error', onError);
    };
  }, [uppy, router]);

  return (
    <div className="flex flex-col gap-2" data-testid="uploader">
      <Dashboard uppy={uppy} height={260} width="100%" proudlyDisplayPoweredByUppy={false} note="Text captures (CSV or TSV) up to 256 MB" theme="auto" />
      {messages.length > 0 && (
        <ul role="alert" className="flex flex-col gap-1" data-testid="upload-errors">
          {messages.map((m, i) => (
            <li key={i} className="rounded-lg border-2 border-danger bg-surface p-2 font-bold text-danger">
              {m}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
