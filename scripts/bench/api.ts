/**
 * The API row: requests per second of the draft save — `PUT /api/projects/:projectId/systems/
 * :systemId/revisions/:revisionId/document`, the route a client calls to have the server analyse
 * a document (it validates it, re-runs the engine, stores document and analysis, and answers
 * with the revision's summary: its new version and verdict; the walk's autosave calls it). There is no separate
 * "analyse this document" route: the client runs the engine itself and the server re-runs it on
 * every save.
 *
 * Peer: scripts/bench/peer-server.ts, a bare Express app answering the same route with the same
 * bytes. Both are started the same way (`node --import tsx <entry>`, NODE_ENV=production, one
 * process on loopback) and driven the same way: autocannon, one instance of one connection per
 * designer (each designer saves their own draft, so every save carries the version it read),
 * the same request bodies, the same duration; rounds alternate between the two.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { createRequire } from 'node:module';
import { createDb, makeUsers, root, type Cluster, type LoadUser } from '../../tests/load/world';
// @ts-expect-error plain ESM helper without types (it must run before npm ci)
import * as pg from '../lib/postgres.mjs';
import { median, type BenchRow } from './table';

const require = createRequire(import.meta.url);
/* eslint-disable @typescript-eslint/no-explicit-any */
const autocannon: any = require('autocannon');

export interface NodeServer {
  url: string;
  pid: number;
  log: string[];
  stop: () => Promise<void>;
}

/** `node --import tsx <entry>` on a free loopback port, ready when GET /api/health answers 200 (`nodeArgs`: more of node's own flags, say --cpu-prof). */
export async function startNodeServer(entry: string, env: Record<string, string>, nodeArgs: string[] = []): Promise<NodeServer> {
  const port: number = await pg.freePort();
  const url = `http://127.0.0.1:${port}`;
  const proc: ChildProcess = spawn(process.execPath, [...nodeArgs, '--import', 'tsx', entry], {
    cwd: root,
    stdio: ['ignore', 'pipe', 'pipe'],
    env: {
      ...process.env,
      NODE_ENV: 'production',
      HOST: '127.0.0.1',
      PORT: String(port),
      PUBLIC_URL: url,
      // bench-only secret, a throw-away database
      SESSION_SECRET: 'bench-only-secret-bench-only-secret-0123456789',
      // the bench signs in a dozen accounts in a few seconds
      SIGN_IN_LIMIT: '100000',
      // one app process unless the caller asks for more (the load and fault aims are per process; bench/processes.ts compares 1 and 2)
      HEADROOM_PROCESSES: '1',
      ...env,
    },
  });
  const log: string[] = [];
  proc.stdout!.on('data', (c) => log.push(String(c)));
  proc.stderr!.on('data', (c) => log.push(String(c)));
  const exited = () => new Promise<void>((resolve) => (proc.exitCode !== null || proc.signalCode !== null ? resolve() : proc.once('exit', () => resolve())));
  // 120 s: a cold tsx start takes a few seconds on a quiet machine, over 30 s for two app processes at load 14 (a choice with room)
  const deadline = Date.now() + 120_000;
  for (;;) {
    try {
      if ((await fetch(`${url}/api/health`)).ok) break;
    } catch {}
    if (Date.now() > deadline || proc.exitCode !== null) {
      proc.kill('SIGKILL');
      throw new Error(`${entry} did not start:\n${log.join('').slice(-3000)}`);
    }
    await new Promise((r) => setTimeout(r, 150));
  }
  return {
    url,
    pid: proc.pid!,
    log,
    stop: async () => {
      if (proc.exitCode === null && proc.signalCode === null) proc.kill('SIGTERM');
      await exited();
    },
  };
}

export interface RoundResult {
  /** successful (2xx) answers per second, summed over the connections */
  rps: number;
  failed: number;
  /** the first few failures, for the log */
  failures: string[];
}

/** The 50 edited documents of each user, as JSON, made once (the bench's own work per request stays small). */
const EDITS = 50;
const editedDocs = new WeakMap<LoadUser, string[]>();

function saveBody(u: LoadUser, edit: number): string {
  let docs = editedDocs.get(u);
  if (!docs) {
    // a real edit each time: the first segment's length changes, so the analysis changes (10–59 ft, invented)
    docs = Array.from({ length: EDITS }, (_, k) => {
      const doc = structuredClone(u.document) as { segments: { length: number }[] };
      doc.segments[0].length = 10 + k;
      return JSON.stringify(doc);
    });
    editedDocs.set(u, docs);
  }
  return `{"document":${docs[edit % EDITS]},"version":${u.version}}`;
}

/** The revision's version in a save's answer: the first "version" key (the revision's summary comes before its document). */
function answerVersion(text: string): number | null {
  const m = /"version":(\d+)/.exec(text);
  return m ? Number(m[1]) : null;
}

async function readVersion(u: LoadUser): Promise<number> {
  const res = await u.client.get(u.paths.revision);
  if (res.status !== 200) throw new Error(`reading ${u.paths.revision}: ${res.status} ${res.text.slice(0, 200)}`);
  return (res.body as { revision: { version: number } }).revision.version;
}

/**
 * Each draft's version as stored, once the server is idle: the saves in flight when a round
 * ends are still saved, but their answers are never read. Reads until two reads 300 ms apart
 * agree (300 ms, a choice: longer than a read, shorter than a save on a busy machine).
 */
async function settleVersions(users: LoadUser[]): Promise<void> {
  let last = await Promise.all(users.map(readVersion));
  for (let i = 0; i < 50; i++) {
    await new Promise((r) => setTimeout(r, 300));
    const now = await Promise.all(users.map(readVersion));
    const same = now.every((v, k) => v === last[k]);
    last = now;
    if (same) break;
  }
  users.forEach((u, k) => (u.version = last[k]));
}

/** One round: every user's connection saves their draft over and over for `seconds`. */
export async function round(baseUrl: string, users: LoadUser[], seconds: number, tracksVersions: boolean): Promise<RoundResult> {
  if (tracksVersions) await settleVersions(users);
  const failures: string[] = [];
  let failed = 0;
  const results = await Promise.all(
    users.map((u) => {
      const headers = {
        cookie: [...u.client.cookies].map(([k, v]) => `${k}=${v}`).join('; '),
        'x-csrf-token': u.client.token,
        'content-type': 'application/json',
      };
      let edits = 0;
      let ok = 0;
      let recovering = false;
      return new Promise<{ ok: number; duration: number }>((resolve, reject) => {
        autocannon(
          {
            url: baseUrl,
            connections: 1,
            duration: seconds,
            // 10 s: far above any answer here; a timeout is a failure, not a slow answer
            timeout: 10,
            requests: [
              {
                method: 'PUT',
                path: u.paths.document,
                headers,
                setupRequest: (req: any) => {
                  req.body = saveBody(u, ++edits);
                  return req;
                },
                onResponse: (status: number, text: string) => {
                  if (status < 200 || status >= 300) {
                    failed++;
                    if (failures.length < 5) failures.push(`${status} ${String(text).slice(0, 200)}`);
                    // a stale version (should not happen after settleVersions): read the stored one, counted as failed meanwhile
                    if (status === 409 && tracksVersions && !recovering) {
                      recovering = true;
                      void readVersion(u)
                        .then((v) => (u.version = v))
                        .finally(() => (recovering = false));
                    }
                    return;
                  }
                  ok++;
                  // the same read on both sides; only Headroom's answer carries the draft's new version (the peer's is fixed)
                  const v = answerVersion(text);
                  if (tracksVersions && v !== null) u.version = v;
                },
              },
            ],
          },
          (err: unknown, result: any) => {
            if (err) return reject(err);
            failed += result.errors + result.timeouts;
            resolve({ ok, duration: result.duration });
          },
        );
      });
    }),
  );
  if (results.some((r) => !r.duration)) throw new Error('an autocannon connection ran for no time');
  return { rps: results.reduce((sum, r) => sum + r.ok / r.duration, 0), failed, failures };
}

export interface ApiOptions {
  cluster: Cluster;
  app: NodeServer;
  /** concurrent connections (10 by default, a choice: the figure the issue names) */
  connections: number;
  rounds: number;
  seconds: number;
  warmupSeconds: number;
  tmpDir: string;
  log: (m: string) => void;
}

export async function apiRows(o: ApiOptions): Promise<BenchRow[]> {
  const db = createDb(o.cluster.url);
  let users: LoadUser[];
  try {
    o.log(`signing in ${o.connections} designers, each with a project, a system and a draft (the demo's 94-segment cold-water document) …`);
    users = await makeUsers(db, o.app.url, o.connections);
  } finally {
    await db.destroy();
  }

  // one real save gives the answer the peer sends back (same bytes: the peer reads this file)
  const u0 = users[0];
  const sample = await u0.client.request('PUT', u0.paths.document, { raw: saveBody(u0, 0) });
  if (sample.status !== 200) throw new Error(`the sample save failed: ${sample.status} ${sample.text.slice(0, 300)}`);
  u0.version = (sample.body as { revision: { version: number } }).revision.version;
  if (answerVersion(sample.text) !== u0.version)
    throw new Error(`the answer's first "version" is not the revision's (${answerVersion(sample.text)} ≠ ${u0.version})`);
  const requestBytes = Buffer.byteLength(saveBody(u0, 0));
  const answerBytes = Buffer.byteLength(sample.text);
  const bodyFile = path.join(o.tmpDir, 'peer-answer.json');
  fs.writeFileSync(bodyFile, sample.text);

  const peer = await startNodeServer('scripts/bench/peer-server.ts', { BENCH_PEER_BODY: bodyFile });
  try {
    const check = await u0.client.request('PUT', u0.paths.document, { raw: saveBody(u0, 0) });
    if (check.status !== 200) throw new Error(`a save after the sample failed: ${check.status}`);
    u0.version = (check.body as { revision: { version: number } }).revision.version;
    const peerCheck = await fetch(peer.url + u0.paths.document, { method: 'PUT', headers: { 'content-type': 'application/json' }, body: saveBody(u0, 0) });
    const peerText = await peerCheck.text();
    if (peerCheck.status !== 200 || Buffer.byteLength(peerText) !== answerBytes)
      throw new Error(`the peer's answer differs: ${peerCheck.status}, ${Buffer.byteLength(peerText)} bytes, expected ${answerBytes}`);

    o.log(
      `API: request ${(requestBytes / 1000).toFixed(1)} kB, answer ${(answerBytes / 1000).toFixed(1)} kB; warm-up ${o.warmupSeconds} s each, then ${o.rounds} rounds of ${o.seconds} s each, alternating …`,
    );
    await round(o.app.url, users, o.warmupSeconds, true);
    await round(peer.url, users, o.warmupSeconds, false);
    const ours: number[] = [];
    const theirs: number[] = [];
    const failures: string[] = [];
    let failed = 0;
    for (let r = 0; r < o.rounds; r++) {
      // alternate which goes first, so a change in the machine's load mid-run falls on both
      const order = r % 2 === 0 ? (['app', 'peer'] as const) : (['peer', 'app'] as const);
      for (const which of order) {
        const res = await round(which === 'app' ? o.app.url : peer.url, users, o.seconds, which === 'app');
        (which === 'app' ? ours : theirs).push(res.rps);
        failed += res.failed;
        failures.push(...res.failures.map((f) => `${which}: ${f}`));
      }
      o.log(`  round ${r + 1}: Headroom ${ours[r].toFixed(0)} req/s, bare Express ${theirs[r].toFixed(0)} req/s`);
    }
    for (const f of failures.slice(0, 10)) o.log(`  failed request: ${f}`);
    return [
      {
        figure: `API: draft save with server analysis (PUT …/revisions/:id/document), demo document (${(requestBytes / 1000).toFixed(0)} kB in, ${(answerBytes / 1000).toFixed(0)} kB out), ${o.connections} connections, ${o.seconds} s rounds`,
        unit: 'req/s',
        median: median(ours),
        runs: o.rounds,
        peer: { name: 'bare Express: same route, requests and answer bytes; body parser only', median: median(theirs) },
        note: failed ? `${failed} failed requests` : undefined,
      },
    ];
  } finally {
    await peer.stop();
  }
}
