/** Writes the JSON Schema of a system document to src/engine/model/system.schema.json. */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { systemDocumentJsonSchema } from '../src/engine/model/schema';

const target = fileURLToPath(new URL('../src/engine/model/system.schema.json', import.meta.url));
const schema = {
  $id: 'https://headroom.invalid/schemas/system-document-v2.json',
  title: 'Headroom system document',
  ...systemDocumentJsonSchema(),
};
writeFileSync(target, JSON.stringify(schema, null, 2) + '\n');
process.stdout.write(`wrote ${target}\n`);
