/**
 * npm run db:check [-- --json]: opens the database (embedded, or DATABASE_URL) and checks every stored capture
 * against its SHA-256. Exit 0 when all is whole, 1 when something is not, 2 when the database cannot be opened.
 */
import { dataDir, openDatabase } from '../db/client';
import { checkIntegrity } from '../db/integrity';
import { cliArgs } from './cli-args';
import { progress } from './progress';

const { values } = cliArgs(
  `Usage: npm run db:check -- [--json]

Opens the database (embedded, or DATABASE_URL) and checks every stored capture against the SHA-256 recorded at
upload. Exit 0 when all is whole, 1 when something is not, 2 when the database cannot be opened.

  --json   one JSON object on stdout
  --help   this text`,
  { json: { type: 'boolean', default: false } },
  0,
);
const json = !!values.json;
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
line.done();
await d.close();
if (json) {
  console.log(JSON.stringify(report));
} else {
  for (const c of report.captures.filter((x) => !x.ok)) console.log(`${c.fileName} (${c.id}): ${c.problem}.`);
  for (const a of report.mismatchedAnalyses) console.log(`Analysis ${a} names a file hash that is not its capture's.`);
  console.log(
    report.ok
      ? `All ${report.captures.length} captures are whole (SHA-256 checked); ${report.analyses.length} saved analyses match their files.`
      : 'Some stored data is not whole (above): restore it from a backup (npm run db:restore).',
  );
}
process.exit(report.ok ? 0 : 1);
