// The README's test command: unit and integration tests (vitest), then browser tests (Playwright) when
// present, ending with one line "N passed, N failed".
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync } from 'node:fs';

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

if (existsSync('playwright.config.ts')) {
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
