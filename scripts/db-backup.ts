/** npm run db:backup -- [file]: the database to a file, and captures kept in object storage beside it. */
import { spawnSync } from 'node:child_process';
import pg from 'pg';
import { backupEmbedded, backupObjects, OBJECT_ROWS_SQL, type ObjectRow, objectsDirFor } from '../db/backup';
import { dataDir } from '../db/client';
import { cliArgs } from './cli-args';
import { progress } from './progress';

const { positionals } = cliArgs(
  `Usage: npm run db:backup -- [FILE]

Copies the embedded database (CRANKPRINT_DATA_DIR, default .data) to FILE, a gzip tarball, or with DATABASE_URL
set runs pg_dump into FILE. Captures kept in object storage (CAPTURE_STORE) are copied into FILE.objects/ and
checked against their SHA-256. Stop the app first: the embedded database serves one process.

  FILE     where to write (default crankprint-backup-DATE.tar.gz, or .dump with DATABASE_URL)
  --help   this text`,
  {},
  1,
);
const url = process.env.DATABASE_URL;
const file = positionals[0] ?? `crankprint-backup-${new Date().toISOString().slice(0, 19).replace(/[:T]/g, '-')}.${url ? 'dump' : 'tar.gz'}`;
const line = progress('Backing up');

async function database(): Promise<ObjectRow[]> {
  if (url) {
    const r = spawnSync('pg_dump', ['--format=custom', `--file=${file}`, url], { stdio: 'inherit' });
    if (r.status !== 0) throw new Error(`pg_dump failed (exit ${r.status ?? 'signal'}); nothing more was copied.`);
    const client = new pg.Client({ connectionString: url });
    await client.connect();
    try {
      return (await client.query<ObjectRow>(OBJECT_ROWS_SQL)).rows;
    } finally {
      await client.end();
    }
  }
  line.step(`copying ${dataDir()} (this takes a while for a large database)`);
  const { bytes, objects } = await backupEmbedded(dataDir(), file);
  console.log(`Backed up ${dataDir()} to ${file} (${(bytes / 1048576).toFixed(1)} MB).`);
  return objects;
}

try {
  const objects = await database();
  line.step('copying captures from object storage');
  const copied = await backupObjects(objects, objectsDirFor(file), line.update);
  line.done();
  if (url) console.log(`Backed up the database to ${file}.`);
  if (copied) console.log(`Copied ${copied} capture(s) from object storage to ${objectsDirFor(file)}/ (SHA-256 checked); keep it with ${file}.`);
} catch (e) {
  line.done();
  console.error((e as Error).message);
  process.exit(2);
}
