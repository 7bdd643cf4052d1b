// The README's test command: unit and integration tests (vitest), then browser tests (Playwright) when
// present, ending with one line "N passed, N failed".
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';

mkdirSync('artifacts', { recursive: true });
let passed = 0;
let failed = 0;

const vitest = spawnSync('npx', ['vitest', 'run', '--reporter=default', '--reporter=json', '--outputFile.json=artifacts/vitest.json'], {
  stdio: 'inherit',
});
if (existsSync('artifacts/vitest.json')) {
  const r = JSON.parse(readFileSync('artifacts/vitest.json', 'utf8'));
  passed += r.numPassedTests;
  failed += r.numFailedTests;
  if (r.numTotalTests === 0 || vitest.status !== 0) failed += r.numFailedTests === 0 ? 1 : 0;
} else {
  failed += 1;
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
  for (const d of ['app', 'components', 'db', 'server', 'signal', 'workers']) walk(d);
  for (const f of ['next.config.mjs', 'tailwind.config.ts', 'package-lock.json']) if (existsSync(f)) newest = Math.max(newest, statSync(f).mtimeMs);
  return newest;
}

if (existsSync('playwright.config.ts')) {
  // The browser tests run against `next start`: build first when the build is missing or older than the code.
  if (!existsSync('.next/BUILD_ID') || statSync('.next/BUILD_ID').mtimeMs < newestSource()) {
    const build = spawnSync('npx', ['next', 'build'], {
      stdio: 'inherit',
      env: {
        ...process.env,
        BETTER_AUTH_SECRET: process.env.BETTER_AUTH_SECRET || 'build-only-secret-0123456789abcdef0123456789',
        BETTER_AUTH_URL: process.env.BETTER_AUTH_URL || 'http://127.0.0.1:3210',
        NEXT_TELEMETRY_DISABLED: '1',
      },
    });
    if (build.status !== 0) failed += 1;
  }
  const pw = spawnSync('npx', ['playwright', 'test'], { stdio: 'inherit', env: { ...process.env, PLAYWRIGHT_JSON_OUTPUT_NAME: 'artifacts/playwright.json' } });
  if (existsSync('artifacts/playwright.json')) {
    const r = JSON.parse(readFileSync('artifacts/playwright.json', 'utf8'));
    passed += r.stats.expected;
    failed += r.stats.unexpected;
    if (pw.status !== 0 && r.stats.unexpected === 0) failed += 1;
  } else {
    failed += 1;
  }
}

console.log(`${passed} passed, ${failed} failed`);
process.exit(failed > 0 ? 1 : 0);
