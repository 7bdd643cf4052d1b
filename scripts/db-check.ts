/**
 * npm run db:check [-- --json] [--orphans | --remove-orphans]: opens the database (embedded, or DATABASE_URL) and
 * checks every stored capture against its SHA-256; with captures in object storage, lists (or removes) the
 * objects no capture references. Exit 0 when all is whole, 1 when something is not (or orphans are listed),
 * 2 when the database cannot be opened, 3 when the bucket cannot be listed.
 */
import { dataDir, openDatabase } from '../db/client';
import { checkIntegrity } from '../db/integrity';
import { captureStoreTarget, ListDeniedError } from '../db/object-store';
import { findOrphans, ORPHAN_MIN_AGE_MS, removeOrphans } from '../db/orphans';
import { cliArgs } from './cli-args';
import { progress } from './progress';

const { values } = cliArgs(
  `Usage: npm run db:check -- [--json] [--orphans | --remove-orphans] [--min-age-minutes N]

Opens the database (embedded, or DATABASE_URL) and checks every stored capture against the SHA-256 recorded at
upload. Exit 0 when all is whole, 1 when something is not, 2 when the database cannot be opened.

  --orphans           also list the objects under CAPTURE_STORE's prefix that no capture references and that
                      are older than an hour (an instance stopped between an object and its record leaves one);
                      exit 1 when there are any
  --remove-orphans    remove those objects, with an activity line per shop
  --min-age-minutes   how old an unreferenced object must be to count (default 60)
  --json              one JSON object on stdout
  --help              this text

Exit 3 when the bucket cannot be listed (the sentence names the permission).`,
  {
    json: { type: 'boolean', default: false },
    orphans: { type: 'boolean', default: false },
    'remove-orphans': { type: 'boolean', default: false },
    'min-age-minutes': { type: 'string' },
  },
  0,
);
const json = !!values.json;
const removing = !!values['remove-orphans'];
const listing = removing || !!values.orphans;
const minAge = values['min-age-minutes'] === undefined ? ORPHAN_MIN_AGE_MS : Number(values['min-age-minutes']) * 60_000;
if (!Number.isFinite(minAge) || minAge < 0) {
  console.error(`--min-age-minutes takes a number of minutes, 0 or more; it was "${values['min-age-minutes']}".`);
  process.exit(2);
}
const target = listing ? captureStoreTarget() : null;
if (listing && !target) {
  console.error('Captures are kept in the database (CAPTURE_STORE is not set), so there is no bucket to look for orphans in.');
  process.exit(2);
}
const line = progress('Checking captures');
line.step('opening the database');
let d;
try {
  d = await openDatabase(process.env.DATABASE_URL ? { url: process.env.DATABASE_URL } : { dataDir: dataDir() });
} catch (e) {
  line.done();
  console.error(`The database could not be opened: ${(e as Error).message}`);
  process.exit(2);
}
const report = await checkIntegrity(d.db, line.update);
let orphans: Awaited<ReturnType<typeof findOrphans>> = [];
if (target) {
  line.step('listing the bucket');
  try {
    orphans = await findOrphans(d.db, target, minAge);
    if (removing) await removeOrphans(d.db, target, orphans);
  } catch (e) {
    line.done();
    await d.close();
    console.error(e instanceof ListDeniedError ? e.message : `The bucket could not be listed: ${(e as Error).message}`);
    process.exit(3);
  }
}
line.done();
await d.close();
if (json) {
  console.log(JSON.stringify({ ...report, ...(target ? { orphans: orphans.map((o) => ({ ...o, lastModified: o.lastModified.toISOString() })), orphansRemoved: removing } : {}) }));
} else {
  for (const c of report.captures.filter((x) => !x.ok)) console.log(`${c.fileName} (${c.id}): ${c.problem}.`);
  for (const a of report.mismatchedAnalyses) console.log(`Analysis ${a} names a file hash that is not its capture's.`);
  console.log(
    report.ok
      ? `All ${report.captures.length} captures are whole (SHA-256 checked); ${report.analyses.length} saved analyses match their files.`
      : 'Some stored data is not whole (above): restore it from a backup (npm run db:restore).',
  );
  if (target) {
    for (const o of orphans) console.log(`${removing ? 'Removed' : 'Unreferenced'}: ${o.url} (${o.size} bytes, written ${o.lastModified.toISOString()})`);
    const bytes = orphans.reduce((n, o) => n + o.size, 0);
    console.log(
      orphans.length === 0
        ? 'No object in the bucket lacks its capture.'
        : removing
          ? `Removed ${orphans.length} unreferenced object(s), ${bytes} bytes; the shops' activity records it.`
          : `${orphans.length} object(s), ${bytes} bytes, belong to no capture: run with --remove-orphans to remove them.`,
    );
  }
}
process.exit(!report.ok || (orphans.length > 0 && !removing) ? 1 : 0);
