/**
 * A cheap look at a parsed JSON body before any schema sees it: no array longer and no object
 * wider than any request of this API needs. It walks the body once without
 * recursion and stops at the first thing over a bound, so a body built to make the schema report
 * one error per element (`"nodes":[{},{},…]`, issue 13 finding 1) costs a few milliseconds and a
 * one-line answer instead of a million errors.
 *
 * The bounds are ceilings over every route; the system document's own schema states tighter,
 * per-field ones, which the validation (server/http/validate.ts) reads and applies before it
 * looks at an array's elements.
 */
import { AppError } from './errors';
import { DOCUMENT_BOUNDS } from '../../src/engine/model/schema';

export const BODY_BOUNDS = {
  /**
   * Items in any one array. The largest arrays of any body are a system document's nodes and
   * segments. Sizing (a choice, with headroom): a 40-storey tower with 12 dwellings a floor
   * modelled one node per dwelling branch and per fixture group, plus the riser, floor-main and
   * device nodes, needs about 40 × (12 × 4 + 6) ≈ 2,200 nodes and as many segments; 10,000 is
   * over four times that. The JSON body limit (2 MB, server/app.ts) is reached near 6,000 real
   * segments anyway; the bound is about empty elements, which cost a few bytes each. It equals
   * the document's own largest list bound (DOCUMENT_BOUNDS.nodes) so the two never disagree.
   */
  maxArrayItems: DOCUMENT_BOUNDS.nodes,
  /**
   * Keys in any one object. The widest objects of any body have about 15 keys (a segment, a
   * source); the widest record (minimum flow pressures per fixture type) has one key per fixture
   * type of the catalogs, well under 200. Unknown keys are refused by the schemas anyway; this
   * keeps their error report short.
   */
  maxObjectKeys: 200,
} as const;

type Bounds = { maxArrayItems: number; maxObjectKeys: number };

/** The first place where `body` goes over a bound, as [field path, what is wrong], or null. */
export function firstOverBound(body: unknown, bounds: Bounds = BODY_BOUNDS): [string, string] | null {
  // depth is not bounded: nothing below walks a body recursively (the schemas stop at the first
  // level whose type is wrong, and this walk and the storability check use their own stack)
  const stack: [unknown, string][] = [[body, '']];
  while (stack.length) {
    const [value, path] = stack.pop()!;
    if (value === null || typeof value !== 'object') continue;
    const here = path || '(body)';
    const at = (k: string) => (path ? `${path}.${k}` : k);
    if (Array.isArray(value)) {
      if (value.length > bounds.maxArrayItems) return [here, `Has ${value.length} items; at most ${bounds.maxArrayItems} are accepted`];
      for (let i = value.length - 1; i >= 0; i--) if (value[i] !== null && typeof value[i] === 'object') stack.push([value[i], at(String(i))]);
    } else {
      let n = 0;
      for (const _key in value) {
        if (++n > bounds.maxObjectKeys) return [here, `Has more than ${bounds.maxObjectKeys} fields`];
      }
      // pushed last key first, so the walk (and the field it names) follows the body's order
      const entries = Object.entries(value);
      for (let i = entries.length - 1; i >= 0; i--) {
        const v = entries[i][1];
        if (v !== null && typeof v === 'object') stack.push([v, at(entries[i][0])]);
      }
    }
  }
  return null;
}

/** Refuses (400) a body over a bound, naming the first place; runs before any route's schema. */
export function assertWithinBounds(body: unknown): void {
  const found = firstOverBound(body);
  if (found) throw new AppError(400, 'VALIDATION_FAILED', 'The request is larger than any real one; nothing was read further.', { [found[0]]: found[1] });
}
