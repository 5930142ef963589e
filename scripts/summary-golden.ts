/**
 * Writes the golden text of the issued summary's model for each example system to
 * tests/engine/summary-golden/<name>.txt (permit fields, attestation, friction per segment, every
 * fixture's ledger, the profile chart's ticks, the riser diagram's elements by floor and device).
 * tests/engine/summaryGolden.test.ts makes the same text and compares; run this after an intended
 * change and commit the files (say why).
 *
 *   npx tsx scripts/summary-golden.ts
 */
import { readdirSync, writeFileSync, mkdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { goldenSummaryText } from '../tests/engine/summary-golden/input';

const examples = fileURLToPath(new URL('../src/engine/examples/', import.meta.url));
const target = fileURLToPath(new URL('../tests/engine/summary-golden/', import.meta.url));
mkdirSync(target, { recursive: true });
for (const file of readdirSync(examples)
  .filter((f) => f.endsWith('.json'))
  .sort()) {
  const name = file.replace(/\.json$/, '');
  const text = goldenSummaryText(examples + file);
  writeFileSync(`${target}${name}.txt`, text);
  process.stdout.write(`wrote tests/engine/summary-golden/${name}.txt (${text.split('\n').length} lines)\n`);
}
