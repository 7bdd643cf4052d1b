import { execFileSync } from 'node:child_process';
import { defineConfig } from '@playwright/test';

/** A port of 127.0.0.1 that nothing holds now (asked of a child process: the config is read synchronously). */
const freePort = () =>
  execFileSync(process.execPath, ['-e', "const s=require('net').createServer();s.listen(0,'127.0.0.1',()=>{process.stdout.write(String(s.address().port));s.close()})"], { encoding: 'utf8' });
// Chosen once, in the runner; the test workers and the web server inherit them.
process.env.E2E_PORT ||= freePort();
process.env.MAIL_SINK_PORT ||= freePort();
const port = process.env.E2E_PORT;
export const BASE_URL = `http://127.0.0.1:${port}`;

export default defineConfig({
  testDir: 'tests/e2e',
  outputDir: 'test-results',
  fullyParallel: false,
  workers: 1,
  timeout: 90_000,
  expect: { timeout: 15_000 },
  reporter: [['list'], ['json', { outputFile: process.env.PLAYWRIGHT_JSON_OUTPUT_NAME || 'artifacts/playwright.json' }]],
  use: {
    baseURL: BASE_URL,
    extraHTTPHeaders: { origin: BASE_URL },
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH || '/usr/bin/chromium',
      args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    },
    screenshot: 'only-on-failure',
    viewport: { width: 1280, height: 860 },
  },
  webServer: {
    command: 'node scripts/e2e-server.mjs',
    url: `${BASE_URL}/sign-in`,
    timeout: 120_000,
    reuseExistingServer: false,
    stdout: 'ignore',
    stderr: 'pipe',
  },
});
