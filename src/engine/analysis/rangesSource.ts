/**
 * The source text of the engine's range checks (ranges.generated.ts), written from the document's
 * description (model/elements.ts) by `npx tsx scripts/generate-readers.ts`; a test fails while the
 * committed file is stale. Every key whose description names a range (model/limits.ts) is checked,
 * in the description's order; a key added there with a range is checked without an edit here.
 * Generated rather than interpreted for the reason the readers are (model/readerSource.ts): code that
 * reads fixed property names runs several times as fast as a loop over the keys.
 *
 * What is not described there is said here: which element an issue is reported on (its element
 * type and id), and which parts of the document this stage leaves to others.
 */
import type { ElementType } from '../errors';
import { tagOf, type AnyElement, type ValueShape } from '../model/describe';
import {
  CHECKED_FIXTURE,
  CRITERIA,
  DEVICE,
  EXPANSION_TANK,
  FED_FROM,
  FITTING,
  FIXTURE_GROUP,
  FLOOR,
  NODE,
  PLACEMENT,
  RECIRCULATION,
  SEGMENT,
  SIZING_BASIS,
  SOURCE,
  SYSTEM_DOCUMENT,
  UNIT_TYPE,
} from '../model/elements';
import type { LimitQuantity } from '../model/limits';

/**
 * Where a described element's issues are reported: its element type, and its id from its own `id`,
 * from another key, from the element holding it (a fixture group and a fitting are named by their
 * node and segment, as they have no id), or none (the criteria).
 */
const REPORTED = new Map<AnyElement, { type: ElementType; id: { key: string } | 'holder' | 'none' }>([
  [SYSTEM_DOCUMENT, { type: 'system', id: { key: 'id' } }],
  [SOURCE, { type: 'source', id: { key: 'nodeId' } }],
  [DEVICE, { type: 'device', id: { key: 'id' } }],
  [FLOOR, { type: 'floor', id: { key: 'id' } }],
  [NODE, { type: 'node', id: { key: 'id' } }],
  [FIXTURE_GROUP, { type: 'fixture-group', id: 'holder' }],
  [CHECKED_FIXTURE, { type: 'checked-fixture', id: { key: 'id' } }],
  [SEGMENT, { type: 'segment', id: { key: 'id' } }],
  [FITTING, { type: 'fitting', id: 'holder' }],
  [CRITERIA, { type: 'criteria', id: 'none' }],
]);

/**
 * Parts of the document this stage leaves alone: the cold-water feed (its resolution is written by
 * Headroom from the cold system's analysis, whose inputs were checked there), typical units and
 * placements (checked as the nodes and segments they expand into, building/expand.ts, so that an
 * issue names the expanded element), the hot-water inputs and the sizing basis (read by their own
 * post-passes, hotWater/ and sizing/, which word their own errors).
 */
const LEFT_TO_OTHERS = new Set<AnyElement>([FED_FROM, UNIT_TYPE, PLACEMENT, EXPANSION_TANK, RECIRCULATION, SIZING_BASIS]);

const checkName = (constant: string) =>
  'check' +
  constant
    .toLowerCase()
    .split('_')
    .map((w) => w[0].toUpperCase() + w.slice(1))
    .join('');

/** `elements`: the described elements by their exported constant name (elements.ts). */
export function rangeCheckSource(elements: Record<string, AnyElement>): string {
  const names = new Map<AnyElement, string>();
  for (const [constant, e] of Object.entries(elements)) names.set(e, checkName(constant));
  const nameOf = (e: AnyElement) => {
    const n = names.get(e);
    if (!n) throw new Error(`element "${e.name}" is nested but not exported from elements.ts`);
    return n;
  };

  // Which values hold a ranged number this stage checks (memoised per element; the format has no cycles).
  const holds = new Map<AnyElement, boolean>();
  const elementHolds = (e: AnyElement): boolean => {
    let h = holds.get(e);
    if (h === undefined) {
      h = !LEFT_TO_OTHERS.has(e) && Object.values(e.keys).some((d) => shapeHolds(d.shape, d.range));
      holds.set(e, h);
    }
    return h;
  };
  const shapeHolds = (shape: ValueShape, range: LimitQuantity | undefined): boolean => {
    switch (shape.kind) {
      case 'number':
      case 'count':
        return range !== undefined;
      case 'list':
      case 'record':
        return shapeHolds(shape.item, range);
      case 'element':
        return elementHolds(shape.element);
      case 'union':
        return shape.of.some(elementHolds);
      default:
        return false;
    }
  };

  const helpers: string[] = [];
  let vars = 0;
  /** Statements checking the defined value `x` at path key `key` (an expression: a key, a list index or a record key), indented by `pad`. */
  const lines = (shape: ValueShape, range: LimitQuantity | undefined, x: string, key: string, pad: string): string[] => {
    switch (shape.kind) {
      case 'number':
      case 'count':
        return [`${pad}if (!inRange(b.${range}, ${x} as number)) c.fail(${JSON.stringify(range)}, ${key}, ${x});`];
      case 'list': {
        const l = `l${vars}`;
        const i = `i${vars++}`;
        return [
          `${pad}{`,
          `${pad}  const ${l} = ${x} as unknown[];`,
          `${pad}  c.path.push(${key});`,
          `${pad}  for (let ${i} = 0; ${i} < ${l}.length; ${i}++) {`,
          ...lines(shape.item, range, `${l}[${i}]`, i, `${pad}    `),
          `${pad}  }`,
          `${pad}  c.path.pop();`,
          `${pad}}`,
        ];
      }
      case 'record': {
        const r = `r${vars}`;
        const k = `k${vars++}`;
        return [
          `${pad}{`,
          `${pad}  const ${r} = ${x} as Obj;`,
          `${pad}  c.path.push(${key});`,
          `${pad}  for (const ${k} of Object.keys(${r})) {`,
          ...lines(shape.item, range, `${r}[${k}]`, k, `${pad}    `),
          `${pad}  }`,
          `${pad}  c.path.pop();`,
          `${pad}}`,
        ];
      }
      case 'element':
        return [`${pad}c.path.push(${key});`, `${pad}${nameOf(shape.element)}(${x} as Obj, c);`, `${pad}c.path.pop();`];
      case 'union': {
        const n = `checkUnion${helpers.length}`;
        helpers.push(unionChecker(n, shape));
        return [`${pad}c.path.push(${key});`, `${pad}${n}(${x} as Obj, c);`, `${pad}c.path.pop();`];
      }
      default:
        return [];
    }
  };
  /** A union: the option is picked as the reader picks it (the discriminator's value, or the key of its own). */
  const unionChecker = (n: string, shape: Extract<ValueShape, { kind: 'union' }>): string => {
    const d = shape.discriminator;
    const tests = shape.of.filter(elementHolds).map((e) => {
      if (d !== undefined) return `  if (o[${JSON.stringify(d)}] === ${JSON.stringify(tagOf(e, d))}) return ${nameOf(e)}(o, c);`;
      const own = Object.keys(e.keys).find((k) => e.keys[k].presence === 'required' && shape.of.every((f) => f === e || !(k in f.keys)));
      if (!own) throw new Error(`union option "${e.name}" has no required key of its own`);
      return `  if (${JSON.stringify(own)} in o) return ${nameOf(e)}(o, c);`;
    });
    return `function ${n}(o: Obj, c: RangeContext): void {\n${tests.join('\n')}\n}`;
  };

  // Only the elements reached from the document through what this stage checks.
  const reached = new Set<AnyElement>();
  const reach = (shape: ValueShape): void => {
    if (shape.kind === 'list' || shape.kind === 'record') reach(shape.item);
    else if (shape.kind === 'element') reachElement(shape.element);
    else if (shape.kind === 'union') shape.of.forEach(reachElement);
  };
  const reachElement = (e: AnyElement): void => {
    if (reached.has(e) || !elementHolds(e)) return;
    reached.add(e);
    for (const d of Object.values(e.keys)) reach(d.shape);
  };
  reachElement(SYSTEM_DOCUMENT);

  const functions = [...names]
    .filter(([e]) => reached.has(e))
    .map(([e, n]) => {
      const reported = REPORTED.get(e);
      const body: string[] = [];
      for (const [k, d] of Object.entries(e.keys)) {
        if (!shapeHolds(d.shape, d.range)) continue;
        const at = /^[A-Za-z_$][\w$]*$/.test(k) ? `.${k}` : `[${JSON.stringify(k)}]`;
        body.push(`  {`, `    const x = o${at};`, `    if (x !== undefined) {`, ...lines(d.shape, d.range, 'x', JSON.stringify(k), '      '), `    }`, `  }`);
      }
      const enter = reported
        ? [
            `  const type = c.type;`,
            `  const id = c.id;`,
            `  const depth = c.depth;`,
            `  c.type = ${JSON.stringify(reported.type)};`,
            ...(reported.id === 'holder' ? [] : [`  c.id = ${reported.id === 'none' ? 'null' : `o.${reported.id.key} as string`};`]),
            `  c.depth = c.path.length;`,
          ]
        : [];
      const leave = reported ? [`  c.type = type;`, `  c.id = id;`, `  c.depth = depth;`] : [];
      return [
        `/** The ranged numbers of the ${e.name}. */`,
        `${e === SYSTEM_DOCUMENT ? 'export ' : ''}function ${n}(o: Obj, c: RangeContext): void {`,
        ...(body.some((l) => l.includes('inRange(b.')) ? [`  const b = c.bounds;`] : []),
        ...enter,
        ...body,
        ...leave,
        `}`,
      ].join('\n');
    });

  return [
    '// Generated by scripts/generate-readers.ts from the descriptions in model/elements.ts (rangesSource.ts): do not edit.',
    '// Each function checks the ranged numbers of one element and calls c.fail for a value out of range (ranges.ts).',
    "import type { Obj } from '../model/describe';",
    "import { inRange, type RangeContext } from './rangeContext';",
    '',
    ...functions.flatMap((f) => [f, '']),
    ...helpers.flatMap((h) => [h, '']),
  ]
    .join('\n')
    .replace(/\n+$/, '\n');
}
