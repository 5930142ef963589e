/**
 * Writes the golden results of the example systems (src/engine/examples/*.json) to
 * tests/engine/golden/<name>.json: the verdict, the critical fixture, every fixture's residual and
 * margin, every segment's flow, velocity and losses. tests/engine/golden.test.ts recomputes them
 * and compares exactly, so any change to any number of the examples fails a test until this script
 * is run again and the change is committed on purpose (say why in the commit).
 *
 *   npx tsx scripts/golden.ts
 */
import { readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { goldenOf } from '../tests/engine/golden/goldenOf';

const examples = fileURLToPath(new URL('../src/engine/examples/', import.meta.url));
const target = fileURLToPath(new URL('../tests/engine/golden/', import.meta.url));
for (const file of readdirSync(examples)
  .filter((f) => f.endsWith('.json'))
  .sort()) {
  const golden = goldenOf(JSON.parse(readFileSync(examples + file, 'utf8')));
  writeFileSync(target + file, JSON.stringify(golden, null, 1) + '\n');
  process.stdout.write(`wrote tests/engine/golden/${file}: ${golden.verdict}, critical ${golden.criticalFixtureId}\n`);
}
