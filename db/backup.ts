/**
 * Backup and restore of the embedded database: PGlite's own data-directory dump (a gzip tarball), taken under
 * the same PID lock as the app, so a running server is never copied half-written. A restore goes into an empty
 * directory only.
 */
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { PGlite } from '@electric-sql/pglite';
import { acquireLock } from './lock';

export async function backupEmbedded(dataDir: string, outFile: string): Promise<number> {
  const dir = resolve(dataDir);
  if (!existsSync(join(dir, 'pglite'))) throw new Error(`There is no embedded database in ${dir}.`);
  const release = acquireLock(join(dir, 'pglite.lock'), dir);
  try {
    const pg = new PGlite(join(dir, 'pglite'));
    await pg.waitReady;
    const dump = await pg.dumpDataDir('gzip');
    await pg.close();
    const bytes = new Uint8Array(await dump.arrayBuffer());
    writeFileSync(outFile, bytes);
    return bytes.length;
  } finally {
    release();
  }
}

export async function restoreEmbedded(file: string, dataDir: string): Promise<void> {
  const dir = resolve(dataDir);
  if (existsSync(join(dir, 'pglite')) && readdirSync(join(dir, 'pglite')).length > 0) {
    throw new Error(`${join(dir, 'pglite')} is not empty; restore into a new data directory (CRANKPRINT_DATA_DIR) or move the old one aside.`);
  }
  mkdirSync(dir, { recursive: true });
  const release = acquireLock(join(dir, 'pglite.lock'), dir);
  try {
    const blob = new Blob([readFileSync(file)], { type: 'application/x-gzip' });
    const pg = new PGlite(join(dir, 'pglite'), { loadDataDir: blob });
    await pg.waitReady;
    await pg.close();
  } finally {
    release();
  }
}
