'use client';
/**
 * What a page shows when rendering it failed: a plain sentence, a way to try again, and a reference a
 * technician can quote (Next.js's digest, which the server logs beside the request id).
 */
import Link from 'next/link';
import { Button } from '@/components/ui/button';

export function ErrorNotice({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  const requestId = typeof document === 'undefined' ? null : document.querySelector<HTMLMetaElement>('meta[name="crankprint-request"]')?.content;
  const reference = error.digest ?? requestId?.slice(0, 8) ?? null;
  return (
    <main className="mx-auto max-w-xl px-4 py-16" role="alert">
      <h1 className="text-2xl font-bold">This page could not be shown</h1>
      <p className="mt-2">Something went wrong on our side. Nothing you entered was lost by opening this page; try again, or go back to the jobs list.</p>
      {reference && (
        <p className="mt-2">
          If it keeps happening, tell your shop owner the reference <code className="font-figures">{reference}</code>.
        </p>
      )}
      <div className="mt-4 flex gap-2">
        <Button onClick={reset}>Try again</Button>
        <Link className="self-center font-bold text-brand underline" href="/jobs">
          Jobs list
        </Link>
      </div>
    </main>
  );
}
