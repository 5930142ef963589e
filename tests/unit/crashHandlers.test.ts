import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const root = path.resolve(__dirname, '../..');

/** Runs a few lines in a fresh Node process with the server's logger and crash handlers installed. */
function runWithHandlers(body: string) {
  const script = `
    import { installCrashHandlers, log } from './server/log.ts';
    installCrashHandlers(async () => { log.info('stop ran'); });
    ${body}
  `;
  return spawnSync(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', script], { cwd: root, encoding: 'utf8', timeout: 60_000 });
}

const lines = (out: string) =>
  out
    .split('\n')
    .filter(Boolean)
    .map((l) => JSON.parse(l) as { level: number; msg: string; err?: { message: string; stack: string } });

describe('process-level failures', () => {
  it('when a promise is rejected with nobody to catch it, then the process logs it as fatal with its stack, runs its stop and exits 1', () => {
    const r = runWithHandlers(`Promise.reject(new Error('pool gone at night'));`);
    expect(r.status).toBe(1);
    const logged = lines(r.stdout);
    const fatal = logged.find((l) => l.level === 60);
    expect(fatal?.msg).toMatch(/unhandled promise rejection/);
    expect(fatal?.err?.message).toBe('pool gone at night');
    expect(fatal?.err?.stack).toMatch(/Error: pool gone at night/);
    expect(logged.some((l) => l.msg === 'stop ran')).toBe(true);
  });

  it('when an exception is thrown outside any request, then the same happens', () => {
    const r = runWithHandlers(`setTimeout(() => { throw new TypeError('no such row'); }, 0);`);
    expect(r.status).toBe(1);
    const fatal = lines(r.stdout).find((l) => l.level === 60);
    expect(fatal?.msg).toMatch(/uncaught exception/);
    expect(fatal?.err?.message).toBe('no such row');
  });
});
