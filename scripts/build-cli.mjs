/**
 * Builds the command-line entries into one self-contained CommonJS file each (dist-cli/), so a call
 * starts plain Node on JavaScript instead of loading a TypeScript loader and compiling the engine on
 * every run. esbuild is the bundler Vite and tsx already bring (pinned in package.json).
 *   node scripts/build-cli.mjs        → build (also run by `npm run build`)
 * scripts/calc.mjs calls buildCli() itself when a source is newer than the bundle.
 * CommonJS, not ESM: the launcher runs the bundle through node:vm with V8's code cache (the compiled
 * code kept beside the bundle), which skips most of the parse and compile on every later start.
 */
import { build } from 'esbuild';
import { rmSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import path from 'node:path';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

/** The entries: name → TypeScript source (relative to the repository root). */
export const CLI_ENTRIES = { calc: 'scripts/calc.ts' };

/** Where an entry's bundle and its V8 code cache go. */
export const bundlePath = (name) => path.join(root, 'dist-cli', `${name}.cjs`);
export const codeCachePath = (name) => path.join(root, 'dist-cli', `${name}.v8cache`);

/** Bundle every entry (or the named ones); resolves when written. A stale code cache is removed. */
export async function buildCli(names = Object.keys(CLI_ENTRIES)) {
  await Promise.all(
    names.map(async (name) => {
      rmSync(codeCachePath(name), { force: true });
      await build({
        entryPoints: [path.join(root, CLI_ENTRIES[name])],
        outfile: bundlePath(name),
        bundle: true,
        platform: 'node',
        format: 'cjs',
        target: 'node20',
        // zod and the engine are bundled in; only Node's own modules stay external.
        packages: 'bundle',
        logLevel: 'warning',
        legalComments: 'none',
      });
    }),
  );
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  await buildCli();
}
