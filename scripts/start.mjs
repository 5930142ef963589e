// `npm start`: from a fresh clone to a running Headroom on one port.
// installs npm dependencies when missing → makes sure PostgreSQL is there → a project-local
// cluster on 127.0.0.1 (or DATABASE_URL) → migrations → demo seed when empty → client build →
// the server. Ctrl-C stops the server and the database this script started.
import { spawn, spawnSync } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import * as pg from './lib/postgres.mjs';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
process.chdir(root);
const dev = process.argv.includes('--dev');
const started = Date.now();
const appPort = Number(process.env.PORT ?? 5480);

function run(cmd, args, env = {}) {
  const result = spawnSync(cmd, args, { stdio: 'inherit', env: { ...process.env, ...env } });
  if (result.status !== 0) {
    pg.log(`${cmd} ${args.join(' ')} failed (exit ${result.status}).`);
    cleanup();
    process.exit(result.status ?? 1);
  }
}

// 1. npm dependencies
if (!fs.existsSync(path.join(root, 'node_modules', '.package-lock.json'))) {
  pg.log('installing npm dependencies (npm ci) …');
  run('npm', ['ci', '--no-audit', '--no-fund'], { PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD: '1' });
}

// 2. the database
let databaseUrl = process.env.DATABASE_URL;
let pgBin = null;
let pgData = null;
let weStartedPostgres = false;

function cleanup() {
  if (weStartedPostgres && pgBin && pgData) {
    pg.log('stopping PostgreSQL …');
    pg.stopCluster(pgBin, pgData);
    weStartedPostgres = false;
  }
}

if (databaseUrl) {
  pg.log('DATABASE_URL is set: using that server (no local cluster started).');
} else {
  pgBin = pg.ensurePostgresInstalled();
  pgData = path.resolve(process.env.HEADROOM_PGDATA ?? path.join(root, '.data', 'pg'));
  const created = pg.initCluster(pgBin, pgData, Number(process.env.HEADROOM_PG_PORT ?? 54329), { passwordAuthFor: 'headroom' });
  const pgPort = pg.clusterPort(pgData);
  if (created) pg.log(`created a PostgreSQL cluster in ${path.relative(root, pgData) || pgData} (port ${pgPort})`);
  if (pg.isClusterRunning(pgBin, pgData)) {
    pg.log(`PostgreSQL is already running on 127.0.0.1:${pgPort}; reusing it.`);
  } else {
    if (await pg.portInUse(pgPort)) {
      pg.log(`port ${pgPort} is taken by another program; set HEADROOM_PGDATA to a new folder and HEADROOM_PG_PORT to a free port.`);
      process.exit(1);
    }
    pg.startCluster(pgBin, pgData);
    weStartedPostgres = true;
  }
  // the application's role (not a superuser) owns the database; its password is generated once and
  // kept in .data/db-password (mode 0600) like the session secret; a cluster made by an older start
  // (trust for every local connection) is upgraded in place
  const passwordFile = path.join(root, '.data', 'db-password');
  const wasPasswordAuth = pg.usesPasswordAuth(pgData);
  let secured;
  try {
    secured = pg.secureCluster(pgBin, pgData, pgPort, 'headroom', passwordFile);
  } catch (error) {
    pg.log(`could not set up the database role: ${error.message}`);
    cleanup();
    process.exit(1);
  }
  if (!wasPasswordAuth && !created)
    pg.log(
      `upgraded the PostgreSQL cluster in ${path.relative(root, pgData) || pgData} to password authentication: role ${secured.role} (not a superuser) now owns database 'headroom' and its objects; connections without a password are refused.`,
    );
  databaseUrl = secured.url;
}

for (const signal of ['SIGINT', 'SIGTERM']) {
  process.on(signal, () => {
    if (server) server.kill('SIGTERM');
    else {
      cleanup();
      process.exit(130);
    }
  });
}
let server = null;

// 3. migrations and the demo seed
run(process.execPath, ['--import', 'tsx', 'scripts/db.ts', 'setup'], { DATABASE_URL: databaseUrl });

// 4. the client
function newestMtime(target) {
  if (!fs.existsSync(target)) return 0;
  const stat = fs.statSync(target);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const entry of fs.readdirSync(target)) newest = Math.max(newest, newestMtime(path.join(target, entry)));
  return newest;
}
if (!dev) {
  const builtAt = newestMtime(path.join(root, 'dist', 'index.html'));
  const sourcesAt = Math.max(...['src', 'index.html', 'vite.config.ts', 'tailwind.config.ts', 'package-lock.json'].map((p) => newestMtime(path.join(root, p))));
  if (builtAt < sourcesAt) {
    pg.log('building the client …');
    run(process.execPath, [path.join(root, 'node_modules', 'vite', 'bin', 'vite.js'), 'build', '--logLevel', 'warn']);
  } else {
    pg.log('client build is up to date.');
  }
}

// 5. the server
const secretFile = path.join(root, '.data', 'session-secret');
let sessionSecret = process.env.SESSION_SECRET;
if (!sessionSecret) {
  fs.mkdirSync(path.dirname(secretFile), { recursive: true });
  if (!fs.existsSync(secretFile)) fs.writeFileSync(secretFile, crypto.randomBytes(32).toString('hex'), { mode: 0o600 });
  sessionSecret = fs.readFileSync(secretFile, 'utf8').trim();
}
const env = {
  ...process.env,
  DATABASE_URL: databaseUrl,
  PORT: String(appPort),
  SESSION_SECRET: sessionSecret,
  NODE_ENV: process.env.NODE_ENV ?? (dev ? 'development' : 'production'),
  HEADROOM_SERVE_CLIENT: dev ? '0' : '1',
  PUBLIC_URL: process.env.PUBLIC_URL ?? `http://127.0.0.1:${appPort}`,
  // the development mail sink only when asked for (HEADROOM_DEV_MAIL=1, never in production): mail
  // goes to the SMTP relay of SMTP_HOST (README, "Settings"); without one it waits in the outbox
};
if (!process.env.SMTP_HOST && process.env.HEADROOM_DEV_MAIL !== '1') {
  pg.log('no SMTP relay is set (SMTP_HOST): e-mail waits in the outbox and shows as not delivered. See README, "Settings".');
}
server = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], { stdio: ['ignore', 'pipe', 'inherit'], env });
let announced = false;
server.stdout.on('data', (chunk) => {
  process.stdout.write(chunk);
  // with several app processes (HEADROOM_PROCESSES) each says it listens: the first is enough
  if (!announced && String(chunk).includes('listening on')) {
    announced = true;
    pg.log(`ready in ${((Date.now() - started) / 1000).toFixed(1)} s`);
    pg.log(`open http://127.0.0.1:${appPort}/`);
    pg.log('demo sign-ins (password for all: headroom-demo):');
    for (const [who, email] of [
      ['administrator', 'admin@alder-finch.example'],
      ['designer', 'designer@alder-finch.example'],
      ['contractor', 'contractor@alder-finch.example'],
      ['inspector', 'inspector@alder-finch.example'],
      ['no project (outsider)', 'outsider@alder-finch.example'],
    ])
      pg.log(`  ${who.padEnd(22)} ${email}`);
    if (dev) pg.log('development: run `npx vite` in another terminal for the hot-reloading client.');
  }
});
server.on('exit', (code) => {
  cleanup();
  process.exit(code ?? 0);
});
