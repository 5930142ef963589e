/**
 * The fast reader of system documents (src/engine/model/fastParse.ts) against the zod schema,
 * which stays the source of truth. Property tests (fast-check) on generated valid documents and
 * on mutated (mostly invalid) ones: whenever the reader accepts, zod accepts and returns the
 * same value (same keys in the same order, same defaults, an optional key kept as undefined
 * exactly when zod keeps it, numbers equal by Object.is); whenever zod rejects, the reader
 * declines; and the reader declines a document zod accepts only for the rarities its doc comment
 * lists. These are consistency checks of two implementations of one format (no published values).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { SystemDocumentSchema, analyzeSystem } from '../../../src/engine';
import { analyzeValidated } from '../../../src/engine/analysis/analyze';
import { parseDocument } from '../../../src/engine/analysis/input';
import type { AnyElement, ValueShape } from '../../../src/engine/model/describe';
import { SYSTEM_DOCUMENT } from '../../../src/engine/model/elements';
import { fastParseSystemDocument } from '../../../src/engine/model/fastParse';
import { apartmentBuildingDocument } from '../../../src/engine/building/apartmentBuilding';
import { generateBuilding, generateRandomTree, mulberry32 } from '../../../src/engine/testing/generateTree';
import { oneSegment, smallTree } from '../support/docs';

const ABSENT = Symbol('absent');

/** An optional field: absent, present as undefined, or a value. */
const opt = <T>(arb: fc.Arbitrary<T>) => fc.oneof(fc.constant(ABSENT), fc.constant(undefined), arb);

/** Builds an object from generated fields, dropping ABSENT ones; `reverse` writes the keys in reverse order. */
function objectOf(fields: Record<string, unknown>, reverse: boolean): Record<string, unknown> {
  const entries = Object.entries(fields).filter(([, v]) => v !== ABSENT);
  if (reverse) entries.reverse();
  return Object.fromEntries(entries);
}

const rec = (fields: Record<string, fc.Arbitrary<unknown>>) => fc.tuple(fc.record(fields), fc.boolean()).map(([f, reverse]) => objectOf(f, reverse));

const finite = fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e6, max: 1e6 });
const positive = fc.double({ noNaN: true, min: Number.MIN_VALUE, max: 1e6 });
const nonNegative = fc.oneof(fc.constant(0), fc.constant(-0), positive);
const count = fc.integer({ min: 1, max: 20 });
const id = fc.oneof(fc.constantFrom('a', 'b', 'src', 'n1', 'é', '😀'), fc.string({ minLength: 1, maxLength: 12 }));
const text = fc.string({ maxLength: 8 });
const label = fc.string({ minLength: 1, maxLength: 8 });

/**
 * The generator of a described element (elements.ts), from its description: every key, optional
 * ones absent, undefined or present, lists of up to 3 items, strings within their bounds.
 */
function arbitraryOfShape(shape: ValueShape): fc.Arbitrary<unknown> {
  switch (shape.kind) {
    case 'number':
      if (shape.min !== undefined && shape.max !== undefined)
        return fc.oneof(fc.constant(shape.min), fc.constant(shape.max), fc.double({ noNaN: true, min: shape.min, max: shape.max }));
      return shape.sign === 'positive' ? positive : shape.sign === 'nonNegative' ? nonNegative : finite;
    case 'count':
      return shape.min === 1 ? count : fc.integer({ min: 0, max: 20 });
    case 'string': {
      const s = shape.min > 0 ? (shape.max >= 12 ? id : label) : text;
      const except = shape.except;
      return except === undefined ? s : s.filter((v) => v !== except);
    }
    case 'boolean':
      return fc.boolean();
    case 'literal':
      return fc.constant(shape.value);
    case 'enum':
      return fc.constantFrom(...shape.values);
    case 'list':
      return fc.array(arbitraryOfShape(shape.item), { minLength: shape.min, maxLength: Math.min(shape.max, 3) });
    case 'record':
      // A "__proto__" key is one of the rarities the reader declines (see fastParse.ts).
      return fc.dictionary(
        (arbitraryOfShape(shape.key) as fc.Arbitrary<string>).filter((k) => k !== '__proto__'),
        arbitraryOfShape(shape.item),
        { maxKeys: Math.min(shape.max, 3) },
      );
    case 'element':
      return arbitraryOf(shape.element);
    case 'union':
      return fc.oneof(...shape.of.map(arbitraryOf));
  }
}
function arbitraryOf(e: AnyElement): fc.Arbitrary<Record<string, unknown>> {
  const fields = Object.fromEntries(
    Object.entries(e.keys).map(([k, d]) => [k, d.presence === 'required' ? arbitraryOfShape(d.shape) : opt(arbitraryOfShape(d.shape))]),
  );
  return rec(fields);
}
/** Every key of the document, from its description: the generators cannot lag behind the format. */
const validDocument = arbitraryOf(SYSTEM_DOCUMENT);

/** Values that break (or sometimes keep) a field: wrong types, non-finite, signs, bounds, lengths. */
const weird = fc.constantFrom<unknown>(
  NaN,
  Infinity,
  -Infinity,
  -1,
  0,
  -0,
  0.5,
  1.5,
  2 ** 53,
  2 ** 53 - 1,
  1e308,
  '',
  'x',
  'x'.repeat(200),
  'x'.repeat(201),
  '😀'.repeat(100),
  '😀'.repeat(101),
  null,
  true,
  [],
  {},
  [1],
  { kind: 'fixed' },
  'flush-tank',
  'SI',
  'curve',
  undefined,
);

type Path = (string | number)[];

/** Every path to an object or array inside `v`, and the keys or indices there. */
function containers(v: unknown, path: Path = [], out: { path: Path; keys: (string | number)[] }[] = []) {
  if (v !== null && typeof v === 'object') {
    const keys: (string | number)[] = Array.isArray(v) ? v.map((_, i) => i) : Object.keys(v);
    out.push({ path, keys });
    for (const k of keys) containers((v as Record<string | number, unknown>)[k], [...path, k], out);
  }
  return out;
}

function at(v: unknown, path: Path): Record<string | number, unknown> {
  return path.reduce<unknown>((x, k) => (x as Record<string | number, unknown>)[k], v) as Record<string | number, unknown>;
}

/** One mutation at a chosen container: delete a key, replace a value, or add an unknown key. */
const mutated = fc.tuple(validDocument, fc.nat(), fc.nat(), fc.constantFrom('delete', 'replace', 'add'), weird).map(([doc, pickC, pickK, op, value]) => {
  const spots = containers(doc);
  const spot = spots[pickC % spots.length];
  const target = at(doc, spot.path);
  if (op === 'add' || spot.keys.length === 0) {
    if (Array.isArray(target)) target.push(value);
    else target.unknownKey = value;
  } else {
    const key = spot.keys[pickK % spot.keys.length];
    if (op === 'delete') {
      if (Array.isArray(target)) target.splice(key as number, 1);
      else delete target[key];
    } else target[key] = value;
  }
  return doc;
});

/** First difference between two values: key order, key presence (undefined included), Object.is on primitives. */
function difference(a: unknown, b: unknown, path = '$'): string | null {
  if (a === null || b === null || typeof a !== 'object' || typeof b !== 'object') {
    return Object.is(a, b) ? null : `${path}: ${String(a)} vs ${String(b)}`;
  }
  if (Array.isArray(a) !== Array.isArray(b)) return `${path}: array vs object`;
  const ka = Object.keys(a);
  const kb = Object.keys(b);
  if (ka.join('\u0000') !== kb.join('\u0000')) return `${path}: keys [${ka.join(',')}] vs [${kb.join(',')}]`;
  for (const k of ka) {
    const d = difference((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k], `${path}.${k}`);
    if (d) return d;
  }
  return null;
}

/** The rarities the fast reader declines although zod accepts them (see fastParse.ts). */
function hasRarity(v: unknown): boolean {
  if (typeof v === 'string') return v.length > 200;
  if (v === null || typeof v !== 'object') return false;
  if (!Array.isArray(v) && Object.getPrototypeOf(v) !== Object.prototype && Object.getPrototypeOf(v) !== null) return true;
  return Object.values(v).some(hasRarity);
}

function expectSameAsZod(doc: unknown): 'accepted' | 'rejected' | 'declined-rarity' {
  const z = SystemDocumentSchema.safeParse(doc);
  const fast = fastParseSystemDocument(doc);
  if (!z.success) {
    expect(fast).toBeUndefined();
    return 'rejected';
  }
  if (fast === undefined) {
    expect(hasRarity(doc)).toBe(true);
    return 'declined-rarity';
  }
  expect(difference(fast, z.data)).toBeNull();
  return 'accepted';
}

describe('fast reader ≡ zod schema', () => {
  it('generated valid documents: accepted with the same value and defaults', () => {
    let accepted = 0;
    fc.assert(
      fc.property(validDocument, (doc) => {
        if (expectSameAsZod(doc) === 'accepted') accepted++;
      }),
      { numRuns: 400 },
    );
    // The generator makes documents the schema accepts (strings stay short); all must be read fast.
    expect(accepted).toBe(400);
  });

  it('mutated documents: the same verdict, and the same value when valid', () => {
    const seen = { accepted: 0, rejected: 0, 'declined-rarity': 0 };
    fc.assert(
      fc.property(mutated, (doc) => {
        seen[expectSameAsZod(doc)]++;
      }),
      { numRuns: 1500 },
    );
    // Both outcomes must actually be exercised for the property to mean anything.
    expect(seen.rejected).toBeGreaterThan(300);
    expect(seen.accepted).toBeGreaterThan(100);
  });

  it('the example and generated documents', () => {
    const withOverrides = apartmentBuildingDocument(2);
    withOverrides.placements![0].overrides = { segments: { [withOverrides.unitTypes![0].segments[0].id]: { length: 12 } }, nodes: {} };
    const docs = [
      oneSegment(),
      smallTree(),
      generateBuilding({ storeys: 3 }),
      generateRandomTree(mulberry32(3), { segments: 50, fittingTypes: ['tee-run'] }),
      // Floors, typical units and placements (read by the fast reader since they are described).
      apartmentBuildingDocument(4),
      withOverrides,
    ];
    for (const doc of docs) expect(expectSameAsZod(doc)).toBe('accepted');
  });

  it('project data: custom fittings and fixture groups, valid and invalid, get the same verdict and value', () => {
    const withFitting = (custom: unknown) => {
      const d = oneSegment() as unknown as { segments: { fittings: unknown[] }[] };
      d.segments[0].fittings = [
        { typeId: 'elbow-90-standard', count: 1 },
        { typeId: 'project:e1', count: 2, custom },
      ];
      return d;
    };
    const withGroup = (custom: unknown) => {
      const d = oneSegment() as unknown as { nodes: { fixtureGroups?: unknown[] }[] };
      d.nodes[1].fixtureGroups = [{ fixtureTypeId: 'project:f1', count: 3, custom }];
      return d;
    };
    const valid = [
      withFitting({ label: 'Ball valve', k: 0.05, source: 'maker data sheet' }),
      withFitting({ source: 'maker data sheet', equivalentLength: 1.2, label: 'Ball valve' }),
      withFitting({ label: 'Zero', k: 0, source: 's' }),
      withGroup({ label: 'Bar sink', wsfuCold: 0.75, wsfuHot: 0.75, wsfuTotal: 1, flushValve: false, source: 'IPC Table E103.3(2)' }),
      withGroup({ label: 'Bar sink', wsfuTotal: 1, source: 's' }),
      withGroup({ label: 'Bar sink', wsfuTotal: 1, wsfuHot: undefined, source: 's' }),
    ];
    const invalid = [
      withFitting({ label: 'Both', k: 1, equivalentLength: 2, source: 's' }),
      withFitting({ label: 'Neither', source: 's' }),
      withFitting({ label: 'No source', k: 1 }),
      withFitting({ label: '', k: 1, source: 's' }),
      withFitting({ label: 'Negative', k: -1, source: 's' }),
      withFitting({ label: 'Undefined k', k: undefined, source: 's' }),
      withFitting({ label: 'Extra', k: 1, source: 's', note: 'x' }),
      withFitting({ label: 'NaN', equivalentLength: NaN, source: 's' }),
      withGroup({ label: 'No total', wsfuCold: 1, source: 's' }),
      withGroup({ label: 'Bad valve', wsfuTotal: 1, flushValve: 'yes', source: 's' }),
      withGroup({ label: 'Negative', wsfuTotal: 1, wsfuCold: -0.5, source: 's' }),
      withGroup({ label: 'Extra', wsfuTotal: 1, source: 's', minFlowPressure: 8 }),
    ];
    for (const doc of valid) expect(expectSameAsZod(doc)).toBe('accepted');
    for (const doc of invalid) expect(expectSameAsZod(doc)).toBe('rejected');
  });

  it('a hot system fed from a cold one: valid and invalid resolutions get the same verdict and value', () => {
    const withFedFrom = (fedFrom: unknown) => ({ ...oneSegment(), service: 'hot', source: { ...oneSegment().source, fedFrom } });
    const resolved = {
      status: 'resolved',
      systemName: 'Cold',
      nodeLabel: 'Heater feed',
      revisionNumber: 2,
      revisionStatus: 'draft',
      residualPressure: 420,
      staticPressureHigh: 480,
    };
    const valid = [
      withFedFrom({ systemId: 'cold', nodeId: 'heater-feed' }),
      withFedFrom({ systemId: 'cold', nodeId: 'heater-feed', resolution: resolved }),
      withFedFrom({ systemId: 'cold', nodeId: 'heater-feed', resolution: { status: 'unresolved', code: 'cold-node-missing', message: 'gone' } }),
    ];
    const invalid = [
      withFedFrom({ systemId: 'cold' }),
      withFedFrom({ systemId: '', nodeId: 'n' }),
      withFedFrom({ systemId: 'cold', nodeId: 'n', extra: 1 }),
      withFedFrom({ systemId: 'cold', nodeId: 'n', resolution: { ...resolved, revisionNumber: 0 } }),
      withFedFrom({ systemId: 'cold', nodeId: 'n', resolution: { ...resolved, revisionNumber: 1.5 } }),
      withFedFrom({ systemId: 'cold', nodeId: 'n', resolution: { ...resolved, revisionStatus: 'superseded' } }),
      withFedFrom({ systemId: 'cold', nodeId: 'n', resolution: { ...resolved, residualPressure: -1 } }),
      withFedFrom({ systemId: 'cold', nodeId: 'n', resolution: { ...resolved, code: 'x' } }),
      withFedFrom({ systemId: 'cold', nodeId: 'n', resolution: { status: 'unresolved', code: 'other', message: 'm' } }),
      withFedFrom({ systemId: 'cold', nodeId: 'n', resolution: { status: 'unresolved', code: 'cold-node-missing', message: '' } }),
      withFedFrom({ systemId: 'cold', nodeId: 'n', resolution: { status: 'maybe' } }),
    ];
    for (const doc of valid) expect(expectSameAsZod(doc)).toBe('accepted');
    for (const doc of invalid) expect(expectSameAsZod(doc)).toBe('rejected');
  });

  it('returns a fresh copy with fresh defaults, as zod does', () => {
    const doc = oneSegment();
    const a = fastParseSystemDocument(doc)!;
    const b = fastParseSystemDocument(doc)!;
    expect(a).not.toBe(doc);
    expect(a.segments[0]).not.toBe(doc.segments[0]);
    expect(a.segments[0].fittings).not.toBe(doc.segments[0].fittings);
    expect(a.nodes[0].fixtureGroups).not.toBe(b.nodes[0].fixtureGroups);
    expect(a.segments[0].reducerAuto).toBe(true);
  });

  it('declines the rarities, and parseDocument then gives what zod gives', () => {
    const longId = oneSegment();
    longId.segments[0].id = '😀'.repeat(150); // 300 UTF-16 units, 150 code points: zod accepts
    class Pipe {
      innerDiameter = 20;
      roughness = 0.0015;
      hazenWilliamsC = 150;
      velocityClass = 'plastic' as const;
    }
    const instance = oneSegment();
    delete instance.segments[0].material;
    delete instance.segments[0].size;
    instance.segments[0].custom = new Pipe();
    const protoKey = oneSegment({ criteria: JSON.parse('{"minFlowPressures": {"__proto__": 5, "lavatory-private": 50}}') });
    for (const doc of [longId, instance, protoKey]) {
      expect(fastParseSystemDocument(doc)).toBeUndefined();
      const z = SystemDocumentSchema.safeParse(doc);
      expect(z.success).toBe(true);
      expect(difference(parseDocument(doc), z.data)).toBeNull();
    }
  });

  it('analyzeSystem (fast reader) equals analyzeValidated on the zod-parsed document', () => {
    for (const doc of [smallTree(), generateBuilding({ storeys: 2 })]) {
      expect(analyzeSystem(doc)).toStrictEqual(analyzeValidated(SystemDocumentSchema.parse(doc)));
    }
  });
});
