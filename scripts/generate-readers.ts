/**
 * Writes the code generated from the document's description (src/engine/model/elements.ts): the fast
 * readers (src/engine/model/readers.generated.ts) and the engine's range checks
 * (src/engine/analysis/ranges.generated.ts). A test fails while either is stale.
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { rangeCheckSource } from '../src/engine/analysis/rangesSource';
import { describedElements } from '../src/engine/model/elements';
import { readerSource } from '../src/engine/model/readerSource';

for (const [file, source] of [
  ['../src/engine/model/readers.generated.ts', readerSource(describedElements())],
  ['../src/engine/analysis/ranges.generated.ts', rangeCheckSource(describedElements())],
] as const) {
  const target = fileURLToPath(new URL(file, import.meta.url));
  writeFileSync(target, source);
  process.stdout.write(`wrote ${target}\n`);
}
