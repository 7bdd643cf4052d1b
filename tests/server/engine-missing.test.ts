/**
 * A production server whose engine bundle is missing (a `next build` without the engine step) refuses engine
 * work at once with a sentence that says what to run, instead of every upload waiting for a thread.
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, expect, it, vi } from 'vitest';

const cwd = process.cwd();
afterEach(() => {
  process.chdir(cwd);
  vi.unstubAllEnvs();
});

it('answers 503 with what to run when .engine/thread.mjs is missing', async () => {
  process.chdir(mkdtempSync(join(tmpdir(), 'crankprint-no-engine-')));
  vi.stubEnv('NODE_ENV', 'production');
  vi.resetModules();
  const { screenUpload } = await import('@/server/engine/pool');
  const refused = await screenUpload([new TextEncoder().encode('t,v\n0,1\n')], 8, { engine: { cylinders: 4, firingOrder: [1, 3, 4, 2] } } as never, false).catch((e: unknown) => e);
  expect(refused).toMatchObject({ status: 503, code: 'ENGINE_MISSING' });
  expect((refused as Error).message).toContain('npm run build');
});
