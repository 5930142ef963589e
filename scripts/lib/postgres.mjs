// A project-local PostgreSQL cluster for `npm start` and `npm test`.
// Plain Node (no dependencies): it must run before `npm ci` has installed anything.
//
// Facts this relies on (TOOLCHAIN.md): initdb and postgres refuse to run as root, so as root
// they run as Debian's `postgres` system user; the data folder must be owned by that user with
// mode 0700 and every parent folder traversable by it; PostgreSQL 15's initdb has no -c, so
// settings are appended to postgresql.conf.
import { spawnSync, execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import net from 'node:net';

export const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
const SERVER_USER = 'postgres';
export const DB_SUPERUSER = 'headroom';

export function log(message) {
  process.stdout.write(`[headroom] ${message}\n`);
}

/** The newest Debian PostgreSQL server binaries, or null when none is installed. */
export function findPgBin() {
  const root = '/usr/lib/postgresql';
  if (!fs.existsSync(root)) return null;
  const versions = fs
    .readdirSync(root)
    .filter((v) => fs.existsSync(path.join(root, v, 'bin', 'initdb')))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? path.join(root, versions[0], 'bin') : null;
}

/** Make sure Debian's PostgreSQL server is installed; install it when root, else say how. */
export function ensurePostgresInstalled() {
  let bin = findPgBin();
  if (bin) return bin;
  const install = 'apt-get update && apt-get install -y postgresql-15';
  if (!isRoot) {
    log(`PostgreSQL's server is not installed. Install it with:\n\n    sudo sh -c '${install}'\n`);
    process.exit(1);
  }
  log('installing PostgreSQL (postgresql-15) with apt-get …');
  const result = spawnSync('sh', ['-c', install], { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
  if (result.status !== 0) {
    log('apt-get could not install postgresql-15; see the output above.');
    process.exit(1);
  }
  bin = findPgBin();
  if (!bin) {
    log('postgresql-15 was installed but its binaries were not found under /usr/lib/postgresql.');
    process.exit(1);
  }
  return bin;
}

function asServerUser(command, args, options = {}) {
  const [cmd, argv] = isRoot ? ['runuser', ['-u', SERVER_USER, '--', command, ...args]] : [command, args];
  return spawnSync(cmd, argv, { encoding: 'utf8', ...options });
}

/** Every parent of dir must be traversable by the server's user (x bit for "others" when root). */
function checkTraversable(dir) {
  if (!isRoot) return;
  let current = path.dirname(path.resolve(dir));
  while (true) {
    const mode = fs.statSync(current).mode;
    if ((mode & 0o001) === 0) {
      log(
        `PostgreSQL runs as the '${SERVER_USER}' user, which cannot enter ${current} (mode ${(mode & 0o777).toString(8)}).\n` +
          `  Either allow it:  chmod o+x ${current}\n  or put the data elsewhere:  HEADROOM_PGDATA=/var/tmp/headroom-pg npm start`,
      );
      process.exit(1);
    }
    const parent = path.dirname(current);
    if (parent === current) return;
    current = parent;
  }
}

/** Create the cluster if the folder has none. Returns true when it was created now. */
export function initCluster(bin, dataDir, port, { fast = false } = {}) {
  if (fs.existsSync(path.join(dataDir, 'PG_VERSION'))) return false;
  fs.mkdirSync(dataDir, { recursive: true });
  checkTraversable(dataDir);
  if (isRoot) execFileSync('chown', [`${SERVER_USER}:`, dataDir]);
  fs.chmodSync(dataDir, 0o700);
  const result = asServerUser(path.join(bin, 'initdb'), ['-D', dataDir, '-U', DB_SUPERUSER, '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
  if (result.status !== 0) {
    log(`initdb failed:\n${result.stdout}\n${result.stderr}`);
    process.exit(1);
  }
  // Loopback only, our own port and socket folder; trust authentication is acceptable
  // because nothing but this machine can reach 127.0.0.1. fsync off only for throw-away test clusters.
  const settings = [
    '',
    '# added by Headroom (scripts/lib/postgres.mjs)',
    "listen_addresses = '127.0.0.1'",
    `port = ${port}`,
    `unix_socket_directories = '${dataDir}'`,
    'max_connections = 200',
    ...(fast ? ['fsync = off', 'synchronous_commit = off', 'full_page_writes = off'] : []),
    '',
  ].join('\n');
  fs.appendFileSync(path.join(dataDir, 'postgresql.conf'), settings);
  if (isRoot) execFileSync('chown', [`${SERVER_USER}:`, path.join(dataDir, 'postgresql.conf')]);
  return true;
}

/** The port written in the cluster's configuration (a second run reuses it). */
export function clusterPort(dataDir) {
  const conf = fs.readFileSync(path.join(dataDir, 'postgresql.conf'), 'utf8');
  const matches = [...conf.matchAll(/^port = (\d+)/gm)];
  return matches.length ? Number(matches[matches.length - 1][1]) : 5432;
}

export function isClusterRunning(bin, dataDir) {
  return asServerUser(path.join(bin, 'pg_ctl'), ['-D', dataDir, 'status']).status === 0;
}

export function startCluster(bin, dataDir) {
  const logFile = path.join(dataDir, 'server.log');
  const result = asServerUser(path.join(bin, 'pg_ctl'), ['-D', dataDir, '-l', logFile, '-w', '-t', '30', 'start']);
  if (result.status !== 0) {
    let tail = '';
    try {
      tail = fs.readFileSync(logFile, 'utf8').split('\n').slice(-15).join('\n');
    } catch {}
    log(`PostgreSQL did not start:\n${result.stdout}${result.stderr}\n${tail}`);
    process.exit(1);
  }
}

export function stopCluster(bin, dataDir) {
  asServerUser(path.join(bin, 'pg_ctl'), ['-D', dataDir, '-m', 'fast', '-w', 'stop'], { stdio: 'ignore' });
}

export function createDatabase(bin, port, name) {
  const exists = spawnSync(path.join(bin, 'psql'), ['-h', '127.0.0.1', '-p', String(port), '-U', DB_SUPERUSER, '-d', 'postgres', '-tAc', `SELECT 1 FROM pg_database WHERE datname = '${name}'`], { encoding: 'utf8' });
  if (exists.stdout.trim() === '1') return false;
  const result = spawnSync(path.join(bin, 'createdb'), ['-h', '127.0.0.1', '-p', String(port), '-U', DB_SUPERUSER, name], { encoding: 'utf8' });
  if (result.status !== 0) {
    log(`createdb ${name} failed: ${result.stderr}`);
    process.exit(1);
  }
  return true;
}

export function databaseUrl(port, name) {
  return `postgres://${DB_SUPERUSER}@127.0.0.1:${port}/${name}`;
}

/** A free TCP port on loopback. */
export function freePort() {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.unref();
    server.on('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address();
      server.close(() => resolve(port));
    });
  });
}

/** Is something listening on this loopback port? */
export function portInUse(port) {
  return new Promise((resolve) => {
    const socket = net.connect({ host: '127.0.0.1', port });
    socket.once('connect', () => {
      socket.destroy();
      resolve(true);
    });
    socket.once('error', () => resolve(false));
  });
}
