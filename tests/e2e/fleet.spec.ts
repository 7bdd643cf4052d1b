/**
 * A fleet on one PostgreSQL database (the PostgreSQL pass only).
 * - Three instances started at the same moment on a fresh database all come up: one migrates under the start
 *   lock while the others wait, so the schema is migrated exactly once and the demo shop seeded once.
 * - A member removed or demoted through one instance is refused on another within 1 s (the membership each
 *   instance keeps for a few seconds is dropped by a LISTEN/NOTIFY notice), and a signed-out session at once.
 * - Behind a reverse proxy (tests/support/proxy.ts) on one s3rver bucket: an upload through one instance is
 *   analysed and read through the other, rate limits are shared, and a rolling restart under 20 clients loses no
 *   request (a 503 with Retry-After, sent again, is handled); db:check is whole afterwards.
 */
import { execFile } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { expect, test } from '@playwright/test';
import pg from 'pg';
import { type AppServer, exited, freePort, signInCookie, startApp, waitReady } from '../../scripts/app-server';
import { createDatabase } from '../../scripts/pg-server.mjs';
import { type LocalProxy, startProxy } from '../support/proxy';
import { type LocalS3, startLocalS3 } from '../support/s3-server';
import { DEMO } from './helpers';

test.describe.configure({ mode: 'serial' });
test.skip(!process.env.CRANKPRINT_TEST_PG_URL, 'a fleet shares a PostgreSQL server; the embedded database serves one process');

// A real capture (tooth times); each upload adds one more tooth, so no two are the same file.
const TEETH = readFileSync('samples/i4-60-2-tooth-times.csv', 'utf8');
/** Budgets doubled: the tests sign in several times from one address. */
const SCALE = 2;

let url = '';
let env: Record<string, string> = {};
let servers: AppServer[] = [];
let proxy: LocalProxy;
let s3: LocalS3;

test.afterAll(async () => {
  for (const s of servers) {
    if (s.child.exitCode === null) {
      s.child.kill('SIGTERM');
      await exited(s.child);
    }
  }
  await proxy?.close();
  await s3?.close();
});

/** npm run db:check on the fleet's database and bucket, while the instances run (PostgreSQL serves many). */
function runDbCheck(...args: string[]): Promise<{ code: number; out: string }> {
  return new Promise((resolve) =>
    execFile('npx', ['tsx', 'scripts/db-check.ts', '--json', ...args], { env: { ...process.env, ...env } }, (e, out) => resolve({ code: e ? Number(e.code) : 0, out })),
  );
}

/** One request to one instance, as the member whose cookie it carries (with that instance's own origin). */
async function call(s: AppServer, cookie: string, method: string, path: string, body?: unknown): Promise<{ status: number; json: Record<string, unknown> }> {
  // The fleet's public address is the proxy's: requests name it as their origin whichever instance they reach.
  const res = await fetch(`${s.base}${path}`, { method, headers: { cookie, origin: proxy.base, 'content-type': 'application/json' }, body: body === undefined ? undefined : JSON.stringify(body) });
  return { status: res.status, json: (await res.json().catch(() => ({}))) as Record<string, unknown> };
}

/** Milliseconds from now until `request` stops answering `ok` (polled every 20 ms, for at most 10 s). */
async function untilRefused(request: () => Promise<number>, ok: number): Promise<{ ms: number; status: number }> {
  const t0 = performance.now();
  for (;;) {
    const status = await request();
    const ms = performance.now() - t0;
    if (status !== ok || ms > 10_000) return { ms, status };
    await new Promise((r) => setTimeout(r, 20));
  }
}

test('three instances started at once on a fresh database all come up, and the schema is migrated once', async () => {
  test.setTimeout(300_000);
  url = await createDatabase(process.env.CRANKPRINT_TEST_PG_URL!, 'fleet');
  s3 = await startLocalS3('crankprint-fleet', 'shops');
  const ports = await Promise.all([freePort(), freePort(), freePort()]);
  // The proxy takes turns between the first two; the third only shows that three may start at once.
  proxy = await startProxy(ports.slice(0, 2).map((p) => `http://127.0.0.1:${p}`));
  env = { ...s3.env, DATABASE_URL: url, BETTER_AUTH_URL: proxy.base, CRANKPRINT_TRUSTED_PROXIES: '127.0.0.1', CRANKPRINT_RATE_LIMIT_SCALE: String(SCALE) };
  const t0 = performance.now();
  servers = ports.map((p) => startApp(p, env));
  const startedMs = await Promise.all(servers.map(async (s) => (await waitReady(s, 180_000), performance.now() - t0)));
  console.log(`fleet: three instances started at once were ready after ${startedMs.map((ms) => `${(ms / 1000).toFixed(1)} s`).join(', ')}`);
  const db = new pg.Client({ connectionString: url });
  await db.connect();
  try {
    // drizzle-kit's journal lists every migration; the migrator records each one it applied.
    const journal = JSON.parse(readFileSync('db/migrations/meta/_journal.json', 'utf8')) as { entries: unknown[] };
    const applied = await db.query('select hash, count(*)::int as n from drizzle.__drizzle_migrations group by hash');
    expect(applied.rows).toHaveLength(journal.entries.length);
    expect(applied.rows.every((r) => r.n === 1)).toBe(true);
    expect((await db.query('select count(*)::int as n from shops')).rows[0].n).toBe(1);
  } finally {
    await db.end();
  }
  const third = servers.pop()!;
  third.child.kill('SIGTERM');
  await exited(third.child);
});

test('an upload through one instance is analysed and read through the other; rate limits are shared', async () => {
  const [a, b] = servers;
  const tech = await signInCookie(proxy.base, DEMO.technician);
  const { jobs } = (await call(b, tech, 'GET', '/api/jobs')).json as { jobs: { id: string; repairOrder: string }[] };
  const job = jobs[0];
  const up = await fetch(`${a.base}/api/jobs/${job.id}/captures`, { method: 'POST', headers: { cookie: tech, origin: proxy.base, 'content-type': 'text/csv', 'x-file-name': 'fleet-a.csv' }, body: `${TEETH}5.2900000\n` });
  expect(up.status).toBe(200);
  const captureId = ((await up.json()) as { capture: { id: string } }).capture.id;
  const saved = await call(b, tech, 'POST', `/api/captures/${captureId}/analyses`, { settings: { engine: { cylinders: 4, firingOrder: [1, 3, 4, 2] } } });
  expect(saved.status).toBe(200);
  const raw = await fetch(`${b.base}/api/captures/${captureId}/raw`, { headers: { cookie: tech } });
  expect(raw.status).toBe(200);
  expect(await raw.text()).toBe(`${TEETH}5.2900000\n`);
  const report = await call(b, tech, 'GET', `/api/jobs/${job.id}/report`);
  expect(report.status).toBe(200);

  // Failed sign-ins from one client address, sent through the proxy (which takes turns between the instances):
  // the budget is the shop-wide one, not one per instance.
  const budget = 10 * SCALE;
  const statuses: number[] = [];
  for (let k = 0; k < budget + 3; k++) {
    const res = await fetch(`${proxy.base}/api/auth/sign-in/email`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: proxy.base, 'x-forwarded-for': '203.0.113.77' },
      body: JSON.stringify({ email: DEMO.owner, password: 'not-the-password' }),
    });
    statuses.push(res.status);
  }
  expect(statuses.slice(0, budget).every((s) => s === 401)).toBe(true);
  expect(statuses.slice(budget)).toEqual([429, 429, 429]);
});

test('a rolling restart under load from 20 clients loses no request; db:check is whole afterwards', async () => {
  test.setTimeout(420_000);
  const tech = await signInCookie(proxy.base, DEMO.technician);
  const { jobs } = (await call(servers[0], tech, 'GET', '/api/jobs')).json as { jobs: { id: string }[] };
  const job = jobs[1];
  let stop = false;
  let sent = 0;
  let retried = 0;
  const failures: string[] = [];
  let uploads = 0;
  /** One request through the proxy; a 503 with Retry-After is waited out and sent again (up to 20 times). */
  const send = async (method: string, path: string, body?: string, type = 'application/json'): Promise<Response | null> => {
    sent++;
    for (let attempt = 0; attempt < 20; attempt++) {
      let res: Response;
      try {
        res = await fetch(`${proxy.base}${path}`, { method, headers: { cookie: tech, origin: proxy.base, 'content-type': type, 'x-file-name': `load-${sent}.csv` }, body });
      } catch (e) {
        failures.push(`${method} ${path}: ${(e as Error).message}`);
        return null;
      }
      const after = res.headers.get('retry-after');
      if (res.status === 503 && after) {
        await res.arrayBuffer();
        retried++;
        await new Promise((r) => setTimeout(r, Math.min(2, Number(after)) * 1000));
        continue;
      }
      if (!res.ok) failures.push(`${method} ${path}: ${res.status} ${await res.text()}`);
      return res;
    }
    failures.push(`${method} ${path}: still 503 after 20 tries`);
    return null;
  };
  const stored: string[] = [];
  const client = async (k: number) => {
    for (let i = 0; !stop; i++) {
      if ((i + k) % 4 === 0) {
        const res = await send('POST', `/api/jobs/${job.id}/captures`, `${TEETH}${(5.3 + (k * 1e4 + i) / 1e8).toFixed(8)}\n`, 'text/csv');
        if (res?.ok) {
          uploads++;
          stored.push(((await res.json()) as { capture: { id: string } }).capture.id);
        }
      } else if ((i + k) % 4 === 1 && stored.length) {
        await (await send('GET', `/api/captures/${stored[(i * 7) % stored.length]}/raw`))?.arrayBuffer();
      } else if ((i + k) % 4 === 2) {
        await (await send('GET', `/api/jobs/${job.id}/captures`))?.arrayBuffer();
      } else {
        await (await send('GET', '/api/jobs'))?.arrayBuffer();
      }
      await new Promise((r) => setTimeout(r, 50));
    }
  };
  const load = Array.from({ length: 20 }, (_, k) => client(k));
  const restart = async (i: number) => {
    await new Promise((r) => setTimeout(r, 3_000));
    servers[i].child.kill('SIGTERM');
    await exited(servers[i].child);
    servers[i] = startApp(Number(new URL(servers[i].base).port), env);
    await waitReady(servers[i]);
  };
  const t0 = performance.now();
  await restart(0);
  await restart(1);
  await new Promise((r) => setTimeout(r, 3_000));
  stop = true;
  await Promise.all(load);
  console.log(`fleet: rolling restart of both instances in ${((performance.now() - t0) / 1000).toFixed(1)} s under 20 clients: ${sent} requests (${uploads} uploads), ${retried} answered 503 with Retry-After and sent again, ${failures.length} failed`);
  expect(failures).toEqual([]);
  expect(uploads).toBeGreaterThan(20);
  // Every stored capture has its object, and no object lacks its row.
  // Whole, and no object without its capture: the restarts left no orphan (any age counts here).
  const check = await runDbCheck('--orphans', '--min-age-minutes', '0');
  expect(check.code, check.out).toBe(0);
  expect(JSON.parse(check.out).orphans).toEqual([]);
});

test('a member removed or demoted through one instance is refused on another within a second; a signed-out session at once', async () => {
  const [a, b] = servers;
  const owner = await signInCookie(proxy.base, DEMO.owner);
  const advisor = await signInCookie(proxy.base, DEMO.advisor);
  const tech = await signInCookie(proxy.base, DEMO.technician);
  const { members } = (await call(a, owner, 'GET', '/api/shop')).json as { members: { id: string; email: string }[] };
  const memberId = (email: string) => members.find((m) => m.email === email)!.id;
  const { jobs } = (await call(b, tech, 'GET', '/api/jobs')).json as { jobs: { id: string; status: string }[] };
  const job = jobs[0];

  // B remembers both members (its membership cache holds for 5 s without a notice).
  expect((await call(b, advisor, 'GET', '/api/jobs')).status).toBe(200);
  expect((await call(b, tech, 'PATCH', `/api/jobs/${job.id}`, { status: job.status })).status).toBe(200);

  // The owner removes the advisor through A; the advisor's next requests go through B.
  expect((await call(a, owner, 'DELETE', `/api/shop/members/${memberId(DEMO.advisor)}`)).status).toBe(200);
  const removed = await untilRefused(async () => (await call(b, advisor, 'GET', '/api/jobs')).status, 200);
  // The owner makes the technician an advisor through A: editing a job through B is refused.
  expect((await call(a, owner, 'PATCH', `/api/shop/members/${memberId(DEMO.technician)}`, { role: 'advisor' })).status).toBe(200);
  const demoted = await untilRefused(async () => (await call(b, tech, 'PATCH', `/api/jobs/${job.id}`, { status: job.status })).status, 200);
  // A session signed out through A is refused by B (sessions are looked up on every request).
  const second = await signInCookie(proxy.base, DEMO.owner);
  expect((await call(b, second, 'GET', '/api/jobs')).status).toBe(200);
  expect((await call(a, second, 'POST', '/api/auth/sign-out', {})).status).toBe(200);
  const signedOut = await untilRefused(async () => (await call(b, second, 'GET', '/api/jobs')).status, 200);

  console.log(`fleet: refused on the other instance after ${removed.ms.toFixed(0)} ms (member removed), ${demoted.ms.toFixed(0)} ms (role lowered), ${signedOut.ms.toFixed(0)} ms (signed out)`);
  expect(removed.status).not.toBe(200);
  expect(removed.ms).toBeLessThan(1_000);
  expect(demoted.status).toBe(403);
  expect(demoted.ms).toBeLessThan(1_000);
  expect(signedOut.status).toBe(401);
  expect(signedOut.ms).toBeLessThan(1_000);
});
