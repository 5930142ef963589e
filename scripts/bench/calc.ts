/**
 * Command-line rows: the whole process of an engine run on the demo, from the shell's fork to its
 * exit, as a user waits for it — `node scripts/calc.mjs <demo>` (what `npm run calc` starts: the
 * prebuilt bundle with V8's code cache) and `npm run --silent calc -- <demo>` (npm's own start-up
 * on top) — against a bare `node -e ""`, the floor any Node command pays, timed alternately in the
 * same run. The bundle is built (or found current) once before timing.
 *
 * Alone: `npx tsx scripts/bench/calc.ts [runs]`.
 */
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { median, type BenchRow } from './table';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const DEMO = 'src/engine/examples/alder-finch-cold.json';

/** Wall time of one whole process in ms; throws when it fails (a bench of a broken command means nothing). */
function wall(cmd: string, args: string[]): number {
  const t = performance.now();
  const r = spawnSync(cmd, args, { cwd: root, stdio: ['ignore', 'ignore', 'pipe'], encoding: 'utf8' });
  const ms = performance.now() - t;
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')} exited ${r.status}: ${r.stderr.slice(-500)}`);
  return ms;
}

export function calcRows(runs: number, log: (m: string) => void = () => {}): BenchRow[] {
  // the first run builds the bundle when a source is newer, and writes the code cache: not timed
  wall(process.execPath, ['scripts/calc.mjs', DEMO]);
  const direct: number[] = [];
  const viaNpm: number[] = [];
  const bare: number[] = [];
  for (let i = 0; i < runs; i++) {
    bare.push(wall(process.execPath, ['-e', '']));
    direct.push(wall(process.execPath, ['scripts/calc.mjs', DEMO]));
    viaNpm.push(wall('npm', ['run', '--silent', 'calc', '--', DEMO]));
  }
  const peer = { name: 'bare `node -e ""`, same run', median: median(bare) };
  log(`calc: ${median(direct).toFixed(0)} ms (node scripts/calc.mjs), ${median(viaNpm).toFixed(0)} ms (npm run calc), bare node ${peer.median.toFixed(0)} ms`);
  return [
    { figure: 'command line: `node scripts/calc.mjs` on the demo, whole process', unit: 'ms', median: median(direct), runs, peer, aim: '≤ 300 ms' },
    {
      figure: 'command line: `npm run --silent calc` on the demo, whole process (npm start-up included)',
      unit: 'ms',
      median: median(viaNpm),
      runs,
      peer,
      aim: '≤ 300 ms',
    },
  ];
}

if (import.meta.url === `file://${process.argv[1]}`) {
  for (const r of calcRows(Number(process.argv[2] ?? 7), (m) => console.log(m)))
    console.log(`${r.figure}: ${r.median.toFixed(0)} ms, ratio ${(r.median / r.peer!.median).toFixed(2)}`);
}
