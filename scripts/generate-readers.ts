/** Writes src/engine/model/readers.generated.ts, the fast readers of the described elements (elements.ts). */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describedElements } from '../src/engine/model/elements';
import { readerSource } from '../src/engine/model/readerSource';

const target = fileURLToPath(new URL('../src/engine/model/readers.generated.ts', import.meta.url));
writeFileSync(target, readerSource(describedElements()));
process.stdout.write(`wrote ${target}\n`);
