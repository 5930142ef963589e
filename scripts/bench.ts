/**
 * `npm run bench`: one table of Headroom's performance figures (issue #7). Each figure is a
 * median over repeated runs, beside the median of a peer measured in the same run and their
 * ratio (ours ÷ peer):
 *
 *   engine  — the 5,000-segment trees against EPANET (epanet-js) solving the same network;
 *   sizing  — automatic sizing of the 40-storey buildings against one analysis (scripts/bench/sizing.ts);
 *   PDF     — the issued summary against a one-page pdf-lib document with the same fonts;
 *   calc    — `npm run calc` on the demo, whole process, against a bare Node start (scripts/bench/calc.ts);
 *   API     — the draft save (the server's analysis) in req/s against a bare Express endpoint,
 *             and the same save with 2 app processes against 1 (HEADROOM_PROCESSES: the scaling);
 *   client  — the first page's gzip JavaScript against its library chunks, and edit-to-ledger
 *             in Chromium against the same page's event-plus-one-frame floor;
 *   entry   — a new user entering the 4- and 40-storey buildings from an empty project: field
 *             entries, clicks and the verdict after Generate (scripts/bench/entry.ts).
 *
 * The API and edit-to-ledger rows run the real server (`node --import tsx server/index.ts`) over
 * a throw-away PostgreSQL cluster (scripts/lib/postgres.mjs, via tests/load/world.ts), removed at
 * the end. Options:
 *
 *   npm run bench -- --quick          fewer runs and shorter rounds (about a third of the time)
 *   npm run bench -- --only engine,sizing,pdf,calc,api,processes,client,entry
 *   npm run bench -- --rebuild        build the client even when dist/ looks up to date
 *
 * Writes bench-output/bench.md (the table as markdown, with its date and machine) and
 * bench-output/bench.json. Figures from a shared or busy machine are noisy: the load average at
 * start and end is printed with them.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { engineRows } from './bench/engine';
import { sizingRows } from './bench/sizing';
import { pdfRows } from './bench/pdf';
import { apiRows, startNodeServer, type NodeServer } from './bench/api';
import { processRows } from './bench/processes';
import { calcRows } from './bench/calc';
import { buildClient, firstPageRow, ledgerRows } from './bench/client';
import { entryRows } from './bench/entry';
import { markdownTable, machineLine, ratioOf, type BenchRow } from './bench/table';
import { root, startCluster, type Cluster } from '../tests/load/world';

const args = process.argv.slice(2);
const quick = args.includes('--quick');
const onlyArg = args.find((a) => a.startsWith('--only'));
const onlyValue = onlyArg?.includes('=') ? onlyArg.split('=')[1] : onlyArg ? args[args.indexOf(onlyArg) + 1] : undefined;
const PARTS = ['engine', 'sizing', 'pdf', 'calc', 'api', 'processes', 'client', 'entry'] as const;
const only = new Set(onlyValue ? onlyValue.split(',') : PARTS);
for (const p of only) if (!(PARTS as readonly string[]).includes(p)) throw new Error(`--only: unknown part "${p}" (parts: ${PARTS.join(', ')})`);
const want = (p: (typeof PARTS)[number]) => only.has(p);

/**
 * Runs and rounds: choices that keep the whole bench well inside 5 minutes on 2 cores (about
 * 2¼ minutes measured on a busy machine, 1½ with --quick) while each median has at least 3 samples.
 */
const PLAN = quick
  ? { engineRepeats: 15, sizingRuns: 3, pdfRuns: 5, calcRuns: 5, apiRounds: 3, apiSeconds: 3, apiWarmup: 1, edits: 7 }
  : { engineRepeats: 40, sizingRuns: 5, pdfRuns: 9, calcRuns: 11, apiRounds: 7, apiSeconds: 5, apiWarmup: 2, edits: 15 };
/** 10 connections: the figure issue #7 names (and autocannon's default). */
const CONNECTIONS = 10;

const outDir = path.join(root, 'bench-output');
const tmpDir = path.join(outDir, 'tmp');
fs.mkdirSync(tmpDir, { recursive: true });
const started = Date.now();
const log = (m: string) => console.log(`[bench ${((Date.now() - started) / 1000).toFixed(0).padStart(3)} s] ${m}`);
const loadStart = os.loadavg();

let cluster: Cluster | null = null;
let app: NodeServer | null = null;
async function cleanup() {
  await app?.stop().catch(() => {});
  app = null;
  cluster?.destroy();
  cluster = null;
}
process.on('SIGINT', () => void cleanup().then(() => process.exit(130)));

const rows: BenchRow[] = [];
const problems: string[] = [];
try {
  // in-process parts first, on a machine this script has not yet loaded with servers and a browser
  if (want('engine')) {
    log(`engine: ${PLAN.engineRepeats} runs per case …`);
    rows.push(...(await engineRows(PLAN.engineRepeats, log)));
  }
  if (want('sizing')) {
    log(`sizing: ${PLAN.sizingRuns} runs per building …`);
    rows.push(...(await sizingRows(PLAN.sizingRuns, log)));
  }
  if (want('pdf')) {
    log(`PDF: ${PLAN.pdfRuns} runs per case …`);
    rows.push(...(await pdfRows(PLAN.pdfRuns)));
  }
  if (want('calc')) {
    log(`command line: ${PLAN.calcRuns} runs of each process …`);
    rows.push(...calcRows(PLAN.calcRuns, log));
  }
  const build = want('client') || want('entry') ? buildClient(args.includes('--rebuild'), log) : null;
  if (build && want('client')) rows.push(...firstPageRow(build));

  if (want('api') || want('processes') || ((want('client') || want('entry')) && build?.dist)) {
    log('a throw-away PostgreSQL cluster, migrated and seeded (scripts/db.ts setup) …');
    cluster = await startCluster('bench');
    // the client is served when there is a build, so the browser part can use the same server
    app = await startNodeServer('server/index.ts', { DATABASE_URL: cluster.url, HEADROOM_SERVE_CLIENT: build?.dist ? '1' : '0' });
    log(`Headroom server pid ${app.pid} on ${app.url}`);
  }
  if (want('api')) {
    try {
      rows.push(
        ...(await apiRows({
          cluster: cluster!,
          app: app!,
          connections: CONNECTIONS,
          rounds: PLAN.apiRounds,
          seconds: PLAN.apiSeconds,
          warmupSeconds: PLAN.apiWarmup,
          tmpDir,
          log,
        })),
      );
    } catch (err) {
      problems.push(`API: ${err instanceof Error ? err.message : err}`);
      rows.push({ figure: 'API: draft save with server analysis', unit: 'req/s', median: Number.NaN, runs: 0, note: 'failed; see the log' });
    }
  }
  if (want('processes')) {
    try {
      rows.push(
        ...(await processRows({
          cluster: cluster!,
          connections: CONNECTIONS,
          rounds: PLAN.apiRounds,
          seconds: PLAN.apiSeconds,
          warmupSeconds: PLAN.apiWarmup,
          log,
        })),
      );
    } catch (err) {
      problems.push(`processes: ${err instanceof Error ? err.message : err}`);
      rows.push({ figure: 'API: draft save with 2 app processes', unit: 'req/s', median: Number.NaN, runs: 0, note: 'failed; see the log' });
    }
  }
  if (want('client') && build?.dist) rows.push(...ledgerRows({ baseUrl: app!.url, edits: PLAN.edits, tmpDir, log, buildNote: build.note }));
  if (want('entry') && build?.dist) rows.push(...entryRows({ baseUrl: app!.url, tmpDir, log, buildNote: build.note }));
  else if (want('entry'))
    rows.push({ figure: 'client: building entry from an empty project', unit: 'count', median: Number.NaN, runs: 0, note: build?.note ?? 'no client build' });
} catch (err) {
  problems.push(err instanceof Error ? (err.stack ?? err.message) : String(err));
  if (app) problems.push(`server log (end):\n${app.log.join('').slice(-2000)}`);
} finally {
  await cleanup();
}

// the table in the order of the issue: engine, PDF, command line, API, client (a stable sort keeps each part's own order)
const SECTION = ['engine', 'PDF', 'command line', 'API', 'client'];
rows.sort((a, b) => SECTION.findIndex((p) => a.figure.startsWith(p)) - SECTION.findIndex((p) => b.figure.startsWith(p)));
const loadEnd = os.loadavg();
const when = new Date();
const machine = machineLine(loadStart, loadEnd);
const table = markdownTable(rows);
const notes = [
  `Ratio = ours ÷ peer: lower is better for times and sizes, higher is better for req/s (the share of a bare Express endpoint's throughput Headroom keeps).`,
  `Engine and PDF run in this process; the API rows run Headroom and the peer as child processes (node --import tsx) on loopback with autocannon; edit-to-ledger runs in Debian's Chromium through Playwright. kB = 1,000 bytes.`,
  quick ? 'Quick run (--quick): fewer runs and shorter rounds than the full bench.' : null,
].filter(Boolean);
const md = [`\`npm run ${quick ? 'bench -- --quick' : 'bench'}\`, ${when.toUTCString()}; ${machine}.`, '', table, '', ...notes.map((n) => `- ${n}`), ''].join(
  '\n',
);

console.log('\n' + table + '\n');
for (const n of notes) console.log(`- ${n}`);
console.log(`- Machine: ${machine}.`);
fs.writeFileSync(path.join(outDir, 'bench.md'), md);
fs.writeFileSync(
  path.join(outDir, 'bench.json'),
  JSON.stringify({ date: when.toISOString(), quick, machine, rows: rows.map((r) => ({ ...r, ratio: ratioOf(r) })) }, null, 2),
);
console.log(
  `\nwritten: ${path.relative(root, path.join(outDir, 'bench.md'))}, ${path.relative(root, path.join(outDir, 'bench.json'))} (${((Date.now() - started) / 1000).toFixed(0)} s in all)`,
);
const failedRows = rows.filter((r) => !Number.isFinite(r.median));
if (failedRows.length) problems.push(`rows without a figure: ${failedRows.map((r) => r.figure).join('; ')}`);
// kept when something failed: the Playwright traces and the peer's answer are in it
if (!problems.length) fs.rmSync(tmpDir, { recursive: true, force: true });
if (problems.length) {
  console.error('\nbench problems:\n' + problems.join('\n'));
  process.exit(1);
}
process.exit(0);
