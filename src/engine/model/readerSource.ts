/**
 * The source text of the fast readers of the described elements (readers.generated.ts), written
 * from their descriptions by `npx tsx scripts/generate-readers.ts`; a test fails while the committed
 * file is stale. Generated code reads each key with a fixed property name, as a hand-written reader
 * does, so it is as fast as the hand-written readers it replaces (a reader looping over the keys at
 * run time measured about twice as slow); nothing is generated at run time (the engine runs in the
 * browser, whose content security policy forbids it).
 *
 * The semantics are the closure reader's of describe.ts (the reference, tested against zod), and the
 * property test of tests/engine/model/fastParse.test.ts compares the generated readers with zod.
 */
import { tagOf, type AnyElement, type Key, type ValueShape } from './describe';

const camel = (constant: string) =>
  'read' +
  constant
    .toLowerCase()
    .split('_')
    .map((w) => w[0].toUpperCase() + w.slice(1))
    .join('');

/** `elements`: the described elements by their exported constant name (nested ones included). */
export function readerSource(elements: Record<string, AnyElement>): string {
  const names = new Map<AnyElement, string>();
  for (const [constant, e] of Object.entries(elements)) names.set(e, camel(constant));
  const enums: string[] = [];
  const helpers: string[] = [];
  const nameOf = (e: AnyElement) => {
    const n = names.get(e);
    if (!n) throw new Error(`element "${e.name}" is nested but not exported from elements.ts`);
    return n;
  };

  /** An expression reading the defined value `x` of this shape. */
  const expr = (shape: ValueShape, x: string): string => {
    switch (shape.kind) {
      case 'number':
        if (shape.min !== undefined || shape.max !== undefined) {
          if (shape.sign !== 'any' || shape.min === undefined || shape.max === undefined) throw new Error('a bounded number has both bounds and no sign');
          return `readBetween(${x}, ${shape.min}, ${shape.max})`;
        }
        return shape.sign === 'positive' ? `readPositive(${x})` : shape.sign === 'nonNegative' ? `readNonNegative(${x})` : `readNumber(${x})`;
      case 'count':
        return shape.min === 1 ? `readPositiveInt(${x})` : `readNonNegativeInt(${x})`;
      case 'boolean':
        return `readBoolean(${x})`;
      case 'literal':
        return `readLiteral(${x}, ${JSON.stringify(shape.value)})`;
      case 'string':
        return shape.except === undefined
          ? `readBounded(${x}, ${shape.min}, ${shape.max})`
          : `readExcept(readBounded(${x}, ${shape.min}, ${shape.max}), ${JSON.stringify(shape.except)})`;
      case 'enum': {
        const n = `ENUM_${enums.length}`;
        enums.push(`const ${n} = ${JSON.stringify(shape.values)} as const;`);
        return `readOneOf(${x}, ${n})`;
      }
      case 'list':
        return `readList(${x}, ${itemReader(shape.item)}, ${shape.min}, ${shape.max})`;
      case 'record':
        return `readRecord(${x}, ${itemReader(shape.key)}, ${itemReader(shape.item)}, ${shape.max})`;
      case 'element':
        return `${nameOf(shape.element)}(${x})`;
      case 'union': {
        const n = `readUnion${helpers.length}`;
        helpers.push(shape.discriminator === undefined ? unionReader(n, shape.of) : taggedReader(n, shape.discriminator, shape.of));
        return `${n}(${x})`;
      }
    }
  };
  const itemReader = (shape: ValueShape): string => {
    if (shape.kind === 'element') return nameOf(shape.element);
    const n = `readItem${helpers.length}`;
    helpers.push(`function ${n}(x: unknown) {\n  return ${expr(shape, 'x')};\n}`);
    return n;
  };
  /** zod tries the options in order; each strict option has a required key no other has, so the key present decides. */
  const unionReader = (n: string, of: readonly AnyElement[]): string => {
    const lines = of.map((e) => {
      const own = Object.keys(e.keys).find((k) => e.keys[k].presence === 'required' && of.every((f) => f === e || !(k in f.keys)));
      if (!own) throw new Error(`union option "${e.name}" has no required key of its own`);
      return `  if (${JSON.stringify(own)} in o) return ${nameOf(e)}(o);`;
    });
    return `function ${n}(v: unknown) {\n  const o = obj(v);\n${lines.join('\n')}\n  return decline();\n}`;
  };

  /** A discriminated union: the discriminator's value picks the option. */
  const taggedReader = (n: string, discriminator: string, of: readonly AnyElement[]): string => {
    const at = `o[${JSON.stringify(discriminator)}]`;
    const lines = of.map((e) => `  if (${at} === ${JSON.stringify(tagOf(e, discriminator))}) return ${nameOf(e)}(o);`);
    return `function ${n}(v: unknown) {\n  const o = obj(v);\n${lines.join('\n')}\n  return decline();\n}`;
  };

  const keyLines = (k: string, d: Key): string[] => {
    const p = JSON.stringify(k);
    const at = /^[A-Za-z_$][\w$]*$/.test(k) ? `.${k}` : `[${p}]`;
    if (d.presence === 'required') return [`  out${at} = ${expr(d.shape, `o${at}`)};`, `  known++;`];
    if (d.presence === 'optional')
      return [`  if (${p} in o) {`, `    const x = o${at};`, `    out${at} = x === undefined ? undefined : ${expr(d.shape, 'x')};`, `    known++;`, `  }`];
    const fallback = Array.isArray(d.fallback) && d.fallback.length === 0 ? '[]' : JSON.stringify(d.fallback);
    return [`  {`, `    const x = o${at};`, `    out${at} = x === undefined ? ${fallback} : ${expr(d.shape, 'x')};`, `    if (${p} in o) known++;`, `  }`];
  };

  const functions = [...names].map(([e, n]) => {
    const body = Object.entries(e.keys).flatMap(([k, d]) => keyLines(k, d));
    return [
      `/** The ${e.name}. */`,
      `export function ${n}(v: unknown): Obj {`,
      `  const o = obj(v);`,
      `  const out: Obj = {};`,
      `  let known = 0;`,
      ...body,
      `  if (keyCount(o) !== known) decline();`,
      `  return out;`,
      `}`,
    ].join('\n');
  });

  const code = [...functions, ...helpers].join('\n');
  const primitives = [
    'readBetween',
    'readBoolean',
    'readBounded',
    'readExcept',
    'readList',
    'readLiteral',
    'readNonNegative',
    'readNonNegativeInt',
    'readNumber',
    'readOneOf',
    'readPositive',
    'readPositiveInt',
    'readRecord',
  ];
  const used = new Set(['decline', 'keyCount', 'obj', ...primitives.filter((f) => code.includes(`${f}(`) || code.includes(`${f},`))]);

  return [
    '// Generated by scripts/generate-readers.ts from the descriptions in elements.ts: do not edit.',
    "// Each reader returns what the element's zod schema returns, or throws DECLINED (describe.ts).",
    'import {',
    ...[...used].sort().map((u) => `  ${u},`),
    '  type Obj,',
    "} from './describe';",
    '',
    ...enums,
    '',
    ...functions.flatMap((f) => [f, '']),
    ...helpers.flatMap((h) => [h, '']),
  ]
    .join('\n')
    .replace(/\n+$/, '\n');
}
