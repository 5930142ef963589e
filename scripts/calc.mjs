/**
 * `npm run calc` launcher: runs the prebuilt bundle dist-cli/calc.cjs, rebuilding it first when it is
 * missing or older than any file it was built from — the list build-cli.mjs writes beside it
 * (dist-cli/calc.inputs.json: the engine sources it bundled, scripts/calc.ts, the build script and
 * zod's package.json). So an edited engine is never run stale, and an unchanged one starts after a
 * stat of each of those files: no walk of src/, no compile step.
 * The bundle runs through node:vm with V8's code cache (dist-cli/calc.v8cache), written after the
 * first run and whenever V8 rejects it (another Node version): later starts skip most compiling.
 * The bundle is ASCII (build-cli.mjs): read as Latin-1, a one-byte string, without UTF-8 decoding.
 */
import { readFileSync, renameSync, statSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';
import path from 'node:path';
import vm from 'node:vm';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const bundle = path.join(root, 'dist-cli', 'calc.cjs');
const inputs = path.join(root, 'dist-cli', 'calc.inputs.json');
const codeCache = path.join(root, 'dist-cli', 'calc.v8cache');

function readOrNone(p, encoding) {
  try {
    return readFileSync(p, encoding);
  } catch {
    return undefined;
  }
}

/** True when the bundle is missing, or a file it was built from is missing or newer than it. */
function stale() {
  const built = statSync(bundle, { throwIfNoEntry: false })?.mtimeMs;
  const list = readOrNone(inputs, 'utf8');
  if (built === undefined || list === undefined) return true;
  for (const file of JSON.parse(list)) {
    const st = statSync(path.join(root, file), { throwIfNoEntry: false });
    if (st === undefined || st.mtimeMs > built) return true;
  }
  return false;
}

if (stale()) {
  const { buildCli } = await import('./build-cli.mjs');
  await buildCli(['calc']);
}

const code = readFileSync(bundle, 'latin1');
const cachedData = readOrNone(codeCache);
// The file is already wrapped as a CommonJS function (build-cli.mjs): compiled as read.
const script = new vm.Script(code, {
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
