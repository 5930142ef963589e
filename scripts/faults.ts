// `npm run test:faults`: two faults against the real server process over a throw-away PostgreSQL.
//   (a) PostgreSQL stopped during a steady stream of draft saves and reads: every request answers
//       within a second (503 while it is down), the API recovers by itself within 5 s of
//       PostgreSQL's return, and every acknowledged save is stored whole (document, analysis, audit).
//   (b) the server killed (SIGKILL) while e-mail is queued: after a restart every message reaches
//       the SMTP sink exactly once.
//   (c) anonymous requests that each used to cost a password hash (issue 13 finding 3): 48 callers
//       keep confirming made-up reset and invitation links for 10 s; the start page (the built
//       client's index.html when dist/ exists, else the CSRF-token call it makes first) keeps a
//       median under 100 ms with the link limit as shipped; the same run with the limit lifted
//       is printed for information.
// Prints PASS/FAIL per check and exits non-zero on any failure. Stops by itself and cleans up.
import { execFile } from 'node:child_process';
import { SMTPServer } from 'smtp-server';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import { createDb, makeUsers, root, startCluster, startServer, demoDocument, type LoadUser } from '../tests/load/world';
import { UrlClient, want } from '../tests/api/support/hardening';
import { smallDocument } from '../tests/api/support/documents';
import { analyse } from '../server/services/systems';
import { readStoredAnalysis } from '../server/services/storedAnalysis';
import { loadConfig } from '../server/config';
import { canonicalJson } from '../server/services/canonicalJson';

const results: { name: string; ok: boolean; detail: string }[] = [];
const check = (name: string, ok: boolean, detail = '') => {
  results.push({ name, ok, detail });
  console.log(`${ok ? 'PASS' : 'FAIL'}  ${name}${detail ? ` — ${detail}` : ''}`);
};
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const log = (m: string) => console.log(`[faults] ${m}`);
/** the machine's load average (1, 5, 15 min): figures from a busy machine are read with it */
const loadAverage = () =>
  os
    .loadavg()
    .map((x) => x.toFixed(2))
    .join(' ');
const loadAtStart = loadAverage();

async function timed(fn: () => Promise<Response>): Promise<{ status: number; ms: number; text: string }> {
  const t0 = performance.now();
  try {
    const res = await fn();
    const text = await res.text();
    return { status: res.status, ms: performance.now() - t0, text };
  } catch (e) {
    return { status: 0, ms: performance.now() - t0, text: String(e) };
  }
}

// ---------------------------------------------------------------- (a) PostgreSQL stops
async function databaseOutage() {
  const cluster = await startCluster('faults_db');
  const server = await startServer({ DATABASE_URL: cluster.url });
  try {
    const db = createDb(cluster.url);
    const users = await makeUsers(db, server.url, 10, () => smallDocument() as unknown as Record<string, unknown>);
    await db.destroy();
    /** per revision: every acknowledged save (version → the document sent) and every attempted one */
    const acked = new Map<string, Map<number, string>>();
    const attempted = new Map<string, Set<string>>();
    const slow: string[] = [];
    let phase: 'before' | 'down' | 'after' = 'before';
    const statusesDown = new Map<number, number>();
    let running = true;

    const writer = async (u: LoadUser, i: number) => {
      acked.set(u.revisionId, new Map());
      attempted.set(u.revisionId, new Set());
      let n = 0;
      const headers = {
        cookie: [...u.client.cookies].map(([k, v]) => `${k}=${v}`).join('; '),
        'x-csrf-token': u.client.token,
        'content-type': 'application/json',
      };
      while (running) {
        const doc = structuredClone(u.document) as { notes?: string };
        doc.notes = `writer ${i} save ${++n}`;
        const text = canonicalJson(doc);
        attempted.get(u.revisionId)!.add(text);
        const r = await timed(() =>
          fetch(server.url + u.paths.document, {
            method: 'PUT',
            headers,
            body: JSON.stringify({ document: doc, version: u.version }),
            signal: AbortSignal.timeout(10_000),
          }),
        );
        // during the outage the answer (503) must come within a second; otherwise a save is only hung past 5 s
        // (a full analysis on a busy 2-core machine can take a second by itself)
        if (r.ms > (phase === 'down' ? 1000 : 5000)) slow.push(`${phase} save ${r.status} in ${r.ms.toFixed(0)} ms`);
        if (phase === 'down') statusesDown.set(r.status, (statusesDown.get(r.status) ?? 0) + 1);
        if (r.status === 200) {
          const v = JSON.parse(r.text).revision.version as number;
          acked.get(u.revisionId)!.set(v, text);
          u.version = v;
        } else if (r.status === 409) {
          // a save whose answer was lost may have landed: read the version back
          const g = await timed(() => fetch(server.url + u.paths.revision, { headers }));
          if (g.status === 200) u.version = JSON.parse(g.text).revision.version;
        } else await sleep(50);
      }
    };
    const writers = users.map(writer);

    await sleep(2000);
    log('stopping PostgreSQL …');
    cluster.stop();
    phase = 'down';
    await sleep(300);
    const downProbes = [];
    for (let k = 0; k < 10; k++) {
      downProbes.push(await timed(() => fetch(`${server.url}/api/health`, { signal: AbortSignal.timeout(5000) })));
      downProbes.push(
        await timed(() =>
          fetch(server.url + users[k % users.length].paths.project, {
            headers: { cookie: [...users[0].client.cookies].map(([a, b]) => `${a}=${b}`).join('; ') },
            signal: AbortSignal.timeout(5000),
          }),
        ),
      );
      await sleep(200);
    }
    const worst = Math.max(...downProbes.map((p) => p.ms));
    check(
      '(a) while PostgreSQL is down, every probe answers 503 within a second',
      downProbes.every((p) => p.status === 503 && p.ms < 1000),
      `statuses ${[...new Set(downProbes.map((p) => p.status))].join(',')}, slowest ${worst.toFixed(0)} ms`,
    );

    log('starting PostgreSQL again …');
    cluster.start();
    const back = Date.now();
    phase = 'after';
    let recoveredMs = Infinity;
    while (Date.now() - back < 15_000) {
      const h = await timed(() => fetch(`${server.url}/api/health`, { signal: AbortSignal.timeout(2000) }));
      const p = await timed(() =>
        fetch(server.url + users[0].paths.project, {
          headers: { cookie: [...users[0].client.cookies].map(([a, b]) => `${a}=${b}`).join('; ') },
          signal: AbortSignal.timeout(2000),
        }),
      );
      if (h.status === 200 && p.status === 200) {
        recoveredMs = Date.now() - back;
        break;
      }
      await sleep(100);
    }
    check(
      '(a) the API recovers by itself within 5 s of PostgreSQL’s return',
      recoveredMs <= 5000,
      `${recoveredMs === Infinity ? 'not within 15 s' : `${recoveredMs} ms`}`,
    );
    await sleep(2000);
    running = false;
    await Promise.all(writers);
    const wrong = [...statusesDown.keys()].filter((s) => s !== 200 && s !== 503);
    const failures = server.log
      .join('')
      .split('\n')
      .filter((l) => /failed:/.test(l))
      .slice(0, 3);
    check(
      '(a) during the outage a save is answered 503 DATABASE_UNAVAILABLE (or 200 if it got in first), never another error',
      wrong.length === 0,
      wrong.length ? `statuses ${JSON.stringify(Object.fromEntries(statusesDown))}; server log: ${failures.join(' | ').slice(0, 600)}` : '',
    );
    check(
      '(a) no save hung: during the outage every save answered within a second (before and after: within 5 s)',
      slow.length === 0,
      slow.slice(0, 5).join('; ') || `saves during the outage: ${JSON.stringify(Object.fromEntries(statusesDown))}`,
    );

    // compare what was acknowledged with what is stored
    const db2 = createDb(cluster.url);
    const problems: string[] = [];
    let ackCount = 0;
    for (const u of users) {
      const row = await db2('revisions').where({ id: u.revisionId }).first('version', 'document', 'analysis', 'engine_version');
      const mine = acked.get(u.revisionId)!;
      ackCount += mine.size;
      const last = Math.max(0, ...mine.keys());
      const stored = canonicalJson(row.document);
      if (row.version < last) problems.push(`${u.revisionId}: stored version ${row.version} < acknowledged ${last}`);
      else if (row.version === last && stored !== mine.get(last))
        problems.push(`${u.revisionId}: version ${last} holds another document than the acknowledged one`);
      else if (row.version > last && !attempted.get(u.revisionId)!.has(stored))
        problems.push(`${u.revisionId}: version ${row.version} holds a document nobody sent`);
      // whole, not half: the stored analysis is the analysis of the stored document
      if (canonicalJson(readStoredAnalysis(row.analysis, row.engine_version).outcome) !== canonicalJson(JSON.parse(JSON.stringify(analyse(row.document)))))
        problems.push(`${u.revisionId}: the stored analysis does not belong to the stored document`);
      const audits = await db2('audit_log').where({ action: 'revision.saved', subject_id: u.revisionId }).select('details');
      const auditedVersions = new Set(audits.map((a: { details: { version: number } }) => a.details.version));
      for (const v of mine.keys()) if (!auditedVersions.has(v)) problems.push(`${u.revisionId}: acknowledged version ${v} has no audit entry`);
    }
    await db2.destroy();
    check(
      '(a) every acknowledged save is stored whole (document, its analysis, its audit entry)',
      problems.length === 0 && ackCount > 0,
      problems.slice(0, 5).join('; ') || `${ackCount} acknowledged saves checked`,
    );
  } finally {
    await server.stop().catch(() => {});
    cluster.destroy();
  }
}

// ---------------------------------------------------------------- (b) the server dies with mail queued
async function killedWithMailQueued() {
  const cluster = await startCluster('faults_mail');
  const delivered = new Map<string, number>();
  const closed = new Set<string>();
  let onMessage: (n: number) => void = () => {};
  let accepted = 0;
  // a slow relay: it holds each message 300 ms before its 250, so the kill lands mid-queue
  const sink = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    onClose: (session) => closed.add(session.id),
    onData: (stream, session, callback) => {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        const raw = Buffer.concat(chunks).toString('latin1');
        const id = /X-Headroom-Outbox-Id:\s*(\S+)/i.exec(raw)?.[1] ?? 'unknown';
        onMessage(accepted);
        setTimeout(() => {
          // a message counts as delivered only when the 250 reached a live connection
          if (!closed.has(session.id)) {
            delivered.set(id, (delivered.get(id) ?? 0) + 1);
            accepted++;
          }
          callback();
        }, 300);
      });
    },
  });
  await new Promise<void>((r) => sink.listen(0, '127.0.0.1', () => r()));
  const smtpPort = (sink.server.address() as { port: number }).port;
  const env = {
    DATABASE_URL: cluster.url,
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: String(smtpPort),
    OUTBOX_POLL_MS: '100',
    OUTBOX_RETRY_BASE_MS: '200',
    OUTBOX_RETRY_MAX_MS: '1000',
    OUTBOX_LEASE_SECONDS: '2',
  };
  let server = await startServer(env);
  try {
    const db = createDb(cluster.url);
    const [u] = await makeUsers(db, server.url, 1, demoDocument);
    await want(
      u.client.send('POST', `${u.paths.revision}/issue`, {
        version: u.version,
        attestation: { name: 'Dana Whitlow', licenceNumber: 'PE 40417', basis: 'prepared', confirmed: true },
      }),
      200,
    );
    for (let i = 0; i < 100; i++) {
      const s = await u.client.get(`${u.paths.revision}/summary`);
      if (s.body?.summary?.status === 'ready') break;
      await sleep(200);
    }
    const recipients = Array.from({ length: 8 }, (_, i) => `outside-${i}-${Date.now()}@test.example`);
    const port = Number(new URL(server.url).port);
    const killed = new Promise<void>((resolve) => {
      onMessage = (n) => {
        if (n >= 2) {
          onMessage = () => {};
          log(`killing the server (SIGKILL) with a message in the relay's hands, ${n} delivered …`);
          void server.kill().then(resolve);
        }
      };
    });
    const sent = await want(u.client.send('POST', `${u.paths.revision}/summary/send`, { emails: recipients, message: 'For review' }), 202);
    const ids: string[] = sent.body.messages.map((m: { id: string }) => m.id);
    await Promise.race([killed, sleep(30_000)]);
    const queuedAtKill = await db('outbox').whereIn('id', ids).whereNot({ status: 'sent' }).count({ n: '*' }).first();
    log(`${(queuedAtKill as { n: string }).n} of ${ids.length} messages not yet sent at the kill; restarting …`);
    server = await startServer(env, port);
    const deadline = Date.now() + 60_000;
    let rows: { id: string; status: string }[] = [];
    while (Date.now() < deadline) {
      rows = await db('outbox').whereIn('id', ids).select('id', 'status');
      if (rows.every((r) => r.status === 'sent' || r.status === 'failed')) break;
      await sleep(200);
    }
    await sleep(1500); // a late duplicate would arrive within the lease (2 s)
    await db.destroy();
    check(
      '(b) the server was killed while messages were still queued',
      Number((queuedAtKill as { n: string }).n) > 0,
      `${(queuedAtKill as { n: string }).n} queued`,
    );
    check(
      '(b) after the restart every message is sent',
      rows.length === ids.length && rows.every((r) => r.status === 'sent'),
      rows.map((r) => r.status).join(','),
    );
    const counts = ids.map((id) => delivered.get(id) ?? 0);
    check(
      '(b) each message reached the relay exactly once',
      counts.every((c) => c === 1),
      `deliveries per message: ${counts.join(',')}`,
    );
  } finally {
    await server.stop().catch(() => {});
    await new Promise<void>((r) => sink.close(() => r()));
    cluster.destroy();
  }
}

// ---------------------------------------------------------------- (c) anonymous hashing attack
/** One GET by curl: its status and curl's own total time (connection to last byte), in ms. */
function curlTimed(url: string): Promise<{ status: number; ms: number }> {
  return new Promise((resolve) => {
    execFile('curl', ['-s', '-o', '/dev/null', '-w', '%{http_code} %{time_total}', url], (err, stdout) => {
      const [code, seconds] = String(stdout).trim().split(' ');
      resolve(err ? { status: 0, ms: Infinity } : { status: Number(code), ms: Number(seconds) * 1000 });
    });
  });
}

/** LINK_LIMIT as the product ships it (server/config.ts's default), read from the config itself */
const SHIPPED_LINK_LIMIT = String(loadConfig({ DATABASE_URL: 'postgres://x@127.0.0.1/x', SESSION_SECRET: 'x'.repeat(40) }).LINK_LIMIT);

/**
 * Run twice: with the link limit as shipped (the attackers share one address, as 48 callers of one
 * client do) — the check; and with the limit lifted (LINK_LIMIT=100000), which shows what the
 * look-up-first order and the bounded hashing give alone — printed, not checked: 48 callers that
 * are never refused saturate one app process whatever each request costs (the start page then
 * waits its turn among them), which is what the limit is for.
 */
async function anonymousHashingAttack(linkLimit: string, checked: boolean) {
  const cluster = await startCluster('faults_hash');
  const served = fs.existsSync(path.join(root, 'dist', 'index.html'));
  const server = await startServer({ DATABASE_URL: cluster.url, HEADROOM_SERVE_CLIENT: served ? '1' : '0', LINK_LIMIT: linkLimit });
  try {
    const startPage = served ? '/' : '/api/csrf-token';
    const anon = new UrlClient(server.url);
    await anon.refreshToken();
    const headers = { cookie: [...anon.cookies].map(([k, v]) => `${k}=${v}`).join('; '), 'x-csrf-token': anon.token, 'content-type': 'application/json' };
    let running = true;
    let attacks = 0;
    const statuses = new Map<number, number>();
    const attacker = async (i: number) => {
      while (running) {
        const token = randomBytes(32).toString('base64url');
        const url = i % 2 ? `${server.url}/api/invitations/${token}` : `${server.url}/api/auth/password-reset/confirm`;
        const body = JSON.stringify(i % 2 ? { password: 'a long enough password' } : { token, password: 'a long enough password' });
        const r = await timed(() => fetch(url, { method: 'POST', headers, body }));
        statuses.set(r.status, (statuses.get(r.status) ?? 0) + 1);
        attacks++;
      }
    };
    const attackers = Array.from({ length: 48 }, (_, i) => attacker(i));
    await sleep(500);
    const pageMs: number[] = [];
    const until = Date.now() + 10_000;
    // the start page is timed by curl, a process of its own like a real visitor's browser: timed in this
    // process it would also count this process's own event loop, busy with the 48 attackers' answers
    while (Date.now() < until) {
      const r = await curlTimed(server.url + startPage);
      if (r.status === 200) pageMs.push(r.ms);
      await sleep(100);
    }
    running = false;
    await Promise.all(attackers);
    pageMs.sort((a, b) => a - b);
    const med = pageMs[Math.floor(pageMs.length / 2)] ?? Infinity;
    log(
      `LINK_LIMIT=${linkLimit}: ${attacks} made-up link confirmations (${[...statuses].map(([s, n]) => `${n}× ${s}`).join(', ')}); start page ${startPage}: median ${med.toFixed(1)} ms, p99 ${(pageMs[Math.floor(pageMs.length * 0.99)] ?? Infinity).toFixed(1)} ms over ${pageMs.length} loads`,
    );
    if (checked)
      check(
        `(c) under 48 anonymous link attackers (LINK_LIMIT=${linkLimit}, as shipped) the start page answers with a median under 100 ms`,
        med < 100,
        `${med.toFixed(1)} ms`,
      );
    else log(`(c) for information, the link limit lifted: start page median ${med.toFixed(1)} ms (not checked; see anonymousHashingAttack)`);
    for (const line of server.log
      .join('')
      .split('\n')
      .filter((l) => /failed:|Error/.test(l))
      .slice(0, 5))
      log(`server: ${line.slice(0, 300)}`);
    check(
      '(c) every made-up link was refused (400/404/429), none failed',
      [...statuses.keys()].every((s) => s === 400 || s === 404 || s === 429),
      [...statuses.keys()].join(','),
    );
  } finally {
    await server.stop().catch(() => {});
    cluster.destroy();
  }
}

// FAULTS_ONLY=a|b|c runs one part (all by default)
const only = process.env.FAULTS_ONLY;
if (!only || only === 'a')
  try {
    await databaseOutage();
  } catch (e) {
    check('(a) the database-outage run completed', false, e instanceof Error ? e.message : String(e));
  }
if (!only || only === 'b')
  try {
    await killedWithMailQueued();
  } catch (e) {
    check('(b) the killed-server run completed', false, e instanceof Error ? e.message : String(e));
  }
if (!only || only === 'c')
  try {
    await anonymousHashingAttack(SHIPPED_LINK_LIMIT, true);
    await anonymousHashingAttack('100000', false);
  } catch (e) {
    check('(c) the anonymous-hashing run completed', false, e instanceof Error ? e.message : String(e));
  }
const failed = results.filter((r) => !r.ok).length;
console.log(`load average ${loadAtStart} at start, ${loadAverage()} at end (${os.availableParallelism()} cores)`);
console.log(`\nFAULTS: ${failed ? 'FAIL' : 'PASS'} (${results.length - failed} passed, ${failed} failed)`);
process.exit(failed ? 1 : 0);
