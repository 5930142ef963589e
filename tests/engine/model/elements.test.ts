/**
 * The element descriptions (src/engine/model/elements.ts) and what is derived from them
 * (describe.ts): the zod schema and the fast reader agree on a described element of every kind of
 * key, every number has a plausible range, and the field change's keys are the segment's pipe,
 * length and fittings. These are consistency checks of the format (no published values).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  DECLINED,
  element,
  fieldChangeKeys,
  optional,
  rangedPaths,
  required,
  value,
  withDefault,
  type AnyElement,
  type ValueShape,
} from '../../../src/engine/model/describe';
import { CHECKED_FIXTURE, CUSTOM_PIPE, describedElements, FITTING, FIXTURE_GROUP, NODE, SEGMENT } from '../../../src/engine/model/elements';
import { readerSource } from '../../../src/engine/model/readerSource';
import { LIMITS } from '../../../src/engine/model/limits';
import { NodeSchema, SegmentSchema } from '../../../src/engine/model/schema';

/** The reader's answer: the value, or 'declined'. */
function read(e: AnyElement, v: unknown): unknown {
  try {
    return e.read(v);
  } catch (err) {
    if (err === DECLINED) return 'declined';
    throw err;
  }
}

describe('a described element', () => {
  const probe = element('probe', {
    name: required(value.string(1, 5), { label: 'Name' }),
    flow: optional(value.positive(), { label: 'Flow', range: 'flow' }),
    kind: withDefault(value.oneOf(['a', 'b']), 'a', { label: 'Kind' }),
    items: withDefault(value.list(value.count(), 2), [], { label: 'Items' }),
    pipe: optional(value.element(CUSTOM_PIPE), { label: 'Pipe' }),
  });
  const pipe = { innerDiameter: 1, roughness: 0, hazenWilliamsC: 150, velocityClass: 'copper' };
  const cases: unknown[] = [
    { name: 'x' },
    { name: 'x', flow: undefined },
    { name: 'x', flow: 2, kind: 'b', items: [1, 2], pipe },
    { items: [], name: 'x', kind: undefined },
    { name: '' },
    { name: 'x', flow: 0 },
    { name: 'x', flow: Number.NaN },
    { name: 'x', kind: 'c' },
    { name: 'x', items: [1, 2, 3] },
    { name: 'x', items: [1.5] },
    { name: 'x', extra: 1 },
    { name: 'x', pipe: { ...pipe, velocityClass: 'lead' } },
    { name: 'x', pipe: { ...pipe, note: 'extra' } },
    { flow: 1 },
    null,
    [],
  ];

  it('is read as zod parses it: the same value (keys in order, defaults) or declined where zod refuses', () => {
    let accepted = 0;
    for (const c of cases) {
      const z = probe.schema.safeParse(c);
      const fast = read(probe, c);
      if (!z.success) expect(fast, JSON.stringify(c)).toBe('declined');
      else {
        accepted++;
        expect(fast, JSON.stringify(c)).toStrictEqual(z.data);
        expect(Object.keys(fast as object)).toEqual(Object.keys(z.data));
      }
    }
    expect(accepted).toBe(4);
  });

  it('names the ranges of its numbers, nested ones included', () => {
    expect(rangedPaths(probe, '[]').map(([p, r]) => `${p.join('.')} ${r}`)).toEqual([
      'flow flow',
      'pipe.innerDiameter innerDiameter',
      'pipe.roughness roughness',
      'pipe.hazenWilliamsC hazenWilliamsC',
    ]);
  });
});

describe('the segment description', () => {
  it('is the zod schema the document uses', () => {
    expect(SegmentSchema).toBe(SEGMENT.schema);
    expect(NodeSchema).toBe(NODE.schema);
  });

  it('gives every number of the segment and the node (and what they hold) a plausible range', () => {
    const numbers: string[] = [];
    const walk = (e: AnyElement, path: string) => {
      for (const [k, d] of Object.entries(e.keys)) {
        const visit = (s: ValueShape, p: string): void => {
          if (s.kind === 'number' || s.kind === 'count') {
            numbers.push(p);
            expect(d.range, p).toBeDefined();
            expect(LIMITS[d.range!], p).toBeDefined();
          } else if (s.kind === 'list') visit(s.item, `${p}[]`);
          else if (s.kind === 'element') walk(s.element, p);
          else if (s.kind === 'union') for (const u of s.of) walk(u, p);
        };
        visit(d.shape, `${path}.${k}`);
      }
    };
    walk(SEGMENT, 'segment');
    walk(NODE, 'node');
    expect(numbers).toContain('segment.fittings[].custom.k');
    expect(numbers).toContain('node.fixtureGroups[].usage.recurrenceSeconds');
    expect(numbers.length).toBeGreaterThanOrEqual(20);
  });

  it('lets a field change change the pipe (catalog or custom), its length and its fittings, and nothing else', () => {
    expect(fieldChangeKeys(SEGMENT).sort()).toEqual(['custom', 'fittings', 'length', 'material', 'size']);
    expect(fieldChangeKeys(FITTING)).toEqual([]);
    expect(fieldChangeKeys(NODE)).toEqual([]);
  });

  it('labels every key', () => {
    for (const e of [SEGMENT, FITTING, CUSTOM_PIPE, NODE, FIXTURE_GROUP, CHECKED_FIXTURE])
      for (const [k, d] of Object.entries(e.keys)) expect(d.label.length, `${e.name}.${k}`).toBeGreaterThan(0);
  });
});

describe('the generated readers', () => {
  it('are the committed readers.generated.ts (run `npx tsx scripts/generate-readers.ts` after changing a description)', () => {
    const committed = readFileSync(new URL('../../../src/engine/model/readers.generated.ts', import.meta.url), 'utf8');
    expect(committed).toBe(readerSource(describedElements()));
  });
});
