/**
 * The demo (`npm run demo`, development mode) on ports of the caller's choosing: PORT drives the app, its
 * sign-in origin and the banner; a busy mail-sink port is reported and a free one taken; Ctrl-C (SIGINT)
 * stops every process it started; a child that dies takes the rest down with it.
 */
import { type ChildProcess, execFileSync, spawn } from 'node:child_process';
import { rmSync } from 'node:fs';
import { createServer, type Server } from 'node:net';
import { expect, test } from '@playwright/test';
import { exited } from '../../scripts/app-server';

test.skip(!!process.env.CRANKPRINT_TEST_PG_URL, 'the demo runs on the embedded database');
test.describe.configure({ mode: 'serial' });

const DATA = '.e2e/demo';

/** A port the system says is free, and a listener holding another one busy. */
function listen(port = 0): Promise<Server> {
  return new Promise((resolve) => {
    const s = createServer();
    s.listen(port, '127.0.0.1', () => resolve(s));
  });
}
const portOf = (s: Server) => (s.address() as { port: number }).port;

function startDemo(env: Record<string, string>): { child: ChildProcess; out: () => string } {
  let out = '';
  const child = spawn(process.execPath, ['scripts/dev.mjs'], {
    stdio: ['ignore', 'pipe', 'pipe'],
    env: { ...process.env, CRANKPRINT_DATA_DIR: DATA, MAIL_SINK_DIR: `${DATA}/mail`, BETTER_AUTH_URL: '', ...env },
  });
  child.stdout!.on('data', (d) => (out += String(d)));
  child.stderr!.on('data', (d) => (out += String(d)));
  return { child, out: () => out };
}

/** The process groups the demo's children lead (each child is spawned detached). */
function childGroups(pid: number): number[] {
  const rows = execFileSync('ps', ['-eo', 'pid=,ppid=,pgid='], { encoding: 'utf8' }).trim().split('\n').map((l) => l.trim().split(/\s+/).map(Number));
  return rows.filter(([, ppid]) => ppid === pid).map(([, , pgid]) => pgid);
}
function alive(groups: number[]): number[] {
  const rows = execFileSync('ps', ['-eo', 'pgid='], { encoding: 'utf8' }).trim().split('\n').map((l) => Number(l.trim()));
  return rows.filter((g) => groups.includes(g));
}

test('PORT drives the app and its sign-in; a busy mail port is reported and another taken; Ctrl-C leaves no process behind', async () => {
  test.setTimeout(240_000);
  rmSync(DATA, { recursive: true, force: true });
  const free = await listen();
  const appPort = portOf(free);
  free.close();
  const busy = await listen();
  const demo = startDemo({ PORT: String(appPort), MAIL_SINK_PORT: String(portOf(busy)) });
  try {
    const base = `http://127.0.0.1:${appPort}`;
    await expect.poll(() => fetch(`${base}/sign-in`).then((r) => r.status, () => 0), { timeout: 180_000, intervals: [1000] }).toBe(200);
    expect(demo.out()).toContain(`Crankprint: ${base}`);
    expect(demo.out()).toMatch(new RegExp(`port ${portOf(busy)} \\(the mail sink\\) is in use; using \\d+ instead`));
    // Sign-in works on this port: the auth origin followed PORT.
    const res = await fetch(`${base}/api/auth/sign-in/email`, { method: 'POST', headers: { origin: base, 'content-type': 'application/json' }, body: JSON.stringify({ email: 'tech@demo.crankprint.test', password: 'crank-demo-2026' }) });
    expect(res.status).toBe(200);
    const groups = childGroups(demo.child.pid!);
    expect(groups).toHaveLength(2);
    demo.child.kill('SIGINT');
    expect(await exited(demo.child)).toBe(0);
    await expect.poll(() => alive(groups), { timeout: 15_000 }).toEqual([]);
  } finally {
    busy.close();
    demo.child.kill('SIGKILL');
  }
});

test('when one child dies, the demo stops the other and exits non-zero', async () => {
  test.setTimeout(120_000);
  const free = await listen();
  const appPort = portOf(free);
  free.close();
  const demo = startDemo({ PORT: String(appPort) });
  await expect.poll(() => demo.out(), { timeout: 60_000 }).toContain('mail sink: smtp://');
  const groups = childGroups(demo.child.pid!);
  expect(groups).toHaveLength(2);
  // Kill the mail sink (the first child) as a crash would.
  process.kill(-groups[0], 'SIGKILL');
  expect(await exited(demo.child)).not.toBe(0);
  expect(demo.out()).toContain('the mail sink stopped');
  await expect.poll(() => alive(groups), { timeout: 15_000 }).toEqual([]);
});
