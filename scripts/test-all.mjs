// The README's test command. First pass, on the embedded database: unit and integration tests (vitest), then
// the browser tests (Playwright) against `npm start`. Second pass, when PostgreSQL's server programs are
// installed (CI installs them): a throwaway PostgreSQL server, and every test that touches a database again
// with DATABASE_URL on it. Ends with one line "N passed, N failed".
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { findPgBin, startPgServer } from './pg-server.mjs';

mkdirSync('artifacts', { recursive: true });
let passed = 0;
let failed = 0;

/** Tests that touch no database (the engine, the PDF layout) run in the first pass only. */
const DB_TESTS = ['tests/db', 'tests/report', 'tests/security'];

function vitest(label, files, env) {
  const out = `artifacts/vitest-${label}.json`;
  rmSync(out, { force: true });
  const run = spawnSync('npx', ['vitest', 'run', ...files, '--reporter=default', '--reporter=json', `--outputFile.json=${out}`], { stdio: 'inherit', env });
  if (!existsSync(out)) return void (failed += 1);
  const r = JSON.parse(readFileSync(out, 'utf8'));
  passed += r.numPassedTests;
  failed += r.numFailedTests;
  if (r.numTotalTests === 0 || (run.status !== 0 && r.numFailedTests === 0)) failed += 1;
  console.log(`vitest (${label}): ${r.numPassedTests} passed, ${r.numFailedTests} failed`);
}

function playwright(label, env) {
  const out = `artifacts/playwright-${label}.json`;
  rmSync(out, { force: true });
  const run = spawnSync('npx', ['playwright', 'test'], { stdio: 'inherit', env: { ...env, PLAYWRIGHT_JSON_OUTPUT_NAME: out } });
  if (!existsSync(out)) return void (failed += 1);
  const r = JSON.parse(readFileSync(out, 'utf8'));
  passed += r.stats.expected;
  failed += r.stats.unexpected;
  if (run.status !== 0 && r.stats.unexpected === 0) failed += 1;
  console.log(`playwright (${label}): ${r.stats.expected} passed, ${r.stats.unexpected} failed, ${r.stats.skipped} skipped`);
}

/** Newest modification time under the app's source folders. */
function newestSource() {
  let newest = 0;
  const walk = (dir) => {
    if (!existsSync(dir)) return;
    for (const name of readdirSync(dir)) {
      const p = join(dir, name);
      const st = statSync(p);
      if (st.isDirectory()) walk(p);
      else newest = Math.max(newest, st.mtimeMs);
    }
  };
  for (const d of ['app', 'components', 'db', 'domain', 'server', 'signal', 'workers']) walk(d);
  for (const f of ['next.config.mjs', 'proxy.ts', 'instrumentation.ts', 'server/engine/build.mjs', 'package-lock.json']) if (existsSync(f)) newest = Math.max(newest, statSync(f).mtimeMs);
  return newest;
}

const base = { ...process.env };
delete base.DATABASE_URL;
delete base.CRANKPRINT_TEST_PG_URL;

vitest('embedded', [], base);

// The browser tests run against `npm start`: build first when the build is missing or older than the code.
if (!existsSync('.next/BUILD_ID') || !existsSync('.engine/thread.mjs') || statSync('.next/BUILD_ID').mtimeMs < newestSource()) {
  const build = spawnSync('npm', ['run', 'build'], {
    stdio: 'inherit',
    env: {
      ...base,
      BETTER_AUTH_SECRET: process.env.BETTER_AUTH_SECRET || 'build-only-secret-0123456789abcdef0123456789',
      BETTER_AUTH_URL: process.env.BETTER_AUTH_URL || 'http://127.0.0.1:3210',
      NEXT_TELEMETRY_DISABLED: '1',
    },
  });
  if (build.status !== 0) failed += 1;
}
playwright('embedded', base);

if (findPgBin() && process.env.CRANKPRINT_SKIP_PG !== '1') {
  let server = null;
  try {
    server = startPgServer();
  } catch (e) {
    console.error(`test: could not start PostgreSQL for the second pass: ${e.message}`);
    failed += 1;
  }
  if (server) {
    console.log(`test: second pass on ${server.version}`);
    const env = { ...base, CRANKPRINT_TEST_PG_URL: server.url };
    try {
      vitest('postgres', DB_TESTS, env);
      playwright('postgres', env);
    } finally {
      server.stop();
    }
  }
} else {
  console.log('test: PostgreSQL server programs not installed; the PostgreSQL pass is skipped (CI installs postgresql-15).');
}

console.log(`${passed} passed, ${failed} failed`);
process.exit(failed > 0 ? 1 : 0);
