/**
 * A production server whose engine bundle is missing, broken or from another engine version (a `next build`
 * without the engine step, or an old .engine/ left behind) refuses engine work within a second with a sentence
 * that says what to run, instead of every upload waiting for a thread; at start, it stops with that sentence.
 */
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, expect, it, vi } from 'vitest';
import { ENGINE_VERSION } from '@/signal';

const cwd = process.cwd();
afterEach(async () => {
  await (await import('@/server/engine/pool')).closeEnginePool();
  process.chdir(cwd);
  vi.unstubAllEnvs();
  vi.restoreAllMocks();
});

/** A production server in an empty folder, with `bundle` as its .engine/thread.mjs when given. */
async function productionPool(bundle?: string) {
  const dir = mkdtempSync(join(tmpdir(), 'crankprint-no-engine-'));
  if (bundle !== undefined) {
    mkdirSync(join(dir, '.engine'));
    writeFileSync(join(dir, '.engine/thread.mjs'), bundle);
  }
  process.chdir(dir);
  vi.stubEnv('NODE_ENV', 'production');
  vi.resetModules();
  return import('@/server/engine/pool');
}

const screen = (pool: Awaited<ReturnType<typeof productionPool>>) =>
  pool.screenUpload([new TextEncoder().encode('t,v\n0,1\n')], 8, { engine: { cylinders: 4, firingOrder: [1, 3, 4, 2] } } as never, false).catch((e: unknown) => e);

it('answers 503 with what to run when .engine/thread.mjs is missing', async () => {
  const refused = await screen(await productionPool());
  expect(refused).toMatchObject({ status: 503, code: 'ENGINE_MISSING' });
  expect((refused as Error).message).toContain('npm run build');
});

it('answers 503 with a reference within a second when the engine thread cannot start', async () => {
  const pool = await productionPool("throw new Error('half-copied bundle');\nexport default () => null;\n");
  const started = performance.now();
  const refused = await screen(pool);
  expect(performance.now() - started).toBeLessThan(1000);
  expect(refused).toMatchObject({ status: 503, code: 'ENGINE_UNAVAILABLE' });
  expect((refused as Error).message).toMatch(/could not start.*reference/);
});

it('answers 503 naming both versions when the bundle is another engine version', async () => {
  const pool = await productionPool("export default async () => ({ ok: true, value: '0.0.1' });\n");
  const refused = await screen(pool);
  expect(refused).toMatchObject({ status: 503, code: 'ENGINE_UNAVAILABLE' });
  expect((refused as Error).message).toContain(`(0.0.1) is not the one this version of Crankprint was built with (${ENGINE_VERSION}): run npm run build`);
});

it('stops the server at start with one sentence when the bundle is missing', async () => {
  await productionPool();
  const written: string[] = [];
  vi.spyOn(process.stderr, 'write').mockImplementation((s) => (written.push(String(s)), true));
  vi.spyOn(process, 'exit').mockImplementation(((code: number) => {
    throw new Error(`exit ${code}`);
  }) as never);
  const { checkStart } = await import('@/server/start-check');
  await expect(checkStart()).rejects.toThrow('exit 1');
  expect(written.join('')).toBe('Crankprint cannot start: the analysis engine is not built (.engine/thread.mjs is missing): run npm run build, then start the server again.\n');
});
