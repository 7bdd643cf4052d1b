/**
 * Rate limits on a server of its own (budgets unscaled, 127.0.0.9 as its one trusted proxy), reached from
 * several loopback addresses (Linux routes all of 127.0.0.0/8 to this machine): the client is the socket,
 * a forged X-Forwarded-For changes nothing, a trusted proxy's chain is walked, the share page and its API spend
 * one budget, and one client's spent budget leaves the others alone.
 */
import { request as httpRequest } from 'node:http';
import { rmSync } from 'node:fs';
import { expect, test } from '@playwright/test';
import { exited, freePort, startApp, waitReady } from '../../scripts/app-server';
import { createDatabase } from '../../scripts/pg-server.mjs';

let BASE = '';
const DATA = '.e2e/limits';
const PROXY = '127.0.0.9';

interface Answer {
  status: number;
  body: string;
  retryAfter?: string;
}

/** One request from a chosen loopback address. */
function hit(from: string, method: string, path: string, options: { json?: unknown; headers?: Record<string, string> } = {}): Promise<Answer> {
  const body = options.json === undefined ? undefined : JSON.stringify(options.json);
  return new Promise((resolve, reject) => {
    const req = httpRequest(
      `${BASE}${path}`,
      { method, localAddress: from, headers: { origin: BASE, ...(body ? { 'content-type': 'application/json' } : {}), ...options.headers } },
      (res) => {
        let text = '';
        res.setEncoding('utf8');
        res.on('data', (d) => (text += d));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, body: text, retryAfter: res.headers['retry-after'] as string | undefined }));
      },
    );
    req.on('error', reject);
    req.end(body);
  });
}

const wrongPassword = { email: 'tech@demo.crankprint.test', password: 'not-the-password-at-all' };
let n = 0;
const forged = () => ({ 'x-forwarded-for': `203.0.113.${(++n % 250) + 1}` });
const guess = () => 'G'.repeat(40) + String(++n).padStart(3, '0');

test.describe.configure({ mode: 'serial' });
let server: ReturnType<typeof startApp>;

test.beforeAll(async () => {
  test.setTimeout(180_000);
  rmSync(DATA, { recursive: true, force: true });
  const env: Record<string, string> = { CRANKPRINT_DATA_DIR: DATA, CRANKPRINT_RATE_LIMIT_SCALE: '1', CRANKPRINT_TRUSTED_PROXIES: PROXY };
  // The PostgreSQL pass: the counts live in the database, as several instances would share them.
  if (process.env.CRANKPRINT_TEST_PG_URL) env.DATABASE_URL = await createDatabase(process.env.CRANKPRINT_TEST_PG_URL, 'limits');
  const port = await freePort();
  BASE = `http://127.0.0.1:${port}`;
  server = startApp(port, env, { logs: true });
  await waitReady(server);
});

test.afterAll(async () => {
  server.child.kill('SIGTERM');
  await exited(server.child);
});

test('sign-in: ten wrong passwords a minute per client, whatever X-Forwarded-For says; other clients go on', async () => {
  const statuses: number[] = [];
  for (let i = 0; i < 11; i++) statuses.push((await hit('127.0.0.2', 'POST', '/api/auth/sign-in/email', { json: wrongPassword, headers: forged() })).status);
  expect(statuses.slice(0, 10).every((s) => s === 401), String(statuses)).toBe(true);
  const last = await hit('127.0.0.2', 'POST', '/api/auth/sign-in/email', { json: wrongPassword, headers: forged() });
  expect(last.status).toBe(429);
  expect(JSON.parse(last.body).error.message).toMatch(/wait \d+ s/);
  expect(Number(last.retryAfter)).toBeGreaterThan(0);
  // Another address is a client of its own, and the right password still works there.
  const other = await hit('127.0.0.3', 'POST', '/api/auth/sign-in/email', { json: { ...wrongPassword, password: 'crank-demo-2026' } });
  expect(other.status).toBe(200);
});

test('changing a password spends the sign-in budget: five wrong sign-ins and five change attempts, then 429', async () => {
  for (let i = 0; i < 5; i++) expect((await hit('127.0.0.4', 'POST', '/api/auth/sign-in/email', { json: wrongPassword })).status).toBe(401);
  for (let i = 0; i < 5; i++) {
    const r = await hit('127.0.0.4', 'POST', '/api/auth/change-password', { json: { currentPassword: 'guess-number-' + i, newPassword: 'another-password-1' } });
    expect(r.status).toBe(401);
  }
  expect((await hit('127.0.0.4', 'POST', '/api/auth/change-password', { json: { currentPassword: 'one-more-guess', newPassword: 'another-password-1' } })).status).toBe(429);
});

test('share links: the page and the API spend one budget of 30 a minute; a rotating header does not reset it', async () => {
  const statuses: number[] = [];
  for (let i = 0; i < 15; i++) {
    statuses.push((await hit('127.0.0.4', 'GET', `/r/${guess()}`, { headers: forged() })).status);
    statuses.push((await hit('127.0.0.4', 'POST', '/api/public/decision', { json: { token: guess(), decision: 'approve', typedName: 'Guess' }, headers: forged() })).status);
  }
  expect(statuses.every((s) => s === 404), String(statuses)).toBe(true);
  const api = await hit('127.0.0.4', 'POST', '/api/public/decision', { json: { token: guess(), decision: 'approve', typedName: 'Guess' }, headers: forged() });
  expect(api.status).toBe(429);
  const page = await hit('127.0.0.4', 'GET', `/r/${guess()}`);
  expect(page.body).toContain('Too many attempts from your address');
  // A customer elsewhere is not held back by the guesser.
  const customer = await hit('127.0.0.5', 'GET', `/r/${guess()}`);
  expect(customer.status).toBe(404);
  expect(customer.body).not.toContain('Too many attempts');
});

test('behind the trusted proxy, each forwarded client has its own budget; the proxy is not one client', async () => {
  for (let i = 0; i < 10; i++) expect((await hit(PROXY, 'POST', '/api/auth/sign-in/email', { json: wrongPassword, headers: { 'x-forwarded-for': '198.51.100.7' } })).status).toBe(401);
  expect((await hit(PROXY, 'POST', '/api/auth/sign-in/email', { json: wrongPassword, headers: { 'x-forwarded-for': '198.51.100.7' } })).status).toBe(429);
  // What that client wrote to the left of the proxy's hop does not make it someone else.
  expect((await hit(PROXY, 'POST', '/api/auth/sign-in/email', { json: wrongPassword, headers: { 'x-forwarded-for': '192.0.2.1, 198.51.100.7' } })).status).toBe(429);
  expect((await hit(PROXY, 'POST', '/api/auth/sign-in/email', { json: wrongPassword, headers: { 'x-forwarded-for': '198.51.100.8' } })).status).toBe(401);
});

test('every API request is one JSON log line with its request id, route, status, duration, shop and member; no secret', async () => {
  const cookie = await new Promise<string>((resolve, reject) => {
    const req = httpRequest(`${BASE}/api/auth/sign-in/email`, { method: 'POST', localAddress: '127.0.0.6', headers: { origin: BASE, 'content-type': 'application/json' } }, (res) => {
      res.resume();
      resolve((res.headers['set-cookie'] ?? []).map((c) => c.split(';')[0]).join('; '));
    });
    req.on('error', reject);
    req.end(JSON.stringify({ ...wrongPassword, password: 'crank-demo-2026' }));
  });
  const res = await fetch(`${BASE}/api/jobs?q=RO`, { headers: { cookie } });
  expect(res.status).toBe(200);
  const id = res.headers.get('x-request-id');
  expect(id).toMatch(/^[0-9a-f-]{36}$/);
  await expect.poll(() => server.lines.some((l) => l.includes(id!)), { timeout: 5_000 }).toBe(true);
  const line = JSON.parse(server.lines.find((l) => l.includes(id!))!);
  expect(line).toMatchObject({ requestId: id, method: 'GET', route: '/api/jobs', status: 200, msg: 'request' });
  expect(typeof line.ms).toBe('number');
  expect(line.shopId).toBeTruthy();
  expect(line.memberId).toBeTruthy();
  // Nothing of the session reaches the log.
  const token = cookie.split(';').map((c) => c.trim().split('=')[1]).filter(Boolean);
  for (const t of token) expect(server.lines.join('\n')).not.toContain(t.slice(0, 20));
  // A refused request is logged too, with no shop.
  const anon = await fetch(`${BASE}/api/jobs`);
  const anonId = anon.headers.get('x-request-id')!;
  await expect.poll(() => server.lines.some((l) => l.includes(anonId)), { timeout: 5_000 }).toBe(true);
  expect(JSON.parse(server.lines.find((l) => l.includes(anonId))!)).toMatchObject({ status: 401, route: '/api/jobs' });
  // better-auth's own line for a wrong password: JSON through the same log, with that request's id.
  const wrong = await fetch(`${BASE}/api/auth/sign-in/email`, { method: 'POST', headers: { origin: BASE, 'content-type': 'application/json' }, body: JSON.stringify(wrongPassword) });
  const wrongId = wrong.headers.get('x-request-id')!;
  await expect.poll(() => server.lines.some((l) => l.includes(wrongId) && l.includes('better-auth')), { timeout: 5_000 }).toBe(true);
  expect(JSON.parse(server.lines.find((l) => l.includes(wrongId) && l.includes('better-auth'))!)).toMatchObject({ requestId: wrongId, source: 'better-auth', level: 40 });
  // None of better-auth's own coloured lines.
  expect(server.lines.filter((l) => l.includes('[Better Auth]'))).toEqual([]);
});
