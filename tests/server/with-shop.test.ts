/**
 * The one route wrapper, called directly with requests the way Next.js hands them over, on a real better-auth
 * session from the seeded demo accounts: session (401) → origin on a state change (403) → shop role (403) →
 * zod input (400 with the field) → the handler, scoped to the member's shop; an unexpected error is a 500
 * whose sentence carries a reference and never the error's own text. Status codes as RFC 9110 defines them.
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { NextRequest } from 'next/server';
import { beforeAll, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { getDb } from '@/db/client';
import { DEMO_PASSWORD, seedDemoIfEmpty } from '@/db/seed';
import { APP_URL, getAuth } from '@/server/auth';
import { withShop } from '@/server/with-shop';
import { route } from '@/server/api/contract';
import type { Permission } from '@/server/permissions';

const cookies: Record<string, string> = {};

async function signIn(email: string): Promise<string> {
  const auth = await getAuth();
  const res = (await auth.api.signInEmail({ body: { email, password: DEMO_PASSWORD }, asResponse: true })) as Response;
  expect(res.status).toBe(200);
  return res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
}

const call = (handler: (req: NextRequest, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>, init: { method?: string; cookie?: string; origin?: boolean; body?: unknown; params?: Record<string, string> } = {}) =>
  handler(
    new NextRequest(`${APP_URL}/api/test`, {
      method: init.method ?? 'GET',
      headers: { ...(init.cookie ? { cookie: init.cookie } : {}), ...(init.origin ? { origin: APP_URL } : {}), ...(init.body ? { 'content-type': 'application/json' } : {}) },
      body: init.body ? JSON.stringify(init.body) : undefined,
    }),
    { params: Promise.resolve(init.params ?? {}) },
  );

const seen: { shopId?: string; input?: unknown } = {};
/** A test route's contract: a permission and the input's schema. */
const testRoute = <P extends z.ZodObject>(permission: Permission, params: P) => route({ method: 'GET', path: '/api/test', summary: 'A test route.', access: { permission }, params, output: z.unknown() });

const read = withShop(testRoute({ job: ['read'] }, z.object({ jobId: z.string().min(3, 'A job id has at least 3 characters.') })), async ({ shop, input }) => {
  seen.shopId = shop.id;
  seen.input = input;
  return { ok: true, shop: shop.id };
});
const remove = withShop(testRoute({ job: ['delete'] }, z.object({ note: z.string() })), async () => ({ removed: true }));
const broken = withShop(testRoute({ job: ['read'] }, z.object({})), async () => {
  throw new Error('secret detail: the database password is hunter2');
});

beforeAll(async () => {
  if (!process.env.DATABASE_URL) process.env.CRANKPRINT_DATA_DIR = mkdtempSync(join(tmpdir(), 'crankprint-wrapper-'));
  await seedDemoIfEmpty(await getDb());
  for (const role of ['owner', 'tech', 'advisor']) cookies[role] = await signIn(`${role}@demo.crankprint.test`);
}, 60_000);

describe('withShop', () => {
  it('refuses a request without a session with 401', async () => {
    const res = await call(read, { params: { jobId: 'abc' } });
    expect(res.status).toBe(401);
    expect((await res.json()).error.code).toBe('UNAUTHENTICATED');
  });

  it('refuses a state change without Origin or Referer with 403, before reading anything', async () => {
    const res = await call(remove, { method: 'POST', cookie: cookies.owner, body: { note: 'x' } });
    expect(res.status).toBe(403);
    expect((await res.json()).error.code).toBe('ORIGIN_REQUIRED');
  });

  it('refuses a role without the permission with 403 and says what it may not do', async () => {
    for (const who of ['tech', 'advisor']) {
      const res = await call(remove, { method: 'POST', cookie: cookies[who], origin: true, body: { note: 'x' } });
      expect(res.status, who).toBe(403);
      expect((await res.json()).error.message).toMatch(/delete jobs/);
    }
    const owner = await call(remove, { method: 'POST', cookie: cookies.owner, origin: true, body: { note: 'x' } });
    expect(owner.status).toBe(200);
  });

  it('refuses input that fails its schema with 400 naming the field', async () => {
    const res = await call(read, { cookie: cookies.advisor, params: { jobId: 'x' } });
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(body.error.code).toBe('INVALID_INPUT');
    expect(body.error.fields.jobId).toBe('A job id has at least 3 characters.');
  });

  it('hands the handler the member’s own shop and the parsed input', async () => {
    const res = await call(read, { cookie: cookies.advisor, params: { jobId: 'job-123' } });
    expect(res.status).toBe(200);
    expect(res.headers.get('cache-control')).toBe('no-store');
    expect(seen.input).toEqual({ jobId: 'job-123' });
    const owner = (await (await call(read, { cookie: cookies.owner, params: { jobId: 'job-123' } })).json()) as { shop: string };
    expect(seen.shopId).toBe(owner.shop);
  });

  it('answers an unexpected error with 500 and a reference, never the error’s text', async () => {
    const res = await call(broken, { cookie: cookies.tech });
    expect(res.status).toBe(500);
    const text = JSON.stringify(await res.json());
    expect(text).toMatch(/reference/);
    expect(text).not.toMatch(/hunter2|secret detail/);
  });

  it('reads a DELETE’s JSON body when it sends one, and takes an empty DELETE by its path whatever its Content-Type', async () => {
    const owner = withShop(testRoute({ job: ['read'] }, z.object({ jobId: z.string(), confirm: z.string().default('') })), async ({ input }) => input);
    const withBody = await call(owner, { method: 'DELETE', cookie: cookies.owner, origin: true, body: { confirm: 'Ölweg — 東 "100%"' }, params: { jobId: 'j1' } });
    expect(await withBody.json()).toEqual({ jobId: 'j1', confirm: 'Ölweg — 東 "100%"' });
    const empty = await owner(
      new NextRequest(`${APP_URL}/api/test`, { method: 'DELETE', headers: { cookie: cookies.owner, origin: APP_URL, 'content-type': 'application/json' } }),
      { params: Promise.resolve({ jobId: 'j2' }) },
    );
    expect(empty.status).toBe(200);
    expect(await empty.json()).toEqual({ jobId: 'j2', confirm: '' });
  });
});
