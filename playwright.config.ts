import { defineConfig } from '@playwright/test';

/**
 * End-to-end tests in Debian's Chromium (never a downloaded browser). The lead's test runner
 * starts the app and gives its address in E2E_BASE_URL.
 */
const baseURL = process.env.E2E_BASE_URL ?? 'http://127.0.0.1:5480';
/** `npm run bench` sets HEADROOM_BENCH=1 to run the bench-only specs (e2e/bench/*.bench.ts) and nothing else. */
const bench = process.env.HEADROOM_BENCH === '1';

export default defineConfig({
  testDir: 'e2e',
  // the e2e suite: *.spec.ts (Playwright's default pattern also takes *.test.ts; there are none); benches never
  testMatch: bench ? '**/*.bench.ts' : '**/*.@(spec|test).?(c|m)[jt]s?(x)',
  outputDir: 'e2e-output/test-results',
  // The tests share one database and build on each other's projects: one worker, in order.
  fullyParallel: false,
  workers: 1,
  forbidOnly: Boolean(process.env.CI),
  retries: 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  reporter: [['list'], ['html', { outputFolder: 'e2e-output/report', open: 'never' }]],
  use: {
    baseURL,
    trace: 'retain-on-failure',
    screenshot: 'only-on-failure',
    browserName: 'chromium',
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
      args: [
        '--headless',
        '--no-sandbox',
        '--disable-gpu',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
        '--no-first-run',
        '--disable-quic',
      ],
    },
  },
});
