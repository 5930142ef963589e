/**
 * A reading of SystemDocumentSchema for the hot path: the same checks, the same
 * defaults and the same output (a fresh copy, keys in the schema's order, an optional key kept
 * as `undefined` when the input has it so), without zod's per-value machinery.
 *
 * schema.ts stays the format and the source of truth. This reader either returns exactly what
 * `SystemDocumentSchema.parse` would return, or `undefined` — and then the caller runs zod, which
 * decides and words the error report. It declines (returns `undefined`) on everything invalid and
 * also on a few valid rarities it does not follow zod into: objects that are not plain JSON-like
 * objects (class instances and other non-plain prototypes), strings longer in UTF-16 units than
 * their bound (DOCUMENT_BOUNDS; zod counts code points there), and a "__proto__" key in the
 * minimum-flow-pressure record. Lists longer than their bound are declined (zod words the error). A committed property
 * test (tests/engine/model/fastParse.test.ts) compares the two on generated valid and invalid
 * documents.
 *
 * The elements described in elements.ts (nodes and segments, with what they hold) are read by the
 * readers generated from their descriptions (readers.generated.ts, `npx tsx scripts/generate-readers.ts`;
 * a test fails while it is stale), so a key added there needs no edit here; the other elements are
 * still read by hand below, with the primitives of describe.ts.
 */
import type { Boost, Floor, CriteriaOverrides, Device, DeviceLoss, Source, SystemDocument } from './schema';
import { DOCUMENT_BOUNDS as B, FED_FROM_CLOSING_MAX, RECIRCULATION_SEGMENTS_MAX, SCHEMA_VERSION } from './schema';
import {
  DECLINED,
  decline,
  keyCount,
  obj,
  readBounded as bounded,
  readNonNegative as nonNegative,
  readNumber as num,
  readPositive as positive,
  strictKeys,
  type Obj,
} from './describe';
import { readNode, readSegment } from './readers.generated';

function arr(v: unknown, max: number): unknown[] {
  if (!Array.isArray(v) || v.length > max) decline();
  return v;
}
function id(v: unknown): string {
  return bounded(v, 1, B.idLength);
}
function label(v: unknown): string {
  return bounded(v, 0, B.labelLength);
}
function labelNonEmpty(v: unknown): string {
  return bounded(v, 1, B.labelLength);
}
function sourceText(v: unknown): string {
  return bounded(v, 1, B.sourceLength);
}
function date(v: unknown): string {
  return bounded(v, 0, B.dateLength);
}
function notes(v: unknown): string {
  return bounded(v, 0, B.notesLength);
}
function oneOf<T extends string>(v: unknown, ...values: readonly T[]): T {
  for (let i = 0; i < values.length; i++) if (v === values[i]) return v as T;
  return decline();
}

/**
 * An optional field: absent → absent; present (even as undefined) → kept, checked when defined.
 * Returns the number of keys it accounts for (0 or 1), for the strict-key count.
 */
function optional<T>(from: Obj, to: Obj, key: string, read: (v: unknown) => T): number {
  if (!(key in from)) return 0;
  const v = from[key];
  to[key] = v === undefined ? undefined : read(v);
  return 1;
}

function list<T>(v: unknown, item: (x: unknown) => T, max: number): T[] {
  const a = arr(v, max);
  const out: T[] = new Array(a.length);
  for (let i = 0; i < a.length; i++) out[i] = item(a[i]);
  return out;
}

/** A field with `.default(fallback)`: undefined → fallback. */
function listOrEmpty<T>(from: Obj, key: string, item: (x: unknown) => T, max: number): [T[], number] {
  const v = from[key];
  return [v === undefined ? [] : list(v, item, max), key in from ? 1 : 0];
}

// The enumerations and lists of schema.ts, as named readers (no closure per call).
function velocityLimits(x: unknown) {
  return list(x, velocityLimit, B.velocityLimits);
}
function demandCurveChoice(x: unknown) {
  return oneOf(x, 'auto', 'flush-tank', 'flush-valve');
}
function demandMethod(x: unknown) {
  return oneOf(x, 'hunter-table', 'hunter-binomial');
}
function frictionMethod(x: unknown) {
  return oneOf(x, 'colebrook', 'swamee-jain', 'churchill-1977', 'hazen-williams');
}
function fittingMethod(x: unknown) {
  return oneOf(x, 'crane', 'hooper-2k', 'darby-3k', 'equivalent-length');
}

function flowTest(v: unknown): NonNullable<Source['flowTest']> {
  const o = obj(v);
  const out: Obj = { staticPressure: positive(o.staticPressure), residualPressure: nonNegative(o.residualPressure), flow: positive(o.flow) };
  strictKeys(o, 3 + optional(o, out, 'date', date));
  return out as NonNullable<Source['flowTest']>;
}

function fedFromClosing(v: unknown): Obj {
  const o = obj(v);
  const out: Obj = { kind: oneOf(o.kind, 'backflow-preventer', 'prv', 'check-valve'), elementId: id(o.elementId), label: label(o.label) };
  strictKeys(o, 3);
  return out;
}
function fedFromClosedBy(v: unknown): Obj[] {
  return list(v, fedFromClosing, FED_FROM_CLOSING_MAX);
}

function fedFromResolution(v: unknown): NonNullable<NonNullable<Source['fedFrom']>['resolution']> {
  const o = obj(v);
  if (o.status === 'resolved') {
    const r = o.revisionNumber;
    if (!Number.isSafeInteger(r) || !((r as number) > 0)) decline();
    const out: Obj = {
      status: 'resolved',
      systemName: label(o.systemName),
      nodeLabel: label(o.nodeLabel),
      revisionNumber: r,
      revisionStatus: oneOf(o.revisionStatus, 'draft', 'issued'),
      residualPressure: nonNegative(o.residualPressure),
      staticPressureHigh: nonNegative(o.staticPressureHigh),
    };
    strictKeys(o, 7 + optional(o, out, 'closedBy', fedFromClosedBy));
    return out as NonNullable<NonNullable<Source['fedFrom']>['resolution']>;
  }
  if (o.status !== 'unresolved') decline();
  const out: Obj = {
    status: 'unresolved',
    code: oneOf(o.code, 'cold-system-missing', 'cold-system-not-cold', 'cold-node-missing', 'cold-analysis-missing', 'not-yet-resolved'),
    message: sourceText(o.message),
  };
  strictKeys(o, 3);
  return out as NonNullable<NonNullable<Source['fedFrom']>['resolution']>;
}

function fedFrom(v: unknown): NonNullable<Source['fedFrom']> {
  const o = obj(v);
  const out: Obj = { systemId: id(o.systemId), nodeId: id(o.nodeId) };
  strictKeys(o, 2 + optional(o, out, 'resolution', fedFromResolution));
  return out as NonNullable<Source['fedFrom']>;
}

function source(v: unknown): Source {
  const o = obj(v);
  const out: Obj = {
    kind: oneOf(o.kind, 'utility-main', 'tank', 'booster-outlet'),
    nodeId: id(o.nodeId),
    staticPressureLow: nonNegative(o.staticPressureLow),
    staticPressureHigh: nonNegative(o.staticPressureHigh),
    pressureBasis: sourceText(o.pressureBasis),
  };
  let known = 5;
  known += optional(o, out, 'pressureDate', date);
  known += optional(o, out, 'flowTest', flowTest);
  known += optional(o, out, 'fedFrom', fedFrom);
  strictKeys(o, known);
  return out as Source;
}

function curvePoint(v: unknown): { flow: number; loss: number } {
  const o = obj(v);
  const out = { flow: nonNegative(o.flow), loss: nonNegative(o.loss) };
  strictKeys(o, 2);
  return out;
}

function deviceLoss(v: unknown): DeviceLoss {
  const o = obj(v);
  if (o.kind === 'fixed') {
    const out = { kind: 'fixed' as const, loss: nonNegative(o.loss) };
    strictKeys(o, 2);
    return out;
  }
  if (o.kind === 'curve') {
    const points = list(o.points, curvePoint, B.curvePoints);
    if (points.length < 1) decline();
    strictKeys(o, 2);
    return { kind: 'curve', points };
  }
  return decline();
}

function prv(v: unknown): NonNullable<Device['prv']> {
  const o = obj(v);
  const falloff = o.falloffPerFlow;
  const out = { setPressure: positive(o.setPressure), falloffPerFlow: falloff === undefined ? 0 : nonNegative(falloff) };
  strictKeys(o, 1 + ('falloffPerFlow' in o ? 1 : 0));
  return out;
}

/** The union of schema.ts BoostSchema: constant speed, variable speed, or version 1's { gain }. */
function boost(v: unknown): Boost {
  const o = obj(v);
  if ('control' in o) {
    if (o.control === 'constant-speed') {
      const out: Obj = { control: 'constant-speed', designGain: nonNegative(o.designGain), shutoffGain: nonNegative(o.shutoffGain) };
      strictKeys(o, 3 + optional(o, out, 'designFlow', positive));
      return out as Boost;
    }
    if (o.control === 'variable-speed') {
      const out = { control: 'variable-speed' as const, setPressure: positive(o.setPressure) };
      strictKeys(o, 2);
      return out;
    }
    return decline();
  }
  const out = { gain: nonNegative(o.gain) };
  strictKeys(o, 1);
  return out;
}

function device(v: unknown): Device {
  const o = obj(v);
  const out: Obj = {
    id: id(o.id),
    kind: oneOf(o.kind, 'meter', 'backflow-preventer', 'prv', 'strainer', 'softener', 'filter', 'water-heater', 'booster-pump', 'other'),
    label: labelNonEmpty(o.label),
    segmentId: id(o.segmentId),
    loss: deviceLoss(o.loss),
  };
  let known = 5;
  known += optional(o, out, 'prv', prv);
  known += optional(o, out, 'boost', boost);
  strictKeys(o, known);
  return out as Device;
}

function floor(v: unknown): Floor {
  const o = obj(v);
  const out = { id: id(o.id), name: labelNonEmpty(o.name), elevation: num(o.elevation) };
  strictKeys(o, 3);
  return out;
}

/** The node (and its fixture groups and checked fixtures): the reader generated from its description (elements.ts). */
const node = readNode as (v: unknown) => SystemDocument['nodes'][number];

/** The segment (and its custom pipe and fittings): the reader generated from its description (elements.ts). */
const segment = readSegment as (v: unknown) => SystemDocument['segments'][number];

function velocityLimit(v: unknown): NonNullable<CriteriaOverrides['velocityLimits']>[number] {
  const o = obj(v);
  const out = {
    material: oneOf(o.material, 'copper', 'plastic', 'steel'),
    service: oneOf(o.service, 'cold', 'hot'),
    maxVelocity: positive(o.maxVelocity),
  };
  strictKeys(o, 3);
  return out;
}

function pressureRecord(v: unknown): Record<string, number> {
  const o = obj(v);
  // zod reads a record's own keys (Reflect.ownKeys): decline any it would see and for-in would not.
  if (Object.getOwnPropertySymbols(o).length > 0 || Object.getOwnPropertyNames(o).length !== keyCount(o)) decline();
  const out: Record<string, number> = {};
  let n = 0;
  for (const k in o) {
    if (k === '__proto__') decline();
    id(k);
    out[k] = nonNegative(o[k]);
    n++;
  }
  if (n > B.minFlowPressures) decline();
  return out;
}

function criteria(v: unknown): CriteriaOverrides {
  const o = obj(v);
  const out: Obj = {};
  let known = 0;
  known += optional(o, out, 'maxStaticPressure', positive);
  known += optional(o, out, 'minStaticPressure', nonNegative);
  known += optional(o, out, 'velocityLimits', velocityLimits);
  known += optional(o, out, 'minFlowPressures', pressureRecord);
  known += optional(o, out, 'demandCurve', demandCurveChoice);
  known += optional(o, out, 'demandMethod', demandMethod);
  known += optional(o, out, 'frictionMethod', frictionMethod);
  known += optional(o, out, 'fittingMethod', fittingMethod);
  strictKeys(o, known);
  return out as CriteriaOverrides;
}

function expansionTank(v: unknown): NonNullable<SystemDocument['expansionTank']> {
  const o = obj(v);
  const out: Obj = {
    heaterVolume: nonNegative(o.heaterVolume),
    coldTemperature: num(o.coldTemperature),
    hotTemperature: num(o.hotTemperature),
    supplyPressure: nonNegative(o.supplyPressure),
    reliefPressure: positive(o.reliefPressure),
  };
  strictKeys(o, 5);
  return out as NonNullable<SystemDocument['expansionTank']>;
}

function recirculationSegment(v: unknown): Obj {
  const o = obj(v);
  const out: Obj = { id: id(o.id) };
  let known = 1 + optional(o, out, 'label', label);
  out.from = id(o.from);
  out.to = id(o.to);
  out.length = positive(o.length);
  out.material = id(o.material);
  known += 4;
  known += optional(o, out, 'size', id);
  known += optional(o, out, 'heatLoss', nonNegative);
  strictKeys(o, known);
  return out;
}

function fittingAllowance(v: unknown): number {
  if (!(num(v) >= 0 && (v as number) <= 5)) decline();
  return v as number;
}

function recirculation(v: unknown): NonNullable<SystemDocument['recirculation']> {
  const o = obj(v);
  const out: Obj = { segments: list(o.segments, recirculationSegment, RECIRCULATION_SEGMENTS_MAX) };
  let known = 1 + optional(o, out, 'heatLossPerLength', nonNegative);
  out.temperatureDrop = num(o.temperatureDrop);
  known += 1;
  known += optional(o, out, 'hotTemperature', num);
  known += optional(o, out, 'fittingAllowance', fittingAllowance);
  known += optional(o, out, 'heaterLoss', nonNegative);
  strictKeys(o, known);
  return out as NonNullable<SystemDocument['recirculation']>;
}

function count(v: unknown): number {
  if (!Number.isSafeInteger(v) || (v as number) < 0) decline();
  return v as number;
}

function sizingBasis(v: unknown): NonNullable<SystemDocument['sizingBasis']> {
  const o = obj(v);
  const out: Obj = {
    sizedAt: date(o.sizedAt),
    scope: oneOf(o.scope, 'system', 'selection'),
    margin: nonNegative(o.margin),
    supplyPressure: nonNegative(o.supplyPressure),
    velocityLimits: list(o.velocityLimits, classLimit, B.velocityLimits),
    segmentsChanged: count(o.segmentsChanged),
    segmentsLocked: count(o.segmentsLocked),
    sizesFingerprint: bounded(o.sizesFingerprint, 0, B.idLength),
  };
  strictKeys(o, 8);
  return out as NonNullable<SystemDocument['sizingBasis']>;
}

function classLimit(v: unknown) {
  const o = obj(v);
  const out = { material: oneOf(o.material, 'copper', 'plastic', 'steel'), maxVelocity: positive(o.maxVelocity) };
  strictKeys(o, 2);
  return out;
}

function systemDocument(v: unknown): SystemDocument {
  const o = obj(v);
  if (o.schemaVersion !== SCHEMA_VERSION) decline();
  const out: Obj = {
    schemaVersion: SCHEMA_VERSION,
    id: id(o.id),
    name: labelNonEmpty(o.name),
    service: oneOf(o.service, 'cold', 'hot'),
    unitSystem: oneOf(o.unitSystem, 'US', 'SI'),
    waterTemperature: num(o.waterTemperature),
    source: source(o.source),
  };
  let known = 7;
  const [devices, hasDevices] = listOrEmpty(o, 'devices', device, B.devices);
  out.devices = devices;
  known += hasDevices;
  const [floors, hasFloors] = listOrEmpty(o, 'floors', floor, B.floors);
  out.floors = floors;
  known += hasFloors;
  const nodes = list(o.nodes, node, B.nodes);
  if (nodes.length < 1) decline();
  out.nodes = nodes;
  out.segments = list(o.segments, segment, B.segments);
  known += 2;
  known += optional(o, out, 'criteria', criteria);
  known += optional(o, out, 'expansionTank', expansionTank);
  known += optional(o, out, 'recirculation', recirculation);
  known += optional(o, out, 'notes', notes);
  known += optional(o, out, 'sizingBasis', sizingBasis);
  strictKeys(o, known);
  return out as SystemDocument;
}

/**
 * The document as SystemDocumentSchema.parse would return it, or undefined when this reader
 * declines it (invalid, or one of the rarities above): then run the zod schema.
 */
export function fastParseSystemDocument(doc: unknown): SystemDocument | undefined {
  try {
    return systemDocument(doc);
  } catch (e) {
    if (e === DECLINED) return undefined;
    throw e;
  }
}
