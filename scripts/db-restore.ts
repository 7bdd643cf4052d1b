/** npm run db:restore -- file: a backup into an empty data directory (or pg_restore with DATABASE_URL). */
import { spawnSync } from 'node:child_process';
import { restoreEmbedded } from '../db/backup';
import { dataDir } from '../db/client';

const file = process.argv[2];
if (!file) {
  console.error('Give the backup file: npm run db:restore -- crankprint-backup-….tar.gz');
  process.exit(2);
}
if (process.env.DATABASE_URL) {
  const r = spawnSync('pg_restore', ['--clean', '--if-exists', `--dbname=${process.env.DATABASE_URL}`, file], { stdio: 'inherit' });
  process.exit(r.status ?? 1);
}
restoreEmbedded(file, dataDir())
  .then(() => console.log(`Restored ${file} into ${dataDir()}.`))
  .catch((e) => {
    console.error((e as Error).message);
    process.exit(2);
  });
