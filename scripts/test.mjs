// `npm test`: the whole suite on a throw-away PostgreSQL cluster.
//   1. Vitest: the engine and unit tests, the walk's route tests (jsdom, fake fetch), and the API
//      tests (supertest) on a fresh database;
//   2. Playwright in Debian's Chromium against the built app, served on a free loopback port
//      over its own freshly seeded database.
// Ends with one line "N passed, N failed" summing both. `--only engine|routes|api|e2e` runs one part;
// after `--only e2e --`, arguments go to Playwright.
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import * as pg from './lib/postgres.mjs';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
process.chdir(root);
const onlyIndex = process.argv.indexOf('--only');
const only = onlyIndex > 0 ? process.argv[onlyIndex + 1] : null;
const want = (part) => !only || only === part;
// `npm test -- --only e2e -- e2e/building.spec.ts` passes what follows a second `--` to Playwright (one spec, --grep …).
const dashes = process.argv.indexOf('--', onlyIndex > 0 ? onlyIndex : 0);
const playwrightArgs = dashes > 0 ? process.argv.slice(dashes + 1) : [];
const reports = path.join(root, '.tmp');
fs.mkdirSync(reports, { recursive: true });

function runSync(cmd, args, env = {}) {
  return spawnSync(cmd, args, { stdio: 'inherit', env: { ...process.env, ...env } }).status ?? 1;
}

if (!fs.existsSync(path.join(root, 'node_modules', '.package-lock.json'))) {
  pg.log('installing npm dependencies (npm ci) …');
  if (runSync('npm', ['ci', '--no-audit', '--no-fund'], { PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD: '1' }) !== 0) process.exit(1);
}

const needsDb = want('api') || want('e2e');
const chromium = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
if (want('e2e') && !fs.existsSync(chromium)) {
  if (!pg.isRoot) {
    pg.log(`Chromium is missing. Install it with:\n\n    sudo sh -c 'apt-get update && apt-get install -y chromium'\n`);
    process.exit(1);
  }
  pg.log('installing Debian’s chromium for the end-to-end tests …');
  if (runSync('sh', ['-c', 'apt-get update && apt-get install -y chromium'], { DEBIAN_FRONTEND: 'noninteractive' }) !== 0) process.exit(1);
}

let pgBin = null;
let pgData = null;
let server = null;
function cleanup() {
  if (server && server.exitCode === null) server.kill('SIGTERM');
  if (pgBin && pgData) {
    pg.stopCluster(pgBin, pgData);
    fs.rmSync(path.dirname(pgData), { recursive: true, force: true });
    pgData = null;
  }
}
process.on('SIGINT', () => {
  cleanup();
  process.exit(130);
});

const totals = { passed: 0, failed: 0, skipped: 0 };
let failedToRun = false;
const env = {};

try {
  if (needsDb) {
    pgBin = pg.ensurePostgresInstalled();
    const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'headroom-test-'));
    fs.chmodSync(tmp, 0o755);
    pgData = path.join(tmp, 'pg');
    const port = await pg.freePort();
    // trust authentication here on purpose: a throw-away cluster on loopback in a fresh temporary
    // folder, removed when the run ends (`npm start`'s own cluster asks for a password: secureCluster)
    pg.initCluster(pgBin, pgData, port, { fast: true });
    pg.startCluster(pgBin, pgData);
    pg.createDatabase(pgBin, port, 'headroom_api');
    pg.createDatabase(pgBin, port, 'headroom_e2e');
    env.TEST_DATABASE_URL = pg.databaseUrl(port, 'headroom_api');
    env.E2E_DATABASE_URL = pg.databaseUrl(port, 'headroom_e2e');
    env.TEST_PG_BIN = pgBin;
    env.TEST_PG_DATA = pgData;
    if (runSync(process.execPath, ['--import', 'tsx', 'scripts/db.ts', 'catalogs'], { DATABASE_URL: env.TEST_DATABASE_URL }) !== 0)
      throw new Error('migrations failed');
    pg.log(`throw-away PostgreSQL on 127.0.0.1:${port}`);
  }

  // 1. Vitest
  const projects = [want('engine') && 'engine', want('routes') && 'routes', want('api') && 'api'].filter(Boolean);
  if (projects.length) {
    const reportFile = path.join(reports, 'vitest-report.json');
    fs.rmSync(reportFile, { force: true });
    const args = [
      'node_modules/vitest/vitest.mjs',
      'run',
      ...projects.flatMap((p) => ['--project', p]),
      '--reporter=default',
      '--reporter=json',
      `--outputFile.json=${reportFile}`,
    ];
    runSync(process.execPath, args, env);
    if (fs.existsSync(reportFile)) {
      const r = JSON.parse(fs.readFileSync(reportFile, 'utf8'));
      totals.passed += r.numPassedTests;
      totals.failed += r.numFailedTests;
      totals.skipped += r.numPendingTests + (r.numTodoTests ?? 0);
      // a file that fails to load has no tests but is a failure all the same
      totals.failed += r.testResults.filter((f) => f.status === 'failed' && f.assertionResults.length === 0).length;
    } else failedToRun = true;
  }

  // 2. Playwright
  if (want('e2e')) {
    if (runSync(process.execPath, ['--import', 'tsx', 'scripts/db.ts', 'setup'], { DATABASE_URL: env.E2E_DATABASE_URL }) !== 0)
      throw new Error('e2e seed failed');
    if (runSync(process.execPath, ['node_modules/vite/bin/vite.js', 'build', '--logLevel', 'warn']) !== 0) throw new Error('client build failed');
    const appPort = await pg.freePort();
    server = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
      stdio: ['ignore', 'pipe', 'pipe'],
      env: {
        ...process.env,
        // not production: the development mail sink (below) never runs in production
        NODE_ENV: 'test',
        PORT: String(appPort),
        DATABASE_URL: env.E2E_DATABASE_URL,
        SESSION_SECRET: 'e2e-only-secret-e2e-only-secret-0123456789',
        HEADROOM_SERVE_CLIENT: '1',
        PUBLIC_URL: `http://127.0.0.1:${appPort}`,
        SIGN_IN_LIMIT: '200',
        SIGN_IN_CLIENT_LIMIT: '2000',
        LINK_LIMIT: '2000',
        // e-mail goes to the in-process SMTP sink (dev_mail table); quick polls for the tests
        HEADROOM_DEV_MAIL: '1',
        HEADROOM_DEV_MAIL_PAGE: '1',
        OUTBOX_POLL_MS: '200',
        // one app process: the suite's figures and logs stay those of one process (tests/api/processes.test.ts runs two)
        HEADROOM_PROCESSES: '1',
      },
    });
    const serverLog = fs.createWriteStream(path.join(reports, 'e2e-server.log'));
    server.stdout.pipe(serverLog);
    server.stderr.pipe(serverLog);
    const baseUrl = `http://127.0.0.1:${appPort}`;
    // generous: on a busy 2-core machine the server's start (tsx, the first database queries) has
    // taken over 30 s; the wait ends as soon as the health route answers
    const deadline = Date.now() + 120_000;
    while (true) {
      try {
        const res = await fetch(`${baseUrl}/api/health`);
        if (res.ok) break;
      } catch {}
      if (Date.now() > deadline || server.exitCode !== null) throw new Error('the server did not start for the e2e tests (see .tmp/e2e-server.log)');
      await new Promise((r) => setTimeout(r, 200));
    }
    const reportFile = path.join(reports, 'playwright-report.json');
    fs.rmSync(reportFile, { force: true });
    runSync(process.execPath, ['node_modules/@playwright/test/cli.js', 'test', '--reporter=list,json,./e2e/durations.reporter.ts', ...playwrightArgs], {
      ...env,
      E2E_BASE_URL: baseUrl,
      PLAYWRIGHT_JSON_OUTPUT_NAME: reportFile,
      PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD: '1',
    });
    if (fs.existsSync(reportFile)) {
      const r = JSON.parse(fs.readFileSync(reportFile, 'utf8'));
      totals.passed += r.stats.expected + r.stats.flaky;
      totals.failed += r.stats.unexpected;
      totals.skipped += r.stats.skipped;
      if (r.errors?.length) totals.failed += r.errors.length;
    } else failedToRun = true;
  }
} catch (err) {
  pg.log(`test run stopped: ${err instanceof Error ? err.message : err}`);
  failedToRun = true;
} finally {
  cleanup();
}

if (failedToRun) totals.failed += 1;
console.log(`\n${totals.passed} passed, ${totals.failed} failed${totals.skipped ? `, ${totals.skipped} skipped` : ''}`);
process.exit(totals.failed === 0 && totals.passed > 0 ? 0 : 1);
