/**
 * The one table `npm run bench` prints: each row a median over repeated runs and, when it has
 * one, the median of a peer measured in the same run, with their ratio (ours ÷ peer).
 */
import os from 'node:os';

export type Unit = 'ms' | 'req/s' | 'kB' | 'px' | 'count';

export interface BenchRow {
  /** what is measured, e.g. "engine: 40-storey building, 5,000 segments, analyzeSystem" */
  figure: string;
  unit: Unit;
  median: number;
  /** how many timed runs (or rounds, or edits) the median is over */
  runs: number;
  peer?: { name: string; median: number };
  /** the stated aim for this figure, as text (e.g. "< 10 ms"), from issue #7 / the README */
  aim?: string;
  /** something the reader must know to read the row (a failed part, a stale build) */
  note?: string;
}

export function median(xs: readonly number[]): number {
  if (xs.length === 0) return Number.NaN;
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

function fmt(value: number, unit: Unit): string {
  if (!Number.isFinite(value)) return '—';
  if (unit === 'req/s') return `${Math.round(value).toLocaleString('en-US')} req/s`;
  if (unit === 'kB') return `${value.toFixed(1)} kB`;
  if (unit === 'px') return `${Math.round(value).toLocaleString('en-US')} px`;
  if (unit === 'count') return Math.round(value).toLocaleString('en-US');
  return `${value < 10 ? value.toFixed(2) : value.toFixed(1)} ms`;
}

/** ours ÷ peer: for times and sizes lower is better, for req/s higher is better (the note says so). */
export function ratioOf(row: BenchRow): string {
  if (!row.peer || !Number.isFinite(row.peer.median) || row.peer.median === 0 || !Number.isFinite(row.median)) return '—';
  return (row.median / row.peer.median).toFixed(2);
}

const HEADER = ['figure', 'median', 'runs', 'peer (same run)', 'peer median', 'ratio', 'aim'];

function cells(row: BenchRow): string[] {
  return [
    row.note ? `${row.figure} (${row.note})` : row.figure,
    fmt(row.median, row.unit),
    String(row.runs),
    row.peer?.name ?? '—',
    row.peer ? fmt(row.peer.median, row.unit) : '—',
    ratioOf(row),
    row.aim ?? '—',
  ];
}

export function markdownTable(rows: readonly BenchRow[]): string {
  const esc = (s: string) => s.replace(/\|/g, '\\|');
  const lines = [`| ${HEADER.join(' | ')} |`, `|${HEADER.map((_, i) => (i === 0 || i === 3 || i === 6 ? '---' : '---:')).join('|')}|`];
  for (const r of rows) lines.push(`| ${cells(r).map(esc).join(' | ')} |`);
  return lines.join('\n');
}

/** The machine the figures came from, and how busy it was (other work on the machine makes them noisy). */
export function machineLine(loadStart: number[], loadEnd: number[]): string {
  const cpu = os.cpus();
  const la = (l: number[]) => l.map((x) => x.toFixed(2)).join(' / ');
  return `${cpu.length} cores (${cpu[0]?.model.trim() ?? 'unknown CPU'}), Node ${process.version}, ${os.type()} ${os.release()}; load average (1/5/15 min) ${la(loadStart)} at start, ${la(loadEnd)} at end`;
}
