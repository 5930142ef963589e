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
import { CUSTOM_PIPE, describedElements, FITTING, NODE, SEGMENT, SYSTEM_DOCUMENT } from '../../../src/engine/model/elements';
import { readerSource } from '../../../src/engine/model/readerSource';
import { rangeCheckSource } from '../../../src/engine/analysis/rangesSource';
import { LIMITS } from '../../../src/engine/model/limits';
import { NodeSchema, SegmentSchema, SystemDocumentSchema } from '../../../src/engine/model/schema';

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

describe('a described element with the rarer kinds of value', () => {
  const fixed = element('fixed', { kind: required(value.literal('fixed'), { label: 'Kind' }), loss: required(value.nonNegative(), { label: 'Loss' }) });
  const curve = element('curve', {
    kind: required(value.literal('curve'), { label: 'Kind' }),
    points: required(value.list(value.count(), 3, 1), { label: 'Points' }),
  });
  const probe = element('rare probe', {
    version: required(value.literal(2), { label: 'Version' }),
    name: required(value.string(1, 5, { except: 'inlet', message: 'reserved' }), { label: 'Name' }),
    share: withDefault(value.between(0, 5), 0, { label: 'Share' }),
    changed: optional(value.wholeNumber(), { label: 'Changed' }),
    loss: optional(value.tagged('kind', [fixed, curve]), { label: 'Loss' }),
    byType: optional(value.record(value.string(1, 5), value.nonNegative(), { max: 2, message: 'at most 2' }), { label: 'By type' }),
  });
  const cases: unknown[] = [
    { version: 2, name: 'x' },
    { version: 2, name: 'x', share: 5, changed: 0, loss: { kind: 'fixed', loss: 0 }, byType: { a: 1, b: 0 } },
    { byType: {}, loss: { points: [1], kind: 'curve' }, name: 'abcde', version: 2, share: undefined },
    { version: 3, name: 'x' },
    { version: '2', name: 'x' },
    { version: 2, name: 'inlet' },
    { version: 2, name: 'x', share: 5.01 },
    { version: 2, name: 'x', share: -0.01 },
    { version: 2, name: 'x', changed: -1 },
    { version: 2, name: 'x', changed: 1.5 },
    { version: 2, name: 'x', loss: { kind: 'curve', points: [] } },
    { version: 2, name: 'x', loss: { kind: 'curve', loss: 1 } },
    { version: 2, name: 'x', loss: { kind: 'other', loss: 1 } },
    { version: 2, name: 'x', loss: { loss: 1 } },
    { version: 2, name: 'x', byType: { a: 1, b: 2, c: 3 } },
    { version: 2, name: 'x', byType: { '': 1 } },
    { version: 2, name: 'x', byType: { a: -1 } },
    { version: 2, name: 'x', byType: [] },
  ];

  it('is read as zod parses it: the same value or declined where zod refuses', () => {
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
    expect(accepted).toBe(3);
  });

  it("words zod's refusal of a reserved name and of too many record keys with the description's message", () => {
    const issues = (c: unknown) => (probe.schema.safeParse(c).error?.issues ?? []).map((i) => i.message);
    expect(issues({ version: 2, name: 'inlet' })).toEqual(['reserved']);
    expect(issues({ version: 2, name: 'x', byType: { a: 1, b: 2, c: 3 } })).toEqual(['at most 2']);
  });
});

describe('the segment description', () => {
  it('is the zod schema the document uses', () => {
    expect(SegmentSchema).toBe(SEGMENT.schema);
    expect(NodeSchema).toBe(NODE.schema);
    expect(SystemDocumentSchema).toBe(SYSTEM_DOCUMENT.schema);
  });

  it('gives every number of the document (and what its elements hold) a plausible range', () => {
    const numbers: string[] = [];
    const walk = (e: AnyElement, path: string) => {
      for (const [k, d] of Object.entries(e.keys)) {
        const visit = (s: ValueShape, p: string): void => {
          if (s.kind === 'number' || s.kind === 'count') {
            numbers.push(p);
            expect(d.range, p).toBeDefined();
            expect(LIMITS[d.range!], p).toBeDefined();
          } else if (s.kind === 'list') visit(s.item, `${p}[]`);
          else if (s.kind === 'record') visit(s.item, `${p}.*`);
          else if (s.kind === 'element') walk(s.element, p);
          else if (s.kind === 'union') for (const u of s.of) walk(u, p);
        };
        visit(d.shape, `${path}.${k}`);
      }
    };
    walk(SYSTEM_DOCUMENT, 'system');
    expect(numbers).toContain('system.segments[].fittings[].custom.k');
    expect(numbers).toContain('system.nodes[].fixtureGroups[].usage.recurrenceSeconds');
    expect(numbers).toContain('system.criteria.minFlowPressures.*');
    expect(numbers).toContain('system.placements[].overrides.segments.*.fittings[].count');
    expect(numbers).toContain('system.devices[].boost.shutoffGain');
    expect(numbers.length).toBeGreaterThanOrEqual(80);
  });

  it('lets a field change change the pipe (catalog or custom), its length and its fittings, and nothing else', () => {
    expect(fieldChangeKeys(SEGMENT).sort()).toEqual(['custom', 'fittings', 'length', 'material', 'size']);
    expect(fieldChangeKeys(FITTING)).toEqual([]);
    expect(fieldChangeKeys(NODE)).toEqual([]);
  });

  it('labels every key', () => {
    for (const e of Object.values(describedElements()))
      for (const [k, d] of Object.entries(e.keys)) expect(d.label.length, `${e.name}.${k}`).toBeGreaterThan(0);
  });
});

describe('the generated readers', () => {
  it('are the committed readers.generated.ts (run `npx tsx scripts/generate-readers.ts` after changing a description)', () => {
    const committed = readFileSync(new URL('../../../src/engine/model/readers.generated.ts', import.meta.url), 'utf8');
    expect(committed).toBe(readerSource(describedElements()));
  });

  it('and the range checks are the committed analysis/ranges.generated.ts (the same script writes both)', () => {
    const committed = readFileSync(new URL('../../../src/engine/analysis/ranges.generated.ts', import.meta.url), 'utf8');
    expect(committed).toBe(rangeCheckSource(describedElements()));
  });
});
