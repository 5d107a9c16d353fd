import { defineConfig } from '@playwright/test';

/** Browser tests in Debian's Chromium against a running Crankjournal (ops/test.sh starts it). */
export default defineConfig({
  testDir: '.',
  testMatch: '**/*.e2e.ts',
  timeout: 60_000,
  expect: { timeout: 10_000 },
  fullyParallel: false,
  workers: 1,
  retries: 0,
  reporter: [['list'], ['json', { outputFile: process.env.PLAYWRIGHT_JSON_OUTPUT_NAME ?? '../.data/test-results/browser.json' }]],
  use: {
    baseURL: process.env.BASE_URL ?? 'http://127.0.0.1:3100',
    viewport: { width: 1280, height: 860 },
    screenshot: 'only-on-failure',
    launchOptions: {
      executablePath: '/usr/bin/chromium',
      args: [
        '--headless',
        '--no-sandbox',
        '--disable-gpu',
        '--disable-quic',
        '--no-first-run',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
      ],
    },
  },
});
