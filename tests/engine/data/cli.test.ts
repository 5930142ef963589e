/**
 * The command line (`npm run calc` → scripts/calc.mjs → the prebuilt bundle dist-cli/calc.cjs):
 * the same analysis as the engine, the same structured errors as the server (safeAnalyzeSystem),
 * and a rebuild when the bundle is older than any source it was built from (the list beside it,
 * dist-cli/calc.inputs.json). (The product's own contract.)
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, statSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
import { analyzeSystem, safeAnalyzeSystem } from '../../../src/engine';

const run = promisify(execFile);
const ROOT = path.resolve(__dirname, '../../..');
const LAUNCHER = path.join(ROOT, 'scripts', 'calc.mjs');
const BUNDLE = path.join(ROOT, 'dist-cli', 'calc.cjs');
const DEMO = path.join(ROOT, 'src', 'engine', 'examples', 'alder-finch-cold.json');
const SMALL = path.join(ROOT, 'src', 'engine', 'examples', 'small-house.json');

async function calc(...args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  try {
    const { stdout, stderr } = await run(process.execPath, [LAUNCHER, ...args], { cwd: ROOT, maxBuffer: 64 * 1024 * 1024 });
    return { code: 0, stdout, stderr };
  } catch (e) {
    const err = e as { code: number; stdout: string; stderr: string };
    return { code: err.code, stdout: err.stdout, stderr: err.stderr };
  }
}

function tempDoc(mutate: (doc: { segments: { length: number }[] }) => void): string {
  const doc = JSON.parse(readFileSync(SMALL, 'utf8'));
  mutate(doc);
  const file = path.join(mkdtempSync(path.join(tmpdir(), 'headroom-calc-')), 'system.json');
  writeFileSync(file, JSON.stringify(doc));
  return file;
}

describe('npm run calc, from the prebuilt bundle', () => {
  it('prints the same analysis as analyzeSystem on the demo building', async () => {
    const r = await calc(DEMO);
    expect(r.code).toBe(0);
    const expected = analyzeSystem(JSON.parse(readFileSync(DEMO, 'utf8')));
    expect(JSON.parse(r.stdout)).toEqual(JSON.parse(JSON.stringify(expected)));
  });

  it('a length of 1e308 answers value-out-of-range as the server does, exit code 1', async () => {
    const file = tempDoc((d) => {
      d.segments[0].length = 1e308;
    });
    const server = safeAnalyzeSystem(JSON.parse(readFileSync(file, 'utf8')));
    expect(server.ok).toBe(false);
    const r = await calc(file);
    expect(r.code).toBe(1);
    const error = JSON.parse(r.stderr);
    expect(error.code).toBe('value-out-of-range');
    if (!server.ok) expect(error).toEqual(server.error.toJSON());
    expect(r.stdout).toBe('');
  });

  it('an unreadable file answers cannot-read; no arguments prints the usage with exit code 2', async () => {
    const missing = await calc(path.join(tmpdir(), 'no-such-headroom-system.json'));
    expect(missing.code).toBe(1);
    expect(JSON.parse(missing.stderr).code).toBe('cannot-read');
    const usage = await calc();
    expect(usage.code).toBe(2);
    expect(usage.stderr).toMatch(/usage/);
  });

  it('rebuilds the bundle when it is older than the engine sources', async () => {
    await calc(SMALL); // make sure a bundle exists
    const past = new Date('2001-01-01T00:00:00Z');
    utimesSync(BUNDLE, past, past);
    const r = await calc(SMALL);
    expect(r.code).toBe(0);
    expect(statSync(BUNDLE).mtimeMs).toBeGreaterThan(past.getTime() + 1000);
    expect(JSON.parse(r.stdout).systemId).toBe('small-house');
  });

  it('rebuilds when one engine source it was built from is newer, and not when none is', async () => {
    await calc(SMALL); // a current bundle
    const source = path.join(ROOT, 'src', 'engine', 'analysis', 'verdict.ts');
    const inputs: string[] = JSON.parse(readFileSync(path.join(ROOT, 'dist-cli', 'calc.inputs.json'), 'utf8'));
    expect(inputs).toContain('src/engine/analysis/verdict.ts');
    // Unchanged sources: the bundle is run as it is (its modification time stays).
    const fresh = new Date(Date.now() + 60_000);
    utimesSync(BUNDLE, fresh, fresh);
    expect((await calc(SMALL)).code).toBe(0);
    expect(Math.abs(statSync(BUNDLE).mtimeMs - fresh.getTime())).toBeLessThan(1);
    // One source edited after the build (its time set past the bundle's, then put back).
    const before = statSync(source);
    const later = new Date(fresh.getTime() + 60_000);
    utimesSync(source, later, later);
    try {
      const r = await calc(SMALL);
      expect(r.code).toBe(0);
      // rebuilt now, a minute before the time it was given
      expect(statSync(BUNDLE).mtimeMs).toBeLessThan(fresh.getTime() - 1000);
      expect(JSON.parse(r.stdout).systemId).toBe('small-house');
    } finally {
      utimesSync(source, before.atime, before.mtime);
    }
  });
});
