/**
 * Backup and restore of the embedded database: PGlite's own data-directory dump (a gzip tarball), taken under
 * the same PID lock as the app, so a running server is never copied half-written. A restore goes into an empty
 * directory only. Captures kept in object storage are copied beside the dump (FILE.objects/, one file per
 * capture and a manifest) and put back on restore, each checked against its SHA-256 both ways.
 */
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { PGlite } from '@electric-sql/pglite';
import { acquireLock } from './lock';
import { headObject, putObject, readObject } from './object-store';

/** A capture whose bytes are in object storage, as the database records it. */
export interface ObjectRow {
  id: string;
  storageUrl: string;
  sha256: string;
  sizeBytes: number;
}

/** The SQL that lists them (the same on PGlite and PostgreSQL). */
export const OBJECT_ROWS_SQL = 'select id, storage_url as "storageUrl", sha256, size_bytes as "sizeBytes" from captures where storage_url is not null order by created_at';

/** Where a backup's objects go: beside the backup file. */
export const objectsDirFor = (backupFile: string) => `${backupFile}.objects`;

const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

/** Copies each object into `dir` and checks it against its recorded SHA-256; `onProgress` hears (done, total). */
export async function backupObjects(rows: ObjectRow[], dir: string, onProgress?: (done: number, total: number) => void): Promise<number> {
  if (rows.length === 0) return 0;
  mkdirSync(dir, { recursive: true });
  for (const [i, r] of rows.entries()) {
    const bytes = Buffer.concat(await readObject(r.storageUrl));
    if (sha(bytes) !== r.sha256) throw new Error(`${r.storageUrl} does not match the SHA-256 recorded at upload; run npm run db:check.`);
    writeFileSync(join(dir, r.id), bytes);
    onProgress?.(i + 1, rows.length);
  }
  writeFileSync(join(dir, 'manifest.json'), JSON.stringify({ objects: rows }, null, 1));
  return rows.length;
}

/** Puts back every object of a backup that is missing or different in storage; returns how many were written. */
export async function restoreObjects(dir: string, onProgress?: (done: number, total: number) => void): Promise<{ written: number; present: number }> {
  const manifest = join(dir, 'manifest.json');
  if (!existsSync(manifest)) return { written: 0, present: 0 };
  const { objects } = JSON.parse(readFileSync(manifest, 'utf8')) as { objects: ObjectRow[] };
  let written = 0;
  for (const [i, r] of objects.entries()) {
    const head = await headObject(r.storageUrl);
    if (!(head && head.size === r.sizeBytes && head.sha256 === r.sha256)) {
      const bytes = readFileSync(join(dir, r.id));
      if (sha(bytes) !== r.sha256) throw new Error(`${join(dir, r.id)} does not match its SHA-256; this backup's copy of the capture is damaged.`);
      await putObject(r.storageUrl, [bytes], { sha256: r.sha256, contentType: 'text/plain' });
      written++;
    }
    onProgress?.(i + 1, objects.length);
  }
  return { written, present: objects.length - written };
}

/** Dumps the embedded database to `outFile`; returns its size and the captures whose bytes are in object storage. */
export async function backupEmbedded(dataDir: string, outFile: string): Promise<{ bytes: number; objects: ObjectRow[] }> {
  const dir = resolve(dataDir);
  if (!existsSync(join(dir, 'pglite'))) throw new Error(`There is no embedded database in ${dir}.`);
  const release = acquireLock(join(dir, 'pglite.lock'), dir);
  try {
    const pg = new PGlite(join(dir, 'pglite'));
    await pg.waitReady;
    const dump = await pg.dumpDataDir('gzip');
    const objects = (await pg.query<ObjectRow>(OBJECT_ROWS_SQL).catch(() => ({ rows: [] as ObjectRow[] }))).rows;
    await pg.close();
    const bytes = new Uint8Array(await dump.arrayBuffer());
    writeFileSync(outFile, bytes);
    return { bytes: bytes.length, objects };
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
