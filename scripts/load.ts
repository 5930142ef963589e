// `npm run test:load`: 100 signed-in designers, each with their own project, system and draft,
// mixing reads (project, system, revision with the server's analysis) and draft saves (each a
// full analysis of the demo's 95-node system on the server) for LOAD_SECONDS (default 60) on
// loopback, against the real server process over a throw-away PostgreSQL. Passes when no request
// failed (non-2xx, network error or time-out); prints p50/p99 per kind and the server's memory at
// start and end. Stops by itself and removes its cluster.
//
// The users work at a person's pace: each waits LOAD_THINK_MS (default 2000 ms, drawn uniformly
// between half and one and a half times it, so 100 users do not move in step) between one answer
// and their next request — a designer's autosave fires after a pause in typing, and reads come
// with moving between pages, so one request every ~2 s per person is a busy office, not an idle
// one. LOAD_THINK_MS=0 gives closed-loop users that never wait: that run measures the capacity of
// the server (every latency is then queueing behind the other 99 users) and is printed, not judged
// against the 1 s aim below.
//
// With the oversized-document attack in the mix (issue 13 finding 1; LOAD_ATTACK=0 leaves it out):
// for the first third of the run the users work alone (the baseline), then three signed-in
// attackers keep sending ~1.3 MB bodies of empty nodes to a draft of their own; the run then also
// fails when another user's read made during the attack has a p99 of 1 s or more. Both phases'
// figures are printed side by side.
//
//   LOAD_SECONDS=10 LOAD_USERS=20 npm run test:load     (a short try)
import os from 'node:os';
import { createDb, makeUsers, percentile, rssMb, startCluster, startServer, type LoadUser } from '../tests/load/world';

const SECONDS = Number(process.env.LOAD_SECONDS ?? 60);
const USERS = Number(process.env.LOAD_USERS ?? 100);
const ATTACK = process.env.LOAD_ATTACK !== '0';
const ATTACKERS = 3;
const THINK_MS = Number(process.env.LOAD_THINK_MS ?? 2000);
/** a request that has not answered in 10 s counts as failed (the time-out a browser user gives up well before) */
const TIMEOUT_MS = 10_000;
const KINDS = ['project', 'system', 'revision', 'save'] as const;
type Kind = (typeof KINDS)[number];

const log = (m: string) => console.log(`[load] ${m}`);
/** the machine's load average (1, 5, 15 min): figures from a busy machine are read with it */
const loadAverage = () =>
  os
    .loadavg()
    .map((x) => x.toFixed(2))
    .join(' ');
const loadAtStart = loadAverage();
const cluster = await startCluster('load');
let server: Awaited<ReturnType<typeof startServer>> | null = null;
const cleanup = async () => {
  await server?.stop().catch(() => {});
  cluster.destroy();
};
process.on('SIGINT', () => void cleanup().then(() => process.exit(130)));

let failed: boolean;
try {
  server = await startServer({ DATABASE_URL: cluster.url });
  const db = createDb(cluster.url);
  log(`server pid ${server.pid} on ${server.url}; making ${USERS} signed-in designers …`);
  const users = await makeUsers(db, server.url, USERS + (ATTACK ? ATTACKERS : 0));
  const attackers = ATTACK ? users.splice(USERS, ATTACKERS) : [];
  await db.destroy();
  const rssStart = rssMb(server.pid);

  type Phase = 'alone' | 'attack';
  const latencies: Record<Phase, Record<Kind, number[]>> = {
    alone: { project: [], system: [], revision: [], save: [] },
    attack: { project: [], system: [], revision: [], save: [] },
  };
  const unexpected: string[] = [];
  const counts: Record<Kind, number> = { project: 0, system: 0, revision: 0, save: 0 };
  let networkErrors = 0;
  let timeouts = 0;
  let attacking = false;
  const deadline = Date.now() + SECONDS * 1000;
  const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

  /** One user: the four requests in order, again and again, so every save carries the version it read. */
  const runFor = async (u: LoadUser) => {
    const headers = { cookie: [...u.client.cookies].map(([k, v]) => `${k}=${v}`).join('; '), 'x-csrf-token': u.client.token };
    let saves = 0;
    const save = () => {
      // a real edit each time: the first segment's length changes, so the analysis changes
      const doc = structuredClone(u.document) as { segments: { length: number }[] };
      doc.segments[0].length = 10 + (++saves % 50);
      return JSON.stringify({ document: doc, version: u.version });
    };
    const steps: [Kind, string, string][] = [
      ['project', 'GET', u.paths.project],
      ['system', 'GET', u.paths.system],
      ['revision', 'GET', u.paths.revision],
      ['save', 'PUT', u.paths.document],
    ];
    // start spread over the first think time, as people do not all press a key at once
    await sleep(Math.random() * THINK_MS);
    for (let i = 0; Date.now() < deadline; i++) {
      const [kind, method, path] = steps[i % steps.length];
      const phase: Phase = attacking ? 'attack' : 'alone';
      const t = performance.now();
      try {
        const res = await fetch(server!.url + path, {
          method,
          headers: kind === 'save' ? { ...headers, 'content-type': 'application/json' } : headers,
          body: kind === 'save' ? save() : undefined,
          signal: AbortSignal.timeout(TIMEOUT_MS),
        });
        const text = await res.text();
        latencies[phase][kind].push(performance.now() - t);
        counts[kind]++;
        if (!res.ok) unexpected.push(`${kind} ${res.status} ${text.slice(0, 200)}`);
        else if (kind === 'save') u.version = JSON.parse(text).revision.version;
      } catch (err) {
        if (err instanceof Error && err.name === 'TimeoutError') timeouts++;
        else networkErrors++;
      }
      if (THINK_MS > 0) await sleep(THINK_MS * (0.5 + Math.random()));
    }
  };

  log(`running ${USERS} users for ${SECONDS} s …`);
  const t0 = Date.now();
  const attack = { sent: 0, refused: 0, other: [] as string[], ms: [] as number[] };
  const attackBody = (u: LoadUser) => {
    const empties = Array(330_000).fill('{}').join(',');
    return JSON.stringify({ document: { ...(u.document as object), nodes: ['@N'], segments: [] }, version: u.version }).replace('["@N"]', `[${empties}]`);
  };
  const attackLoop = async (u: LoadUser) => {
    const body = attackBody(u);
    const headers = {
      cookie: [...u.client.cookies].map(([k, v]) => `${k}=${v}`).join('; '),
      'x-csrf-token': u.client.token,
      'content-type': 'application/json',
    };
    while (attacking) {
      const t = performance.now();
      const res = await fetch(server!.url + u.paths.document, { method: 'PUT', headers, body }).catch((e) => ({ status: 0, text: async () => String(e) }));
      attack.ms.push(performance.now() - t);
      attack.sent++;
      if (res.status === 400) attack.refused++;
      else attack.other.push(`attack ${res.status} ${(await res.text()).slice(0, 120)}`);
      await res.text?.().catch(() => '');
    }
  };
  const working = Promise.all(users.map(runFor));
  let attacks: Promise<void>[] = [];
  if (attackers.length) {
    // the baseline first: a third of the run with the users alone
    await sleep((SECONDS * 1000) / 3);
    attacking = true;
    attacks = attackers.map(attackLoop);
  }
  await working;
  attacking = false;
  await Promise.all(attacks);
  const elapsed = (Date.now() - t0) / 1000;
  const rssEnd = rssMb(server.pid);

  const total = KINDS.reduce((n, k) => n + counts[k], 0);
  const pace = THINK_MS > 0 ? `each waiting ${THINK_MS / 2}–${(THINK_MS * 3) / 2} ms between requests` : 'closed loop (no wait): a capacity run';
  console.log(`\nHeadroom load: ${USERS} users, ${pace}; ${elapsed.toFixed(0)} s, ${total} requests (${(total / elapsed).toFixed(0)}/s)`);
  const phases: Phase[] = attackers.length ? ['alone', 'attack'] : ['alone'];
  const cell = (xs: number[], q: number) =>
    (xs.length
      ? percentile(
          xs.slice().sort((a, b) => a - b),
          q,
        ).toFixed(1)
      : '—'
    ).padStart(9);
  console.log(`kind      ${phases.map((p) => `${p === 'alone' ? 'users alone' : 'under attack'}: requests   p50 ms    p99 ms`).join('   |   ')}`);
  for (const k of KINDS) {
    console.log(
      `${k.padEnd(10)}${phases.map((p) => `${String(latencies[p][k].length).padStart(22)} ${cell(latencies[p][k], 50)} ${cell(latencies[p][k], 99)}`).join('   |   ')}`,
    );
  }
  console.log(`server RSS: ${rssStart.toFixed(0)} MB at start, ${rssEnd.toFixed(0)} MB at end`);
  console.log(`errors: ${unexpected.length} non-2xx, ${networkErrors} network errors, ${timeouts} time-outs (${TIMEOUT_MS / 1000} s)`);
  for (const e of unexpected.slice(0, 10)) console.log(`  ${e}`);
  failed = unexpected.length + networkErrors + timeouts > 0 || total === 0;
  if (ATTACK) {
    const sortedAttack = attack.ms.slice().sort((a, b) => a - b);
    console.log(
      `oversized-document attack: ${ATTACKERS} attackers, ${attack.sent} bodies of ~1.3 MB, ${attack.refused} refused with 400 (median ${percentile(sortedAttack, 50).toFixed(0)} ms)`,
    );
    for (const e of attack.other.slice(0, 5)) console.log(`  ${e}`);
    for (const k of ['project', 'system', 'revision'] as const) {
      const p99 = percentile(
        latencies.attack[k].slice().sort((a, b) => a - b),
        99,
      );
      if (THINK_MS > 0 && p99 >= 1000) {
        console.log(`  other users' ${k} reads: p99 ${p99.toFixed(0)} ms, over 1 s during the attack`);
        failed = true;
      }
    }
    if (attack.sent === 0 || attack.other.length > 0) failed = true;
  }
} catch (err) {
  console.error('[load] the run stopped:', err instanceof Error ? err.message : err);
  if (server) console.error(server.log.join('').slice(-3000));
  failed = true;
} finally {
  await cleanup();
}
console.log(`load average ${loadAtStart} at start, ${loadAverage()} at end (${os.availableParallelism()} cores)`);
console.log(failed ? '\nLOAD: FAIL' : '\nLOAD: PASS');
process.exit(failed ? 1 : 0);
