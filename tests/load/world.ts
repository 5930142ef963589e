/**
 * What the load and fault runs share: a throw-away PostgreSQL cluster (scripts/lib/postgres.mjs),
 * the real server as its own process (`node --import tsx server/index.ts`, as scripts/test.mjs
 * starts it for the end-to-end tests), signed-in users each with a project and a system made
 * through the API, and the server's resident memory.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { randomUUID } from 'node:crypto';
// @ts-expect-error plain ESM helper without types (it must run before npm ci)
import * as pg from '../../scripts/lib/postgres.mjs';
import { createDb, type Db } from '../../server/db/knex';
import { hashPassword } from '../../server/auth/password';
import { UrlClient, want } from '../api/support/hardening';

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

export interface Cluster {
  bin: string;
  data: string;
  port: number;
  url: string;
  stop: () => void;
  start: () => void;
  /** stops the cluster and removes its folder */
  destroy: () => void;
}

export async function startCluster(name: string): Promise<Cluster> {
  const bin = pg.ensurePostgresInstalled();
  const tmp = fs.mkdtempSync(path.join(os.tmpdir(), `headroom-${name}-`));
  fs.chmodSync(tmp, 0o755);
  const data = path.join(tmp, 'pg');
  const port = await pg.freePort();
  pg.initCluster(bin, data, port, { fast: true });
  pg.startCluster(bin, data);
  pg.createDatabase(bin, port, `headroom_${name}`);
  const url = pg.databaseUrl(port, `headroom_${name}`);
  const setup = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/db.ts', 'setup'], {
    cwd: root,
    env: { ...process.env, DATABASE_URL: url },
    encoding: 'utf8',
  });
  if (setup.status !== 0) throw new Error(`database setup failed: ${setup.stdout}${setup.stderr}`);
  let destroyed = false;
  return {
    bin,
    data,
    port,
    url,
    stop: () => pg.stopCluster(bin, data),
    start: () => pg.startCluster(bin, data),
    destroy: () => {
      if (destroyed) return;
      destroyed = true;
      pg.stopCluster(bin, data);
      fs.rmSync(tmp, { recursive: true, force: true });
    },
  };
}

export interface Server {
  proc: ChildProcess;
  url: string;
  pid: number;
  log: string[];
  /** SIGTERM and wait */
  stop: () => Promise<void>;
  /** SIGKILL and wait */
  kill: () => Promise<void>;
}

export async function startServer(env: Record<string, string>, port?: number): Promise<Server> {
  const appPort = port ?? (await pg.freePort());
  const proc = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: root,
    stdio: ['ignore', 'pipe', 'pipe'],
    env: {
      ...process.env,
      NODE_ENV: 'production',
      HOST: '127.0.0.1',
      PORT: String(appPort),
      SESSION_SECRET: 'load-only-secret-load-only-secret-0123456789',
      PUBLIC_URL: `http://127.0.0.1:${appPort}`,
      SIGN_IN_LIMIT: '100000',
      SIGN_IN_CLIENT_LIMIT: '100000',
      LINK_LIMIT: '100000',
      // one app process unless the caller asks for more (the load and fault aims are per process; bench/processes.ts compares 1 and 2)
      HEADROOM_PROCESSES: '1',
      ...env,
    },
  });
  const log: string[] = [];
  proc.stdout!.on('data', (c) => log.push(String(c)));
  proc.stderr!.on('data', (c) => log.push(String(c)));
  const url = `http://127.0.0.1:${appPort}`;
  // 120 s: a cold tsx start of several app processes on a busy 2-core machine (load 14) took over 30 s
  const deadline = Date.now() + 120_000;
  for (;;) {
    try {
      if ((await fetch(`${url}/api/health`)).ok) break;
    } catch {}
    if (Date.now() > deadline || proc.exitCode !== null) throw new Error(`the server did not start:\n${log.join('')}`);
    await new Promise((r) => setTimeout(r, 150));
  }
  const exited = () => new Promise<void>((resolve) => (proc.exitCode !== null || proc.signalCode !== null ? resolve() : proc.once('exit', () => resolve())));
  return {
    proc,
    url,
    pid: proc.pid!,
    log,
    stop: async () => {
      proc.kill('SIGTERM');
      await exited();
    },
    kill: async () => {
      proc.kill('SIGKILL');
      await exited();
    },
  };
}

/** The server's resident set size in MB (VmRSS in /proc/<pid>/status, Linux). */
export function rssMb(pid: number): number {
  const m = /VmRSS:\s+(\d+) kB/.exec(fs.readFileSync(`/proc/${pid}/status`, 'utf8'));
  return m ? Number(m[1]) / 1024 : NaN;
}

export const LOAD_PASSWORD = 'load test password 123';

export interface LoadUser {
  client: UrlClient;
  email: string;
  projectId: string;
  systemId: string;
  revisionId: string;
  version: number;
  document: Record<string, unknown>;
  paths: { project: string; system: string; revision: string; document: string };
}

/** The demo's cold-water document (95 nodes, 94 segments): each save is a full analysis of it. */
export function demoDocument(): Record<string, unknown> {
  return { ...JSON.parse(fs.readFileSync(path.join(root, 'src/engine/examples/alder-finch-cold.json'), 'utf8')), id: randomUUID() };
}

/**
 * `count` designer accounts (written to the database: there is no self sign-up), each signed in
 * through the API and owning a project with one system, made through the API.
 */
export async function makeUsers(db: Db, baseUrl: string, count: number, document = demoDocument): Promise<LoadUser[]> {
  const hash = await hashPassword(LOAD_PASSWORD);
  const run = randomUUID().slice(0, 8);
  const rows = Array.from({ length: count }, (_, i) => ({
    email: `load-${run}-${i}@test.example`,
    name: `Load ${i}`,
    account_role: 'designer',
    status: 'active',
    password_hash: hash,
    is_admin: false,
  }));
  await db('users').insert(rows);
  const users: LoadUser[] = [];
  // ten at a time: sign-in hashes are deliberately slow
  for (let i = 0; i < count; i += 10) {
    users.push(
      ...(await Promise.all(
        rows.slice(i, i + 10).map(async ({ email }) => {
          const client = await new UrlClient(baseUrl).signIn(email, LOAD_PASSWORD);
          const project = (await want(client.send('POST', '/api/projects', { name: `Load ${email}` }), 201)).body.project;
          const created = (await want(client.send('POST', `/api/projects/${project.id}/systems`, { name: 'Cold', service: 'cold', document: document() }), 201))
            .body;
          const system = `/api/projects/${project.id}/systems/${created.system.id}`;
          const revision = `${system}/revisions/${created.revision.id}`;
          return {
            client,
            email,
            projectId: project.id,
            systemId: created.system.id,
            revisionId: created.revision.id,
            version: created.revision.version,
            document: created.revision.document,
            paths: { project: `/api/projects/${project.id}`, system, revision, document: `${revision}/document` },
          } satisfies LoadUser;
        }),
      )),
    );
  }
  return users;
}

export function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))];
}

export { createDb, type Db };
