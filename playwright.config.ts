import { defineConfig } from '@playwright/test';

/**
 * End-to-end tests in Debian's Chromium (/usr/bin/chromium; no browser is ever downloaded) against
 * the built app that `npm test` starts on loopback (BASE_URL). One worker: the machine has 2 cores
 * and the server needs one of them.
 */
export default defineConfig({
  testDir: './e2e',
  fullyParallel: false,
  workers: 1,
  forbidOnly: true,
  retries: 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  reporter: [['list'], ['json', { outputFile: process.env.PLAYWRIGHT_JSON_OUTPUT_NAME ?? '.data/test/e2e-results.json' }]],
  outputDir: '.data/test/e2e-artifacts',
  use: {
    baseURL: process.env.BASE_URL ?? 'http://127.0.0.1:3100',
    screenshot: 'only-on-failure',
    trace: 'off',
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
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
