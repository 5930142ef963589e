/**
 * `npm run calc` launcher: runs the prebuilt bundle dist-cli/calc.cjs, rebuilding it first when it is
 * missing or older than any engine source (src/engine/**, scripts/calc.ts, the build script) — so an
 * edited engine is never run stale, and an unchanged one starts without any compile step.
 * The bundle runs through node:vm with V8's code cache (dist-cli/calc.v8cache), written after the
 * first run and whenever V8 rejects it (another Node version): later starts skip most compiling.
 */
import { readdirSync, readFileSync, renameSync, statSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';
import path from 'node:path';
import vm from 'node:vm';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const bundle = path.join(root, 'dist-cli', 'calc.cjs');
const codeCache = path.join(root, 'dist-cli', 'calc.v8cache');
const SOURCES = [path.join(root, 'src', 'engine'), path.join(root, 'scripts', 'calc.ts'), path.join(root, 'scripts', 'build-cli.mjs')];

/** Newest modification time (ms) under a file or folder. */
function newestMtime(p) {
  const st = statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  let newest = st.mtimeMs; // a deleted or renamed file changes its folder's mtime
  for (const entry of readdirSync(p, { withFileTypes: true })) newest = Math.max(newest, newestMtime(path.join(p, entry.name)));
  return newest;
}

function mtimeOrNone(p) {
  try {
    return statSync(p).mtimeMs;
  } catch {
    return -Infinity;
  }
}

function readOrNone(p) {
  try {
    return readFileSync(p);
  } catch {
    return undefined;
  }
}

if (mtimeOrNone(bundle) < Math.max(...SOURCES.map(newestMtime))) {
  const { buildCli } = await import('./build-cli.mjs');
  await buildCli(['calc']);
}

const code = readFileSync(bundle, 'utf8');
const cachedData = readOrNone(codeCache);
const script = new vm.Script(`(function (exports, require, module, __filename, __dirname) {${code}\n})`, {
  filename: bundle,
  cachedData,
});
if (cachedData === undefined || script.cachedDataRejected) {
  // After the run, so the cache holds the functions the run compiled; written whole, then renamed,
  // so a concurrent start never reads half a file.
  process.once('exit', () => {
    try {
      const tmp = `${codeCache}.${process.pid}`;
      writeFileSync(tmp, script.createCachedData());
      renameSync(tmp, codeCache);
    } catch {
      // A read-only checkout still runs, only without the cache.
    }
  });
}
const mod = { exports: {} };
script.runInThisContext()(mod.exports, createRequire(bundle), mod, bundle, path.dirname(bundle));
