import { defineConfig } from '@playwright/test';

/**
 * End-to-end tests in Debian's Chromium (never a downloaded browser). The lead's test runner
 * starts the app and gives its address in E2E_BASE_URL.
 */
const baseURL = process.env.E2E_BASE_URL ?? 'http://127.0.0.1:5480';

/**
 * Time-outs, sized from the durations printed by e2e/durations.reporter.ts. Measured with
 * `node scripts/test.mjs --only e2e` on the 2-core machine shared with other work, load average
 * 14–26: most tests 5–40 s, the slowest ordinary ones 1.1–1.3 min (two designers saving one
 * project; the designer accepting a field change), the contractor's whole field-change story over
 * 2.2 min (it sets its own, 300 s). A test gets about 2–3 times its slowest measured run, so that
 * a machine this busy passes while a hung test still fails; a single state (a save, an analysis, a
 * page) gets `expect`, 30 s: its slowest measured waits were 10–20 s at that load.
 */
const TIMEOUTS = { test: 180_000, expect: 30_000 } as const;
/** `npm run bench` sets HEADROOM_BENCH=1 to run the bench-only specs (e2e/bench/*.bench.ts) and nothing else. */
const bench = process.env.HEADROOM_BENCH === '1';

export default defineConfig({
  testDir: 'e2e',
  // the e2e suite: *.spec.ts (Playwright's default pattern also takes *.test.ts; there are none); benches never
  testMatch: bench ? '**/*.bench.ts' : '**/*.@(spec|test).?(c|m)[jt]s?(x)',
  outputDir: 'e2e-output/test-results',
  // Every test stands alone (it makes its own projects through e2e/api.ts and relies on no other
  // test); one worker all the same, because the app, PostgreSQL and Chromium share a small machine.
  fullyParallel: false,
  workers: 1,
  forbidOnly: Boolean(process.env.CI),
  // no retries: a failure shows as a failure, never hidden by a second try
  retries: 0,
  // sized from measured durations (e2e/durations.reporter.ts prints them after every run): see TIMEOUTS
  timeout: TIMEOUTS.test,
  expect: { timeout: TIMEOUTS.expect },
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
