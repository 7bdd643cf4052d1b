/**
 * The server with CAPTURE_STORE pointing at a real S3-compatible server (s3rver, started here on a free port):
 * an upload through the API lands as one object whose SHA-256 is the file's (FIPS 180-4, node:crypto), the raw
 * route streams it back, Save analyses it from there, an owner's job removal deletes it, and db:check reads the
 * bucket. Runs in the PostgreSQL pass too.
 */
import { execFile } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { expect, test } from '@playwright/test';
import { exited, freePort, signInCookie, startApp, waitReady } from '../../scripts/app-server';
import { createDatabase } from '../../scripts/pg-server.mjs';
import { type LocalS3, startLocalS3 } from '../support/s3-server';

const DATA = '.e2e/object-store';
const REAL_NAME = 'i4-noisy-current-sync.csv';
const REAL = readFileSync(join('samples', REAL_NAME));
const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

/** Every object file under s3rver's folder. */
function objectFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? objectFiles(join(dir, e.name)) : e.name.endsWith('._S3rver_object') ? [join(dir, e.name)] : []));
}

test.describe.configure({ mode: 'serial' });
let s3: LocalS3;
let server: ReturnType<typeof startApp>;
let env: Record<string, string>;

test.beforeAll(async () => {
  test.setTimeout(180_000);
  rmSync(DATA, { recursive: true, force: true });
  s3 = await startLocalS3('crankprint-e2e', 'shops');
  env = { ...s3.env, CRANKPRINT_DATA_DIR: DATA };
  if (process.env.CRANKPRINT_TEST_PG_URL) env.DATABASE_URL = await createDatabase(process.env.CRANKPRINT_TEST_PG_URL, 'objects');
  server = startApp(await freePort(), env);
  await waitReady(server);
});

test.afterAll(async () => {
  if (server && server.child.exitCode === null) {
    server.child.kill('SIGTERM');
    await exited(server.child);
  }
  await s3?.close();
});

test('upload → one object with the file’s SHA-256 → read back → Save → owner removes the job → object gone; db:check reads the bucket', async () => {
  const base = server.base;
  const tech = await signInCookie(base, 'tech@demo.crankprint.test');
  const owner = await signInCookie(base, 'owner@demo.crankprint.test');
  const api = (cookie: string, path: string, init: RequestInit = {}) => fetch(`${base}${path}`, { ...init, headers: { origin: base, cookie, ...init.headers } });

  const { jobs } = (await (await api(tech, '/api/jobs')).json()) as { jobs: { id: string; vehicle: { id: string; engine: { cylinders: number; firingOrder: number[] } } }[] };
  const job = jobs.find((j) => j.vehicle.engine.cylinders === 4 && j.vehicle.engine.firingOrder.join('') === '1342');
  expect(job, 'a demo job on an inline four firing 1-3-4-2').toBeTruthy();

  const up = await api(tech, `/api/jobs/${job!.id}/captures`, {
    method: 'POST',
    headers: { 'content-type': 'text/csv', 'x-file-name': encodeURIComponent(`ü—“100%” 日本 🚗 ${REAL_NAME}`) },
    body: REAL,
  });
  expect(up.status, await up.clone().text()).toBe(200);
  const { capture } = (await up.json()) as { capture: { id: string; sha256: string } };
  expect(capture.sha256).toBe(sha(REAL));

  // The object is in the bucket under the shop, with the file's bytes (s3rver keeps each object as a file).
  const objectFile = (captureId: string) => objectFiles(s3.dir).find((p) => p.includes(`${captureId}.txt`));
  expect(objectFile(capture.id)).toBeTruthy();
  expect(sha(readFileSync(objectFile(capture.id)!))).toBe(sha(REAL));

  const raw = await api(tech, `/api/captures/${capture.id}/raw`);
  expect(raw.status).toBe(200);
  expect(raw.headers.get('x-content-sha256')).toBe(sha(REAL));
  expect(sha(new Uint8Array(await raw.arrayBuffer()))).toBe(sha(REAL));

  // Save runs the engine on the stored object (samples/README.md: inline four, firing 1-3-4-2, cylinder 1 low).
  const settings = { engine: { cylinders: 4, layout: 'inline', firingOrder: [1, 3, 4, 2] } };
  const saved = await api(tech, `/api/captures/${capture.id}/analyses`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ settings }) });
  expect(saved.status, await saved.clone().text()).toBe(200);
  const { analysis } = (await saved.json()) as { analysis: { fileSha256: string; result: { cylinders: unknown[] } } };
  expect(analysis.fileSha256).toBe(sha(REAL));
  expect(analysis.result.cylinders).toHaveLength(4);
  expect((analysis.result.cylinders as { status: string }[])[0].status).toBe('low');

  // The same file on a second job of the same vehicle stays when the first job goes.
  const made = await api(tech, '/api/jobs', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ repairOrder: 'OBJ-KEEP', concern: 'keep this one', vehicleId: job!.vehicle.id }) });
  expect(made.status, await made.clone().text()).toBe(200);
  const other = ((await made.json()) as { job: { id: string } }).job;
  const again = await api(tech, `/api/jobs/${other.id}/captures`, { method: 'POST', headers: { 'content-type': 'text/csv', 'x-file-name': REAL_NAME }, body: REAL });
  expect(again.status, await again.clone().text()).toBe(200);
  const kept = ((await again.json()) as { capture: { id: string } }).capture;

  // A technician may not remove a job; the owner may, and the object goes with it.
  expect((await api(tech, `/api/jobs/${job!.id}`, { method: 'DELETE' })).status).toBe(403);
  const removed = await api(owner, `/api/jobs/${job!.id}`, { method: 'DELETE' });
  expect(removed.status, await removed.clone().text()).toBe(200);
  expect(((await removed.json()) as { removed: { captures: number } }).removed.captures).toBeGreaterThanOrEqual(1);
  expect((await api(tech, `/api/captures/${capture.id}/raw`)).status).toBe(404);
  expect((await api(owner, `/api/jobs/${job!.id}`, { method: 'DELETE' })).status).toBe(404);
  expect(existsSync(objectFile(capture.id)!)).toBe(false);
  expect(objectFile(kept.id)).toBeTruthy();

  // db:check on the same database, with the server stopped (the embedded database serves one process).
  server.child.kill('SIGTERM');
  await exited(server.child);
  const check = await new Promise<{ code: number; out: string }>((resolve) =>
    execFile('npx', ['tsx', 'scripts/db-check.ts', '--json'], { env: { ...process.env, ...env } }, (e, out) => resolve({ code: e ? Number(e.code) : 0, out })),
  );
  expect(check.code, check.out).toBe(0);
  const report = JSON.parse(check.out) as { ok: boolean; captures: { id: string; storageUrl: string | null; ok: boolean }[] };
  expect(report.ok).toBe(true);
  expect(report.captures.find((c) => c.id === kept.id)?.storageUrl).toMatch(/^s3:\/\/crankprint-e2e\/shops\//);
});
