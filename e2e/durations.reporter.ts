/**
 * Prints every test's measured duration beside its time-out and the share of the time-out it used,
 * slowest first, at the end of the run: the figures the time-outs in playwright.config.ts and the
 * specs' own test.setTimeout calls are sized from (a slow machine shows here before it fails).
 */
import type { FullResult, Reporter, TestCase, TestResult } from '@playwright/test/reporter';

interface Row {
  title: string;
  status: string;
  ms: number;
  timeout: number;
}

export default class DurationsReporter implements Reporter {
  private rows: Row[] = [];

  onTestEnd(test: TestCase, result: TestResult) {
    this.rows.push({ title: `${test.location.file.split('/').pop()} › ${test.title}`, status: result.status, ms: result.duration, timeout: test.timeout });
  }

  onEnd(result: FullResult) {
    const rows = this.rows.sort((a, b) => b.ms - a.ms);
    const lines = rows.map(
      (r) =>
        `${(r.ms / 1000).toFixed(1).padStart(7)} s  of ${(r.timeout / 1000).toFixed(0).padStart(4)} s  ${String(Math.round((100 * r.ms) / r.timeout)).padStart(3)} %  ${r.status.padEnd(8)} ${r.title.slice(0, 110)}`,
    );
    const total = rows.reduce((sum, r) => sum + r.ms, 0);
    process.stdout.write(`\nTest durations (slowest first; run ${result.status}, ${(total / 1000).toFixed(1)} s in tests):\n${lines.join('\n')}\n`);
  }

  printsToStdio() {
    return false;
  }
}
