/** npm run db:restore -- file: a backup into an empty data directory (or pg_restore with DATABASE_URL). */
import { spawnSync } from 'node:child_process';
import { restoreEmbedded } from '../db/backup';
import { dataDir } from '../db/client';
import { cliArgs } from './cli-args';
import { progress } from './progress';

const { positionals } = cliArgs(
  `Usage: npm run db:restore -- FILE

Restores a backup made by db:backup into an empty CRANKPRINT_DATA_DIR, or with DATABASE_URL set runs
pg_restore --clean from FILE.

  FILE     the backup to restore
  --help   this text`,
  {},
  1,
);
const file = positionals[0];
if (!file) {
  console.error('Give the backup file: npm run db:restore -- crankprint-backup-….tar.gz');
  process.exit(2);
}
if (process.env.DATABASE_URL) {
  const r = spawnSync('pg_restore', ['--clean', '--if-exists', `--dbname=${process.env.DATABASE_URL}`, file], { stdio: 'inherit' });
  process.exit(r.status ?? 1);
}
const line = progress('Restoring');
line.step(`unpacking ${file} into ${dataDir()}`);
restoreEmbedded(file, dataDir())
  .then(() => {
    line.done();
    console.log(`Restored ${file} into ${dataDir()}.`);
  })
  .catch((e) => {
    line.done();
    console.error((e as Error).message);
    process.exit(2);
  });
