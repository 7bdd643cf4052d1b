/** Security headers on every page, a frameable PDF preview only from our own origin, and no secret in the client bundle. */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { expect, test } from '@playwright/test';
import { DEMO, newContext, signIn } from './helpers';

test('pages carry a CSP with frame-ancestors none, no-sniff and a referrer policy', async () => {
  const anon = await newContext();
  const res = await anon.get('/sign-in');
  const h = res.headers();
  expect(h['content-security-policy']).toContain("frame-ancestors 'none'");
  expect(h['content-security-policy']).toContain("object-src 'none'");
  expect(h['x-content-type-options']).toBe('nosniff');
  expect(h['referrer-policy']).toBe('strict-origin-when-cross-origin');
  expect(h['x-powered-by']).toBeUndefined();
});

test('the health check names the database this pass runs on, and tells no more', async () => {
  const res = await (await newContext()).get('/api/health');
  expect(res.status()).toBe(200);
  expect(await res.json()).toEqual({ ok: true, database: process.env.CRANKPRINT_TEST_PG_URL ? 'postgresql' : 'embedded' });
});

test('the built client chunks hold no server secret', () => {
  const secret = process.env.BETTER_AUTH_SECRET || 'e2e-only-secret-0123456789abcdef0123456789';
  const files: string[] = [];
  const walk = (d: string) => {
    for (const n of readdirSync(d)) {
      const p = join(d, n);
      if (statSync(p).isDirectory()) walk(p);
      else if (/\.(js|css|html|json)$/.test(n)) files.push(p);
    }
  };
  walk('.next/static');
  expect(files.length).toBeGreaterThan(0);
  for (const f of files) {
    const text = readFileSync(f, 'utf8');
    expect(text.includes(secret), f).toBe(false);
    // Library code may name environment variables; what must never ship is a value: the secret or a connection string.
    expect(/postgres(ql)?:\/\/[^\s"'`]*@/.test(text), f).toBe(false);
  }
});

// The limits of server/auth.ts, raised by the factor the test server runs with (scripts/e2e-server.mjs).
const SCALE = Number(process.env.CRANKPRINT_RATE_LIMIT_SCALE || 20);
const LIMITS: [path: string, max: number, body: object][] = [
  ['/api/auth/sign-in/email', 10 * SCALE, { email: 'nobody@example.com', password: 'not-the-password' }],
  ['/api/auth/sign-up/email', 5 * SCALE, { email: 'not-an-address', name: 'x', password: 'short' }],
  ['/api/auth/request-password-reset', 5 * SCALE, { email: 'nobody@example.com', redirectTo: '/reset-password' }],
];

for (const [path, max, body] of LIMITS) {
  test(`${path} answers 429 after ${max} attempts a minute from one client`, async () => {
    const ctx = await newContext();
    // A client of its own (a documentation address, RFC 5737), so other tests keep their allowance.
    const ip = `203.0.113.${Math.floor(Math.random() * 250) + 1}`;
    const statuses: number[] = [];
    for (let i = 0; i <= max; i++) {
      const res = await ctx.post(path, { data: body, headers: { 'x-forwarded-for': ip } });
      statuses.push(res.status());
    }
    expect(statuses.slice(0, max).filter((s) => s === 429)).toHaveLength(0);
    expect(statuses[max]).toBe(429);
    // Another client is not held back.
    const other = await ctx.post(path, { data: body, headers: { 'x-forwarded-for': '198.51.100.9' } });
    expect(other.status()).not.toBe(429);
  });
}

test('state-changing requests from another site are refused, by better-auth and by our routes', async () => {
  const tech = await signIn(DEMO.technician);
  const evil = { origin: 'https://evil.example' };
  const job = await tech.post('/api/jobs', { headers: evil, data: { repairOrder: 'X-SITE-1', concern: 'x', vehicle: { make: 'A', model: 'B', engine: { cylinders: 4, layout: 'inline', firingOrder: '1-3-4-2' } } } });
  expect(job.status()).toBe(403);
  expect((await job.json()).error.code).toBe('CROSS_SITE');
  const signOut = await tech.post('/api/auth/sign-out', { headers: evil, data: {} });
  expect(signOut.status()).toBe(403);
  const fetchMeta = await tech.post('/api/jobs', { headers: { origin: '', 'sec-fetch-site': 'cross-site' }, data: {} });
  expect(fetchMeta.status()).toBe(403);
  // The same requests from our own origin go through.
  expect((await tech.get('/api/jobs')).status()).toBe(200);
});
