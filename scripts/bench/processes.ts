/**
 * The processes row: the draft save (the API row's route, requests and connections) against the
 * same server started twice over one database — HEADROOM_PROCESSES=1 and HEADROOM_PROCESSES=2 —
 * both running at once on loopback, rounds alternating between them so a change in the machine's
 * load falls on both. The ratio (2 ÷ 1) is the scaling a second app process gives on this machine.
 * On 2 cores it stays well under 2: PostgreSQL, autocannon and the processes share the cores.
 *
 * Alone: `npx tsx scripts/bench/processes.ts [--quick]` (its own throw-away cluster); in the table:
 * `npm run bench` (part "processes").
 */
import os from 'node:os';
import { pathToFileURL } from 'node:url';
import { createDb, makeUsers, startCluster, type Cluster } from '../../tests/load/world';
import { round, startNodeServer, type NodeServer } from './api';
import { markdownTable, median, type BenchRow } from './table';

export interface ProcessesOptions {
  cluster: Cluster;
  connections: number;
  rounds: number;
  seconds: number;
  warmupSeconds: number;
  log: (m: string) => void;
}

/** Both servers up: the two-process one only when each of its app processes said it listens. */
async function startBoth(cluster: Cluster): Promise<{ one: NodeServer; two: NodeServer }> {
  const one = await startNodeServer('server/index.ts', { DATABASE_URL: cluster.url, HEADROOM_PROCESSES: '1' });
  const two = await startNodeServer('server/index.ts', { DATABASE_URL: cluster.url, HEADROOM_PROCESSES: '2' });
  // 60 s: the second app process starts while the first already answers (a choice with room on a busy machine)
  const deadline = Date.now() + 60_000;
  while ((two.log.join('').match(/listening on .*\(app process/g) ?? []).length < 2) {
    if (Date.now() > deadline) throw new Error(`the second app process did not start:\n${two.log.join('').slice(-2000)}`);
    await new Promise((r) => setTimeout(r, 150));
  }
  return { one, two };
}

export async function processRows(o: ProcessesOptions): Promise<BenchRow[]> {
  const { one, two } = await startBoth(o.cluster);
  try {
    const db = createDb(o.cluster.url);
    // signed in through the one-process server; the sessions are in PostgreSQL, so both servers know them
    const users = await makeUsers(db, one.url, o.connections).finally(() => db.destroy());
    o.log(
      `processes: ${o.connections} designers saving their drafts; warm-up ${o.warmupSeconds} s each, then ${o.rounds} rounds of ${o.seconds} s on 1 and on 2 app processes, alternating …`,
    );
    await round(one.url, users, o.warmupSeconds, true);
    await round(two.url, users, o.warmupSeconds, true);
    const single: number[] = [];
    const double: number[] = [];
    let failed = 0;
    const failures: string[] = [];
    for (let r = 0; r < o.rounds; r++) {
      const order = r % 2 === 0 ? ([1, 2] as const) : ([2, 1] as const);
      for (const n of order) {
        const res = await round(n === 1 ? one.url : two.url, users, o.seconds, true);
        (n === 1 ? single : double).push(res.rps);
        failed += res.failed;
        failures.push(...res.failures.map((f) => `${n} process(es): ${f}`));
      }
      o.log(`  round ${r + 1}: 1 process ${single[r].toFixed(0)} req/s, 2 processes ${double[r].toFixed(0)} req/s (×${(double[r] / single[r]).toFixed(2)})`);
    }
    for (const f of failures.slice(0, 10)) o.log(`  failed request: ${f}`);
    o.log(`processes: scaling 1 → 2 app processes ×${(median(double) / median(single)).toFixed(2)} on ${os.availableParallelism()} cores`);
    return [
      {
        figure: `API: draft save with 2 app processes (HEADROOM_PROCESSES=2), demo document, ${o.connections} connections, ${o.seconds} s rounds; ratio = scaling`,
        unit: 'req/s',
        median: median(double),
        runs: o.rounds,
        peer: { name: 'the same server with 1 app process, same database, rounds alternating', median: median(single) },
        note: failed ? `${failed} failed requests` : undefined,
      },
    ];
  } finally {
    await Promise.all([one.stop(), two.stop()]);
  }
}

// run alone
if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const quick = process.argv.includes('--quick');
  const started = Date.now();
  const log = (m: string) => console.log(`[processes ${((Date.now() - started) / 1000).toFixed(0).padStart(3)} s] ${m}`);
  const loadStart = os.loadavg();
  const cluster = await startCluster('processes');
  let code = 0;
  try {
    const rows = await processRows({ cluster, connections: 10, rounds: quick ? 3 : 5, seconds: quick ? 3 : 5, warmupSeconds: quick ? 1 : 2, log });
    console.log('\n' + markdownTable(rows));
  } catch (err) {
    console.error(err);
    code = 1;
  } finally {
    cluster.destroy();
  }
  console.log(
    `load average ${loadStart.map((x) => x.toFixed(2)).join(' ')} at start, ${os
      .loadavg()
      .map((x) => x.toFixed(2))
      .join(' ')} at end`,
  );
  process.exit(code);
}
