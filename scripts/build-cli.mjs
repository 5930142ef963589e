/**
 * Builds the command-line entries into one self-contained, minified CommonJS file each (dist-cli/),
 * so a call starts plain Node on JavaScript instead of loading a TypeScript loader and compiling
 * the engine on every run. esbuild is the bundler Vite and tsx already bring (pinned in package.json).
 *   node scripts/build-cli.mjs        → build (also run by `npm run build`)
 * Beside each bundle, `<name>.inputs.json` lists the files it was built from (esbuild's metafile:
 * the sources it bundled, one package.json per bundled package, and this script), so the launcher
 * (scripts/calc.mjs) knows it is stale by a few stats of exactly those files, without walking src/.
 * CommonJS, not ESM: the launcher runs the bundle through node:vm with V8's code cache (the compiled
 * code kept beside the bundle), which skips most of the parse and compile on every later start.
 * The file is one function expression, (function (exports, require, module, __filename, __dirname)
 * {…}), Node's own CommonJS wrapper: not for require(), only for the launcher.
 * Minified (no comments, short names) and ASCII only (esbuild escapes the rest): less to read, and
 * the launcher reads it as one-byte Latin-1 text, which is quicker than decoding UTF-8.
 */
import { build } from 'esbuild';
import { mkdirSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import path from 'node:path';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

/** The entries: name → TypeScript source (relative to the repository root). */
export const CLI_ENTRIES = { calc: 'scripts/calc.ts' };

/** Where an entry's bundle, its input list and its V8 code cache go. */
export const bundlePath = (name) => path.join(root, 'dist-cli', `${name}.cjs`);
export const inputsPath = (name) => path.join(root, 'dist-cli', `${name}.inputs.json`);
export const codeCachePath = (name) => path.join(root, 'dist-cli', `${name}.v8cache`);

/**
 * The files a bundle depends on, relative to the root: every bundled source outside node_modules;
 * for a bundled package, its package.json (npm rewrites it when the package changes).
 */
function inputsOf(metafile) {
  const files = new Set(['scripts/build-cli.mjs']);
  for (const input of Object.keys(metafile.inputs)) {
    const abs = path.resolve(root, input);
    const nm = abs.lastIndexOf(`${path.sep}node_modules${path.sep}`);
    if (nm < 0) {
      files.add(path.relative(root, abs));
      continue;
    }
    // The package as the repository sees it (node_modules may be a link to another checkout's).
    const rest = abs.slice(nm + '/node_modules/'.length).split(path.sep);
    const pkg = rest[0].startsWith('@') ? rest.slice(0, 2) : rest.slice(0, 1);
    files.add(path.join('node_modules', ...pkg, 'package.json'));
  }
  return [...files].sort();
}

/** Bundle every entry (or the named ones); resolves when written. A stale code cache is removed. */
export async function buildCli(names = Object.keys(CLI_ENTRIES)) {
  mkdirSync(path.join(root, 'dist-cli'), { recursive: true });
  await Promise.all(
    names.map(async (name) => {
      rmSync(codeCachePath(name), { force: true });
      const result = await build({
        entryPoints: [path.join(root, CLI_ENTRIES[name])],
        // metafile paths relative to the root, whatever the caller's working directory
        absWorkingDir: root,
        // written beside, then renamed: a concurrent start never reads half a bundle
        outfile: `${bundlePath(name)}.${process.pid}`,
        bundle: true,
        platform: 'node',
        format: 'cjs',
        target: 'node20',
        // zod and the engine are bundled in; only Node's own modules stay external.
        packages: 'bundle',
        minify: true,
        charset: 'ascii',
        metafile: true,
        logLevel: 'warning',
        legalComments: 'none',
        // The CommonJS wrapper written into the file: the launcher compiles the file as it is,
        // without building a second copy of its text (see scripts/calc.mjs).
        banner: { js: '(function (exports, require, module, __filename, __dirname) {' },
        footer: { js: '})' },
      });
      // The input list is written before the bundle: a bundle is never newer than a list that does not describe it.
      writeFileSync(inputsPath(name), JSON.stringify(inputsOf(result.metafile)) + '\n');
      renameSync(`${bundlePath(name)}.${process.pid}`, bundlePath(name));
    }),
  );
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  await buildCli();
}
