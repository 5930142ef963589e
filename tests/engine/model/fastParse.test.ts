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
import { NODE, SEGMENT } from '../../../src/engine/model/elements';
import { fastParseSystemDocument } from '../../../src/engine/model/fastParse';
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

const flowTest = rec({ staticPressure: positive, residualPressure: nonNegative, flow: positive, date: opt(text) });
const fedFromResolution = fc.oneof(
  rec({
    status: fc.constant('resolved'),
    systemName: text,
    nodeLabel: text,
    revisionNumber: count,
    revisionStatus: fc.constantFrom('draft', 'issued'),
    residualPressure: nonNegative,
    staticPressureHigh: nonNegative,
    closedBy: opt(fc.array(rec({ kind: fc.constantFrom('backflow-preventer', 'prv', 'check-valve'), elementId: id, label: text }), { maxLength: 2 })),
  }),
  rec({
    status: fc.constant('unresolved'),
    code: fc.constantFrom('cold-system-missing', 'cold-system-not-cold', 'cold-node-missing', 'cold-analysis-missing', 'not-yet-resolved'),
    message: label,
  }),
);
const fedFrom = rec({ systemId: id, nodeId: id, resolution: opt(fedFromResolution) });
const source = rec({
  kind: fc.constantFrom('utility-main', 'tank', 'booster-outlet'),
  nodeId: id,
  staticPressureLow: nonNegative,
  staticPressureHigh: nonNegative,
  pressureBasis: label,
  pressureDate: opt(text),
  flowTest: opt(flowTest),
  fedFrom: opt(fedFrom),
});
const deviceLoss = fc.oneof(
  rec({ kind: fc.constant('fixed'), loss: nonNegative }),
  rec({ kind: fc.constant('curve'), points: fc.array(rec({ flow: nonNegative, loss: nonNegative }), { minLength: 1, maxLength: 3 }) }),
);
const device = rec({
  id,
  kind: fc.constantFrom('meter', 'backflow-preventer', 'prv', 'strainer', 'softener', 'filter', 'water-heater', 'booster-pump', 'other'),
  label,
  segmentId: id,
  loss: deviceLoss,
  prv: opt(rec({ setPressure: positive, falloffPerFlow: opt(nonNegative) })),
  boost: opt(
    fc.oneof(
      rec({ gain: nonNegative }),
      rec({ control: fc.constant('constant-speed'), designGain: nonNegative, shutoffGain: nonNegative, designFlow: opt(positive) }),
      rec({ control: fc.constant('variable-speed'), setPressure: positive }),
    ),
  ),
});

/**
 * The generator of a described element (elements.ts), from its description: every key, optional
 * ones absent, undefined or present, lists of up to 3 items, strings within their bounds.
 */
function arbitraryOfShape(shape: ValueShape): fc.Arbitrary<unknown> {
  switch (shape.kind) {
    case 'number':
      return shape.sign === 'positive' ? positive : shape.sign === 'nonNegative' ? nonNegative : finite;
    case 'count':
      return count;
    case 'string':
      return shape.min > 0 ? (shape.max >= 12 ? id : label) : text;
    case 'boolean':
      return fc.boolean();
    case 'enum':
      return fc.constantFrom(...shape.values);
    case 'list':
      return fc.array(arbitraryOfShape(shape.item), { minLength: shape.min, maxLength: Math.min(shape.max, 3) });
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
const floor = rec({ id, name: label, elevation: finite });
const node = arbitraryOf(NODE);
const segment = arbitraryOf(SEGMENT);
const criteria = rec({
  maxStaticPressure: opt(positive),
  minStaticPressure: opt(nonNegative),
  velocityLimits: opt(
    fc.array(rec({ material: fc.constantFrom('copper', 'plastic', 'steel'), service: fc.constantFrom('cold', 'hot'), maxVelocity: positive }), {
      maxLength: 2,
    }),
  ),
  minFlowPressures: opt(
    fc.dictionary(
      fc.string({ minLength: 1, maxLength: 6 }).filter((k) => k !== '__proto__'),
      nonNegative,
      { maxKeys: 3 },
    ),
  ),
  demandCurve: opt(fc.constantFrom('auto', 'flush-tank', 'flush-valve')),
  demandMethod: opt(fc.constantFrom('hunter-table', 'hunter-binomial')),
  frictionMethod: opt(fc.constantFrom('colebrook', 'swamee-jain', 'churchill-1977', 'hazen-williams')),
  fittingMethod: opt(fc.constantFrom('crane', 'hooper-2k', 'darby-3k', 'equivalent-length')),
});
const recirculation = rec({
  segments: fc.array(rec({ id, label: opt(text), from: id, to: id, length: positive, material: id, size: opt(id), heatLoss: opt(nonNegative) }), {
    maxLength: 3,
  }),
  heatLossPerLength: opt(nonNegative),
  temperatureDrop: finite,
  hotTemperature: opt(finite),
  fittingAllowance: opt(fc.oneof(fc.constant(0), fc.constant(5), fc.double({ noNaN: true, min: 0, max: 5 }))),
  heaterLoss: opt(nonNegative),
});
const validDocument = rec({
  schemaVersion: fc.constant(2),
  id,
  name: label,
  service: fc.constantFrom('cold', 'hot'),
  unitSystem: fc.constantFrom('US', 'SI'),
  waterTemperature: finite,
  source,
  devices: opt(fc.array(device, { maxLength: 2 })),
  floors: opt(fc.array(floor, { maxLength: 2 })),
  nodes: fc.array(node, { minLength: 1, maxLength: 3 }),
  segments: fc.array(segment, { maxLength: 3 }),
  criteria: opt(criteria),
  expansionTank: opt(
    rec({ heaterVolume: nonNegative, coldTemperature: finite, hotTemperature: finite, supplyPressure: nonNegative, reliefPressure: positive }),
  ),
  recirculation: opt(recirculation),
  notes: opt(text),
  sizingBasis: opt(
    rec({
      sizedAt: text,
      scope: fc.constantFrom('system', 'selection'),
      margin: nonNegative,
      supplyPressure: nonNegative,
      velocityLimits: fc.array(rec({ material: fc.constantFrom('copper', 'plastic', 'steel'), maxVelocity: positive }), { maxLength: 2 }),
      segmentsChanged: fc.integer({ min: 0, max: 20 }),
      segmentsLocked: fc.integer({ min: 0, max: 20 }),
      sizesFingerprint: text,
    }),
  ),
});

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
    const docs = [oneSegment(), smallTree(), generateBuilding({ storeys: 3 }), generateRandomTree(mulberry32(3), { segments: 50, fittingTypes: ['tee-run'] })];
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
