/** For owners wiring Crankprint to other systems: the API reference, from /api/openapi.json. */
import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { pageMember } from '@/server/page-context';
import { ApiReference } from './_components/api-reference';

export const metadata: Metadata = { title: 'API reference' };

export default async function ApiReferencePage() {
  const m = await pageMember('/shop/api');
  if (m.member.role !== 'owner') notFound();
  return (
    <div className="flex flex-col gap-3">
      <h1 className="text-2xl font-bold">API reference</h1>
      <p className="max-w-3xl">
        Every route of Crankprint’s HTTP API with its input, answer and errors, as published at{' '}
        <a className="font-bold text-brand underline" href="/api/openapi.json">
          /api/openapi.json
        </a>{' '}
        (OpenAPI 3.1). Requests act as the signed-in member and are limited to your shop.
      </p>
      <ApiReference />
    </div>
  );
}
