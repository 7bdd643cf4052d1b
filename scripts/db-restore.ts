/** npm run db:restore -- file: a backup into an empty data directory (or pg_restore with DATABASE_URL), objects put back. */
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { objectsDirFor, restoreEmbedded, restoreObjects } from '../db/backup';
import { dataDir } from '../db/client';
import { cliArgs } from './cli-args';
import { progress } from './progress';

const { positionals } = cliArgs(
  `Usage: npm run db:restore -- FILE

Restores a backup made by db:backup into an empty CRANKPRINT_DATA_DIR, or with DATABASE_URL set runs
pg_restore --clean from FILE. When FILE.objects/ is beside it, the captures it holds are put back into object
storage where they are missing or different (each checked against its SHA-256).

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
const line = progress('Restoring');
try {
  if (process.env.DATABASE_URL) {
    const r = spawnSync('pg_restore', ['--clean', '--if-exists', `--dbname=${process.env.DATABASE_URL}`, file], { stdio: 'inherit' });
    if (r.status !== 0) throw new Error(`pg_restore failed (exit ${r.status ?? 'signal'}).`);
  } else {
    line.step(`unpacking ${file} into ${dataDir()}`);
    await restoreEmbedded(file, dataDir());
  }
  const objects = objectsDirFor(file);
  const put = existsSync(objects) ? (line.step('putting captures back into object storage'), await restoreObjects(objects, line.update)) : null;
  line.done();
  console.log(`Restored ${file}${process.env.DATABASE_URL ? '' : ` into ${dataDir()}`}.`);
  if (put) console.log(`Object storage: ${put.written} capture(s) put back, ${put.present} already there and whole.`);
} catch (e) {
  line.done();
  console.error((e as Error).message);
  process.exit(2);
}
