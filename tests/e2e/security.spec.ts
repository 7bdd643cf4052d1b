/** Security headers on every page, a frameable PDF preview only from our own origin, and no secret in the client bundle. */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { expect, test } from '@playwright/test';
import { BASE_URL, DEMO, newContext, signIn } from './helpers';

test('pages carry a CSP with frame-ancestors none, no-sniff and a referrer policy', async () => {
  const anon = await newContext();
  const res = await anon.get('/sign-in');
  const h = res.headers();
  expect(h['content-security-policy']).toContain("frame-ancestors 'none'");
  expect(h['content-security-policy']).toContain("object-src 'none'");
  expect(h['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
  expect(h['x-content-type-options']).toBe('nosniff');
  expect(h['referrer-policy']).toBe('strict-origin-when-cross-origin');
  expect(h['x-powered-by']).toBeUndefined();
  // Prefetched pages too: a browser shows them later without asking again.
  const tech = await signIn(DEMO.technician);
  const prefetches: Record<string, string>[] = [{ purpose: 'prefetch' }, { 'next-router-prefetch': '1', rsc: '1' }, { 'sec-purpose': 'prefetch' }];
  for (const headers of prefetches) {
    for (const path of ['/sign-in', '/jobs']) {
      const r = await (path === '/jobs' ? tech : anon).get(path, { headers });
      expect(r.headers()['content-security-policy'], `${path} ${JSON.stringify(headers)}`).toContain("frame-ancestors 'none'");
    }
  }
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

// Rate limits per client: tests/e2e/limits.spec.ts (a server of its own, reached from several addresses).

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
  // Neither Origin nor Referer: refused, as better-auth refuses it on its own routes.
  const bare = await tech.post('/api/jobs', { headers: { origin: '' }, data: { repairOrder: 'NO-ORIGIN-1', concern: 'x', vehicle: { make: 'A', model: 'B', engine: { cylinders: 4, layout: 'inline', firingOrder: '1-3-4-2' } } } });
  expect(bare.status()).toBe(403);
  expect((await bare.json()).error.code).toBe('ORIGIN_REQUIRED');
  const anonDecision = await (await newContext()).post('/api/public/decision', { headers: { origin: '' }, data: { token: 'x'.repeat(43), decision: 'approve', typedName: 'Pat' } });
  expect(anonDecision.status()).toBe(403);
  // A same-site Referer stands in for a missing Origin; another site's does not.
  const referred = await tech.post('/api/jobs', { headers: { origin: '', referer: `${BASE_URL}/jobs` }, data: { repairOrder: 'REFERER-1', concern: 'Cranks slowly when cold.', vehicle: { make: 'Test', model: 'Origin', engine: { cylinders: 4, layout: 'inline', firingOrder: '1-3-4-2' } } } });
  expect(referred.status()).toBe(200);
  expect((await tech.post('/api/jobs', { headers: { origin: '', referer: 'https://evil.example/jobs' }, data: {} })).status()).toBe(403);
  // The same requests from our own origin go through.
  expect((await tech.get('/api/jobs')).status()).toBe(200);
});

test('page scripts run under a per-request nonce: no unsafe-inline, every script tag carries it, the page works', async ({ page }) => {
  const violations: string[] = [];
  page.on('console', (m) => {
    if (/Content Security Policy|Refused to (execute|load)/i.test(m.text())) violations.push(m.text());
  });
  const first = await page.goto('/sign-in');
  const csp = first!.headers()['content-security-policy'];
  const nonce = /'nonce-([^']+)'/.exec(csp)?.[1];
  expect(nonce).toBeTruthy();
  expect(csp).not.toContain("'unsafe-inline' 'nonce");
  expect(/script-src[^;]*'unsafe-inline'/.test(csp)).toBe(false);
  const tags = await page.locator('script').evaluateAll((els) => els.map((e) => (e as HTMLScriptElement).nonce));
  expect(tags.length).toBeGreaterThan(0);
  expect(tags.every((t) => t === nonce)).toBe(true);
  // A second request gets a different nonce.
  const again = await (await newContext()).get('/sign-in');
  expect(again.headers()['content-security-policy']).not.toContain(nonce!);
  // The page hydrated under the policy: signing in works and nothing was refused.
  await page.getByLabel('E-mail').fill(DEMO.technician);
  await page.getByLabel('Password').fill('crank-demo-2026');
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await expect(page.getByRole('heading', { name: 'Jobs' })).toBeVisible();
  expect(violations).toEqual([]);
});
