/**
 * Faults on a server of its own (its own port and data directory): kill -9 in the middle of uploads and saves,
 * twenty times; after each restart the database opens, every acknowledged capture is whole (its SHA-256
 * checked by `npm run db:check`), every acknowledged analysis is there, and no capture is partly stored.
 * SIGTERM lets the request under way finish and closes the database (its lock file is gone).
 */
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { request as httpRequest } from 'node:http';
import { existsSync, mkdirSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { expect, test } from '@playwright/test';
import { simulateCranking } from '../../signal/sim/simulate';
import { simToCsv } from '../../signal/sim/to-csv';
import { exited, freePort, signInCookie, startApp, waitReady } from '../../scripts/app-server';
import { DEMO } from './helpers';

// A port nothing holds, chosen before the tests (each server of this file starts on it in turn).
let PORT = 0;
let BASE = '';
const DATA = '.e2e/faults';
const ROUNDS = 20;

const startServer = () => startApp(PORT, { CRANKPRINT_DATA_DIR: DATA, CRANKPRINT_RATE_LIMIT_SCALE: '50' }, { detached: true });
const signIn = () => signInCookie(BASE, DEMO.technician);

interface Check {
  ok: boolean;
  captures: { id: string; sha256: string; ok: boolean; problem?: string }[];
  analyses: { id: string }[];
}

function dbCheck(): Check {
  const r = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/db-check.ts', '--json'], { encoding: 'utf8', env: { ...process.env, CRANKPRINT_DATA_DIR: DATA } });
  expect(r.status, `db:check: ${r.stderr}`).not.toBe(2);
  return JSON.parse(r.stdout);
}

/** A multi-megabyte capture (several chunk rows), made different per call by a last row. */
const base = simToCsv(simulateCranking({ engine: { cylinders: 4, firingOrder: [1, 3, 4, 2] }, leakPerS: [0, 2, 0, 0], channels: ['current', 'sync'], sampleRateHz: 40_000, durationS: 6, seed: 21 }), {
  channels: ['current', 'sync'],
  timeUnit: 's',
});
let serial = 0;
const capture = () => Buffer.from(`${base}6.1${String(++serial).padStart(6, '0')},1.5,0\n`);

test.describe.configure({ mode: 'serial' });
test.skip(!!(process.env.CRANKPRINT_TEST_PG_URL || process.env.DATABASE_URL), "these are the embedded database's faults: a PostgreSQL server has its own write-ahead log and locking");

test.beforeAll(async () => {
  PORT = await freePort();
  BASE = `http://127.0.0.1:${PORT}`;
  rmSync(DATA, { recursive: true, force: true });
  mkdirSync(DATA, { recursive: true });
});

test(`kill -9 during uploads and saves, ${ROUNDS} times: acknowledged captures intact, nothing partial`, async () => {
  test.setTimeout(20 * 60_000);
  const acked = new Map<string, string>();
  const savedAnalyses = new Set<string>();
  let cut = 0;
  let rand = 12345;
  const random = () => ((rand = (rand * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
  for (let round = 0; round < ROUNDS; round++) {
    const server = startServer();
    await waitReady(server);
    const cookie = await signIn();
    const jobs = (await (await fetch(`${BASE}/api/jobs`, { headers: { cookie } })).json()).jobs as { id: string }[];
    let stop = false;
    // The kill is armed once this round's server has answered an upload (its engine threads start on first use),
    // so every round kills a server that is busy with work, not one still warming up.
    let answered: () => void = () => {};
    const firstAnswer = new Promise<void>((r) => (answered = r));
    const worker = async (k: number) => {
      while (!stop) {
        const body = capture();
        const sha = createHash('sha256').update(body).digest('hex');
        try {
          const res = await fetch(`${BASE}/api/jobs/${jobs[k % jobs.length].id}/captures`, { method: 'POST', headers: { cookie, origin: BASE, 'content-type': 'text/csv', 'x-file-name': `fault-${serial}.csv` }, body });
          answered();
          if (res.status !== 200) continue;
          const { capture: c } = await res.json();
          expect(c.sha256).toBe(sha);
          acked.set(c.id, sha);
          const saved = await fetch(`${BASE}/api/captures/${c.id}/analyses`, { method: 'POST', headers: { cookie, origin: BASE, 'content-type': 'application/json' }, body: JSON.stringify({ settings: { engine: { cylinders: 4, firingOrder: [1, 3, 4, 2] } } }) });
          if (saved.status === 200) savedAnalyses.add((await saved.json()).analysis.id);
        } catch {
          cut++;
          return;
        }
      }
    };
    // Two workers upload and save; the third saves analyses again and again on captures already stored.
    const resaver = async () => {
      while (!stop) {
        const ids = [...acked.keys()];
        if (ids.length === 0) {
          await new Promise((r) => setTimeout(r, 50));
          continue;
        }
        try {
          const saved = await fetch(`${BASE}/api/captures/${ids[Math.floor(random() * ids.length)]}/analyses`, { method: 'POST', headers: { cookie, origin: BASE, 'content-type': 'application/json' }, body: JSON.stringify({ settings: { engine: { cylinders: 4, firingOrder: [1, 3, 4, 2] }, lowLimitPercent: 80 + Math.floor(random() * 15) } }) });
          if (saved.status === 200) savedAnalyses.add((await saved.json()).analysis.id);
        } catch {
          cut++;
          return;
        }
      }
    };
    const workers = [worker(0), worker(1), resaver()];
    await Promise.race([firstAnswer, new Promise((r) => setTimeout(r, 15_000))]);
    await new Promise((r) => setTimeout(r, random() * 1500));
    process.kill(-server.child.pid!, 'SIGKILL');
    await exited(server.child);
    stop = true;
    await Promise.all(workers);

    const check = dbCheck();
    const stored = new Map(check.captures.map((c) => [c.id, c]));
    for (const c of check.captures) expect(c.ok, `round ${round}: ${c.id} ${c.problem}`).toBe(true);
    for (const [id, sha] of acked) {
      expect(stored.get(id), `round ${round}: acknowledged capture ${id} is missing`).toBeDefined();
      expect(stored.get(id)!.sha256).toBe(sha);
    }
    const analysisIds = new Set(check.analyses.map((a) => a.id));
    for (const id of savedAnalyses) expect(analysisIds.has(id), `round ${round}: acknowledged analysis ${id} is missing`).toBe(true);
    expect(check.ok).toBe(true);
  }
  console.log(`faults: ${ROUNDS} kills, ${acked.size} acknowledged captures and ${savedAnalyses.size} analyses intact, ${cut} requests cut off mid-flight`);
  // The kills landed while requests were under way, or the test proved nothing.
  expect(cut).toBeGreaterThanOrEqual(ROUNDS);
  expect(acked.size).toBeGreaterThan(0);
});

test('a second process is refused the data directory; SIGTERM finishes the request under way and closes the database', async () => {
  test.setTimeout(180_000);
  const server = startServer();
  await waitReady(server);
  // The lock names the server's process.
  const r = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/db-check.ts'], { encoding: 'utf8', env: { ...process.env, CRANKPRINT_DATA_DIR: DATA } });
  expect(r.status).toBe(2);
  expect(r.stderr).toContain(`in use by process ${server.child.pid}`);

  const cookie = await signIn();
  const jobs = (await (await fetch(`${BASE}/api/jobs`, { headers: { cookie } })).json()).jobs as { id: string }[];
  // One upload first, so the route is loaded and the next one is inside its handler when the signal comes.
  const warm = await fetch(`${BASE}/api/jobs/${jobs[0].id}/captures`, { method: 'POST', headers: { cookie, origin: BASE, 'content-type': 'text/csv', 'x-file-name': 'warm.csv' }, body: capture() });
  expect(warm.status).toBe(200);
  const body = capture();
  const upload = fetch(`${BASE}/api/jobs/${jobs[0].id}/captures`, { method: 'POST', headers: { cookie, origin: BASE, 'content-type': 'text/csv', 'x-file-name': 'sigterm.csv' }, body });
  await new Promise((res) => setTimeout(res, 100));
  server.child.kill('SIGTERM');
  const res = await upload;
  expect(res.status).toBe(200);
  const { capture: c } = await res.json();
  expect(await exited(server.child)).toBe(143);
  expect(existsSync(join(DATA, 'pglite.lock'))).toBe(false);
  const check = dbCheck();
  expect(check.ok).toBe(true);
  expect(check.captures.find((x) => x.id === c.id)?.sha256).toBe(createHash('sha256').update(body).digest('hex'));
});

/** An upload sent slowly, a piece every 200 ms, read with node:http so the answer is heard while still sending. */
function trickle(path: string, cookie: string, body: Buffer): Promise<number> {
  return new Promise((resolve) => {
    const req = httpRequest(`${BASE}${path}`, { method: 'POST', headers: { cookie, origin: BASE, 'content-type': 'text/csv', 'x-file-name': 'slow.csv', 'content-length': body.length } }, (res) => {
      res.resume();
      resolve(res.statusCode ?? 0);
    });
    req.on('error', () => resolve(-1));
    let at = 0;
    const step = () => {
      if (req.destroyed || at >= body.length) return;
      req.write(body.subarray(at, (at += 64 * 1024)));
      if (at < body.length) setTimeout(step, 200);
      else req.end();
    };
    step();
  });
}

test('SIGTERM during ten uploads: each ends 200 or 503 (never 500), new work gets 503, the process exits within 10 s', async () => {
  test.setTimeout(180_000);
  const server = startServer();
  await waitReady(server);
  const cookie = await signIn();
  const jobs = (await (await fetch(`${BASE}/api/jobs`, { headers: { cookie } })).json()).jobs as { id: string }[];
  const path = `/api/jobs/${jobs[0].id}/captures`;
  expect((await fetch(`${BASE}${path}`, { method: 'POST', headers: { cookie, origin: BASE, 'content-type': 'text/csv', 'x-file-name': 'warm.csv' }, body: capture() })).status).toBe(200);
  const bodies = Array.from({ length: 9 }, () => capture());
  const fast = bodies.map((body, k) =>
    fetch(`${BASE}${path}`, { method: 'POST', headers: { cookie, origin: BASE, 'content-type': 'text/csv', 'x-file-name': `drain-${k}.csv` }, body }).then(
      async (r) => ({ status: r.status, id: r.status === 200 ? ((await r.json()).capture.id as string) : null, sha: createHash('sha256').update(body).digest('hex') }),
      () => ({ status: -1, id: null, sha: '' }),
    ),
  );
  // Sixty seconds of sending at this pace: still under way when the server has to stop.
  const slow = trickle(path, cookie, Buffer.concat([capture(), Buffer.alloc(20 * 1024 * 1024, 0x0a)]));
  await new Promise((r) => setTimeout(r, 400));
  const t0 = Date.now();
  server.child.kill('SIGTERM');
  // New work is turned away once the signal is handled (the event loop may be busy with an analysis first).
  let late: number | string = 0;
  for (let i = 0; i < 50 && late !== 503 && late !== 'refused'; i++) {
    await new Promise((r) => setTimeout(r, 100));
    late = await fetch(`${BASE}/api/health`).then((r) => r.status, () => 'refused');
  }
  expect([503, 'refused']).toContain(late);
  const code = await exited(server.child);
  const took = Date.now() - t0;
  const answers = await Promise.all(fast);
  const slowStatus = await slow;
  console.log(`drain: exit ${code} after ${took} ms; fast uploads ${answers.map((a) => a.status).join(' ')}; slow upload ${slowStatus}`);
  expect(code).toBe(143);
  expect(took).toBeLessThan(10_000);
  for (const a of answers) expect([200, 503]).toContain(a.status);
  expect(slowStatus).toBe(503);
  // What was acknowledged is stored whole; nothing else is.
  const check = dbCheck();
  expect(check.ok).toBe(true);
  const stored = new Map(check.captures.map((c) => [c.id, c.sha256]));
  for (const a of answers.filter((x) => x.id)) expect(stored.get(a.id!)).toBe(a.sha);
});

test('a second server on the same data directory refuses to start, naming the process that holds it', async () => {
  test.setTimeout(180_000);
  const server = startServer();
  await waitReady(server);
  const { spawn } = await import('node:child_process');
  const second = spawn(process.execPath, ['server/serve.mjs'], {
    stdio: ['ignore', 'ignore', 'pipe'],
    env: { ...process.env, PORT: '0', CRANKPRINT_DATA_DIR: DATA, NEXT_TELEMETRY_DISABLED: '1', BETTER_AUTH_SECRET: 'child-server-secret-0123456789abcdef0123456789' },
  });
  let stderr = '';
  second.stderr!.on('data', (d) => (stderr += String(d)));
  const code = await new Promise<number | null>((res) => {
    const timer = setTimeout(() => {
      second.kill('SIGKILL');
      res(null);
    }, 90_000);
    second.on('exit', (c) => {
      clearTimeout(timer);
      res(c);
    });
  });
  expect(code, stderr).not.toBeNull();
  expect(code).not.toBe(0);
  expect(stderr).toContain(`in use by process ${server.child.pid}`);
  expect(stderr.trim().split('\n').filter((l) => l.startsWith('Crankprint cannot start'))).toHaveLength(1);
  server.child.kill('SIGTERM');
  await exited(server.child);
});
