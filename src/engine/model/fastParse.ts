/**
 * A reading of SystemDocumentSchema for the hot path: the same checks, the same
 * defaults and the same output (a fresh copy, keys in the schema's order, an optional key kept
 * as `undefined` when the input has it so), without zod's per-value machinery.
 *
 * The document and every element in it are described once in elements.ts; zod's schema and this
 * reader (readers.generated.ts, written by `npx tsx scripts/generate-readers.ts`; a test fails while
 * it is stale) both follow from the descriptions, so a key added there needs no edit here.
 *
 * zod stays the reference. This reader either returns exactly what `SystemDocumentSchema.parse`
 * would return, or `undefined` — and then the caller runs zod, which decides and words the error
 * report. It declines (returns `undefined`) on everything invalid and also on a few valid rarities
 * it does not follow zod into: objects that are not plain JSON-like objects (class instances and
 * other non-plain prototypes), strings longer in UTF-16 units than their bound (DOCUMENT_BOUNDS;
 * zod counts code points there), and a "__proto__" key in a record (the minimum flow pressures, a
 * placement's overrides). Lists longer than their bound are declined (zod words the error). A
 * committed property test (tests/engine/model/fastParse.test.ts) compares the two on generated
 * valid and invalid documents.
 */
import { DECLINED } from './describe';
import { readSystemDocument } from './readers.generated';
import type { SystemDocument } from './schema';

/**
 * The document as SystemDocumentSchema.parse would return it, or undefined when this reader
 * declines it (invalid, or one of the rarities above): then run the zod schema.
 */
export function fastParseSystemDocument(doc: unknown): SystemDocument | undefined {
  try {
    return readSystemDocument(doc) as SystemDocument;
  } catch (e) {
    if (e === DECLINED) return undefined;
    throw e;
  }
}
