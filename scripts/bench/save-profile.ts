/**
 * Where a draft save's CPU goes under load: the real server (one app process, `node --cpu-prof`)
 * over a throw-away PostgreSQL cluster, driven by the API row's autocannon rounds (ten designers
 * each saving their own draft of the demo document). Prints the requests per second, the CPU
 * seconds each process spent per save (the app process, its worker threads included, and all of
 * PostgreSQL's processes, from /proc), and the functions of the app's main thread that took the
 * most CPU during the measured round (self time, then time by file).
 *
 *   npx tsx scripts/bench/save-profile.ts [seconds]
 *
 * A diagnosis, not a figure of the bench table (the profiler itself slows the app process down a
 * little). The .cpuprofile files stay in bench-output/save-profile/ for Chrome's DevTools.
 */
import fs from 'node:fs';
import path from 'node:path';
import { createDb, makeUsers, root, startCluster } from '../../tests/load/world';
import { round, startNodeServer } from './api';

const seconds = Number(process.argv[2] ?? 8);
const outDir = path.join(root, 'bench-output', 'save-profile');
fs.rmSync(outDir, { recursive: true, force: true });
fs.mkdirSync(outDir, { recursive: true });

/** utime + stime of a process and its threads, in seconds (/proc/<pid>/stat fields 14 and 15, in clock ticks of 1/100 s on Linux). */
const cpuSeconds = (pid: number): number => {
  try {
    const fields = fs.readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
    return (Number(fields[11]) + Number(fields[12])) / 100;
  } catch {
    return 0;
  }
};
/** Every process whose command line names the cluster's data folder or is a child of its postmaster. */
const postgresPids = (postmaster: number): number[] =>
  fs
    .readdirSync('/proc')
    .filter((d) => /^\d+$/.test(d))
    .map(Number)
    .filter((pid) => {
      try {
        const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
        return pid === postmaster || Number(stat[1]) === postmaster;
      } catch {
        return false;
      }
    });
/** PostgreSQL's CPU including its ended children (a backend that exits keeps its time in the postmaster's cutime/cstime). */
const postgresCpu = (postmaster: number): number => {
  let sum = 0;
  for (const pid of postgresPids(postmaster)) sum += cpuSeconds(pid);
  try {
    const f = fs.readFileSync(`/proc/${postmaster}/stat`, 'utf8').split(') ')[1].split(' ');
    sum += (Number(f[13]) + Number(f[14])) / 100;
  } catch {}
  return sum;
};

interface ProfileNode {
  id: number;
  callFrame: { functionName: string; url: string; lineNumber: number };
  hitCount: number;
  children?: number[];
}

/** Microseconds of the monotonic clock, the one V8's profiler stamps its samples with. */
const nowMicros = () => Number(process.hrtime.bigint() / 1000n);

/** The profile's samples taken within `window` (µs), counted by the function they were in. */
function summarise(file: string, window: [number, number]): void {
  const profile = JSON.parse(fs.readFileSync(file, 'utf8')) as { nodes: ProfileNode[]; startTime: number; samples: number[]; timeDeltas: number[] };
  const hits = new Map<number, number>();
  let t = profile.startTime;
  profile.samples.forEach((id, i) => {
    t += profile.timeDeltas[i];
    if (t >= window[0] && t <= window[1]) hits.set(id, (hits.get(id) ?? 0) + 1);
  });
  for (const n of profile.nodes) n.hitCount = hits.get(n.id) ?? 0;
  const total = profile.nodes.reduce((s, n) => s + n.hitCount, 0);
  if (total === 0) return;
  const bySelf = new Map<string, number>();
  const byFile = new Map<string, number>();
  for (const n of profile.nodes) {
    const url = n.callFrame.url.replace(`file://${root}/`, '').replace(/^.*node_modules\//, 'node_modules/');
    const key = `${n.callFrame.functionName || '(anonymous)'} ${url}:${n.callFrame.lineNumber + 1}`;
    bySelf.set(key, (bySelf.get(key) ?? 0) + n.hitCount);
    const where = url.startsWith('node_modules/')
      ? url
          .split('/')
          .slice(0, url.startsWith('node_modules/@') ? 3 : 2)
          .join('/')
      : url || n.callFrame.functionName;
    byFile.set(where, (byFile.get(where) ?? 0) + n.hitCount);
  }
  // total time: each function counted once in every sample it is on the stack of (Headroom's own code and its packages' entry points)
  const parent = new Map<number, number>();
  for (const n of profile.nodes) for (const c of n.children ?? []) parent.set(c, n.id);
  const byId = new Map(profile.nodes.map((n) => [n.id, n]));
  const byTotal = new Map<string, number>();
  for (const n of profile.nodes) {
    if (!n.hitCount) continue;
    const seen = new Set<string>();
    for (let id: number | undefined = n.id; id !== undefined; id = parent.get(id)) {
      const f = byId.get(id)!.callFrame;
      const url = f.url.replace(`file://${root}/`, '');
      if (
        !/^(server|src)\//.test(url) &&
        !/node_modules\/(knex|pg|express|body-parser|express-session|connect-pg-simple|passport|csrf-csrf|helmet|piscina)\//.test(url)
      )
        continue;
      const key = `${f.functionName || '(anonymous)'} ${url.replace(/^.*node_modules\//, '')}:${f.lineNumber + 1}`;
      if (seen.has(key)) continue;
      seen.add(key);
      byTotal.set(key, (byTotal.get(key) ?? 0) + n.hitCount);
    }
  }
  const top = (m: Map<string, number>, k: number) =>
    [...m]
      .sort((a, b) => b[1] - a[1])
      .slice(0, k)
      .map(([name, hits]) => `  ${((100 * hits) / total).toFixed(1).padStart(5)} %  ${name}`)
      .join('\n');
  console.log(
    `\n${path.basename(file)}: ${total} samples\nself time, top functions:\n${top(bySelf, 30)}\nself time by package or file:\n${top(byFile, 15)}\ntotal time (self and callees):\n${top(byTotal, 45)}`,
  );
}

const cluster = await startCluster('profile');
/** the measured round, in the profiler's clock (µs) */
const window: [number, number] = [0, 0];
try {
  const app = await startNodeServer('server/index.ts', { DATABASE_URL: cluster.url }, ['--cpu-prof', `--cpu-prof-dir=${outDir}`]);
  try {
    const db = createDb(cluster.url);
    const users = await makeUsers(db, app.url, 10).finally(() => db.destroy());
    await round(app.url, users, 2, true);
    const postmaster = Number(fs.readFileSync(path.join(cluster.data, 'postmaster.pid'), 'utf8').split('\n')[0]);
    const app0 = cpuSeconds(app.pid);
    const pg0 = postgresCpu(postmaster);
    const t0 = Date.now();
    const micros0 = nowMicros();
    const result = await round(app.url, users, seconds, true);
    window.splice(0, 2, micros0, nowMicros());
    const wall = (Date.now() - t0) / 1000;
    const saves = result.rps * seconds;
    const appCpu = cpuSeconds(app.pid) - app0;
    const pgCpu = postgresCpu(postmaster) - pg0;
    console.log(`${result.rps.toFixed(0)} saves/s over ${seconds} s (${result.failed} failed; wall ${wall.toFixed(1)} s)`);
    console.log(`CPU per save: app process ${((1000 * appCpu) / saves).toFixed(2)} ms, PostgreSQL ${((1000 * pgCpu) / saves).toFixed(2)} ms`);
  } finally {
    await app.stop();
  }
  for (const f of fs.readdirSync(outDir).filter((f) => f.endsWith('.cpuprofile'))) summarise(path.join(outDir, f), window);
} finally {
  cluster.destroy();
}
