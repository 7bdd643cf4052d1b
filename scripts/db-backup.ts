/** npm run db:backup -- [file]: the embedded database to a gzip tarball (or pg_dump with DATABASE_URL). */
import { spawnSync } from 'node:child_process';
import { backupEmbedded } from '../db/backup';
import { dataDir } from '../db/client';
import { cliArgs } from './cli-args';
import { progress } from './progress';

const { positionals } = cliArgs(
  `Usage: npm run db:backup -- [FILE]

Copies the embedded database (CRANKPRINT_DATA_DIR, default .data) to FILE, a gzip tarball, or with DATABASE_URL
set runs pg_dump into FILE. Stop the app first: the embedded database serves one process.

  FILE     where to write (default crankprint-backup-DATE.tar.gz, or .dump with DATABASE_URL)
  --help   this text`,
  {},
  1,
);
const file = positionals[0] ?? `crankprint-backup-${new Date().toISOString().slice(0, 19).replace(/[:T]/g, '-')}.${process.env.DATABASE_URL ? 'dump' : 'tar.gz'}`;
if (process.env.DATABASE_URL) {
  const r = spawnSync('pg_dump', ['--format=custom', `--file=${file}`, process.env.DATABASE_URL], { stdio: 'inherit' });
  process.exit(r.status ?? 1);
}
const line = progress('Backing up');
line.step(`copying ${dataDir()} (this takes a while for a large database)`);
backupEmbedded(dataDir(), file)
  .then((bytes) => {
    line.done();
    console.log(`Backed up ${dataDir()} to ${file} (${(bytes / 1048576).toFixed(1)} MB).`);
  })
  .catch((e) => {
    line.done();
    console.error((e as Error).message);
    process.exit(2);
  });
