import { defineConfig } from '@playwright/test';

const port = process.env.E2E_PORT || '3210';
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
