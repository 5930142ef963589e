/**
 * The elements of the system document, each described once (the vocabulary is describe.ts): the
 * segment and what it holds (custom pipe, fittings and their project data). schema.ts exports the
 * zod schemas derived from these; the fast reader, the ranges and units, the field change's rules
 * and the tree editor's policy read the same descriptions.
 *
 * To add an optional key to a segment: one entry below (value, label, help, range, who may change
 * it), then the engine code that uses it. Regenerate the JSON Schema (`npx tsx
 * scripts/export-schema.ts`; a test fails while it is stale).
 *
 * Units are the document's (schema.ts): length ft or m, inside diameter and roughness in or mm,
 * flow gpm or L/s; a range (limits.ts) gives a number's unit.
 */
import { DOCUMENT_BOUNDS as B } from './bounds';
import { element, optional, required, value, withDefault, type AnyElement } from './describe';

const id = () => value.string(1, B.idLength);
const sourceText = () => value.string(1, B.sourceLength);
const projectLabel = { label: 'Name', help: 'Name of the fitting type, as the project catalog gives it.' } as const;
const projectSource = { label: 'Source', help: 'Where the value comes from (standard, table, manufacturer).' } as const;

/**
 * A fitting given by its own data (a project's fitting type copied into the document): exactly
 * one of a loss coefficient `k` or an `equivalentLength` (length unit), with its source.
 *
 * The rule, under every fitting method of the criteria (the data has no method-specific form):
 *   - `k`: used as it is, K referred to the segment's velocity, loss = count·K·ρV²/2 — as the
 *     engine already treats its constant-K entries (entrances, exits). With the equivalent-length
 *     method it is not refused and not rescaled: a K is the more direct statement of a loss, and
 *     converting it to a length and back (K·D/f, then f·L/D) would return the same K.
 *   - `equivalentLength`: K = f·L/D with the segment's own Darcy friction factor f and inside
 *     diameter D (the equivalent-length rule of the fittings catalog: "this many feet of this
 *     pipe"), so the loss is count·f·(L/D)·ρV²/2. Crane's f_T (fully turbulent) is not used: an
 *     equivalent length of pipe loses what that pipe loses at the actual flow.
 * Either way the analysis repeats the label and source in a note (a custom value is an assumption).
 */
export const CUSTOM_FITTING_K = element('custom fitting (K)', {
  label: required(value.text(B.labelLength, { nonEmpty: true }), projectLabel),
  k: required(value.nonNegative(), { label: 'K', help: 'Loss coefficient K (velocity heads), referred to the segment velocity.', range: 'lossCoefficient' }),
  source: required(sourceText(), projectSource),
});
export const CUSTOM_FITTING_EQUIVALENT_LENGTH = element('custom fitting (equivalent length)', {
  label: required(value.text(B.labelLength, { nonEmpty: true }), projectLabel),
  equivalentLength: required(value.nonNegative(), {
    label: 'Equivalent length',
    help: 'Equivalent length of the segment pipe, length unit.',
    range: 'equivalentLength',
  }),
  source: required(sourceText(), projectSource),
});

/** A fitting's own data: the K form or the equivalent-length form. */
export const CUSTOM_FITTING = value.union([CUSTOM_FITTING_K, CUSTOM_FITTING_EQUIVALENT_LENGTH]);

export const FITTING = element('fitting', {
  typeId: required(id(), {
    label: 'Fitting type',
    help: 'Fitting type id from the fittings catalog; with `custom`, a reference to where the data came from (e.g. "project:<entry id>"), not looked up.',
  }),
  count: required(value.count(), { label: 'Count', range: 'fittingCount' }),
  custom: optional(CUSTOM_FITTING, {
    label: 'Project data',
    help: "Instead of the catalog's data: the fitting's own K or equivalent length.",
  }),
});

export const CUSTOM_PIPE = element('custom pipe', {
  innerDiameter: required(value.positive(), { label: 'Inside diameter', help: 'Inside diameter, diameter unit.', range: 'innerDiameter' }),
  roughness: required(value.nonNegative(), { label: 'Roughness', help: 'Absolute roughness, diameter unit.', range: 'roughness' }),
  hazenWilliamsC: required(value.positive(), { label: 'Hazen–Williams C', range: 'hazenWilliamsC' }),
  velocityClass: required(value.oneOf(['copper', 'plastic', 'steel']), { label: 'Velocity class', help: 'Which velocity limit applies.' }),
});

/**
 * A pipe run between two nodes. A contractor's field change may substitute its pipe (material,
 * size or custom data), length and fittings; the rest is the designer's.
 */
export const SEGMENT = element('segment', {
  id: required(id(), { label: 'Segment id' }),
  label: optional(value.text(B.labelLength), { label: 'Name', editor: ['name'] }),
  from: required(id(), { label: 'From node', help: 'Upstream node (toward the source).' }),
  to: required(id(), { label: 'To node', help: 'Downstream node.' }),
  material: optional(id(), { label: 'Material', help: 'Material id from the materials catalog (with size).', changedBy: 'field-change', editor: ['material'] }),
  size: optional(id(), { label: 'Size', help: 'Nominal size key in the material\'s catalog, e.g. "3/4".', changedBy: 'field-change', editor: ['size'] }),
  custom: optional(value.element(CUSTOM_PIPE), {
    label: 'Custom pipe',
    help: 'Instead of material and size: a pipe given by its own data.',
    changedBy: 'field-change',
    editor: ['material', 'size'],
  }),
  length: required(value.positive(), {
    label: 'Developed length',
    help: 'Developed length of pipe, length unit.',
    range: 'length',
    changedBy: 'field-change',
    editor: ['length'],
  }),
  rise: optional(value.number(), {
    label: 'Rise',
    help: 'Rise from the upstream to the downstream node, length unit; places the downstream node, so only where that node has neither an elevation nor a floor.',
    range: 'rise',
    editor: ['rise'],
  }),
  fittings: withDefault(value.list(value.element(FITTING), B.fittingsPerSegment), [], { label: 'Fittings', changedBy: 'field-change', editor: ['fittings'] }),
  flowOverride: optional(value.nonNegative(), {
    label: 'Design flow override',
    help: 'Design flow to use instead of the fixture-unit demand, flow unit.',
    range: 'flow',
  }),
  reducerAuto: withDefault(value.boolean(), true, {
    label: 'Size-change loss',
    help: 'Add a sudden expansion or contraction loss where the size differs from the feeding segment.',
  }),
  sizeLocked: optional(value.boolean(), { label: 'Size locked', help: 'The designer fixed this size: automatic sizing keeps it.' }),
  minSize: optional(id(), {
    label: 'Smallest size',
    help: 'Smallest nominal size key automatic sizing may choose for this segment, in the material\'s catalog (e.g. "3/4" where a flush valve or the local code needs it).',
  }),
});

/**
 * A fixture type given by its own data (a project's fixture type copied into the document), in
 * place of the fixtures catalog's values for this group. Fixture units are per fixture; an absent
 * cold or hot value counts as no load on that service, as a catalog type without one does.
 * `flushValve` sets the demand curve (true: flush-valve, false: flush-tank); without it the
 * catalog type's curve applies, or flush-tank when `fixtureTypeId` is not a catalog type.
 * The values and their `source` are the designer's: the analysis repeats them in a note.
 */
export const CUSTOM_FIXTURE = element('custom fixture type', {
  label: required(value.text(B.labelLength, { nonEmpty: true }), { label: 'Name', help: 'Name of the fixture type, as the project catalog gives it.' }),
  wsfuCold: optional(value.nonNegative(), { label: 'Cold WSFU', help: 'Cold-water fixture units per fixture.', range: 'fixtureUnits' }),
  wsfuHot: optional(value.nonNegative(), { label: 'Hot WSFU', help: 'Hot-water fixture units per fixture.', range: 'fixtureUnits' }),
  wsfuTotal: required(value.nonNegative(), { label: 'Total WSFU', help: 'Total fixture units per fixture.', range: 'fixtureUnits' }),
  flushValve: optional(value.boolean(), { label: 'Flush valve', help: 'Flush-valve demand curve (true) or flush-tank (false).' }),
  source: required(sourceText(), { label: 'Source', help: 'Where the values come from (standard, table, manufacturer).' }),
});

/** For Hunter's binomial method: how long and how often a fixture of the group is used. */
export const FIXTURE_USAGE = element('fixture usage', {
  flow: optional(value.positive(), { label: 'Flow in use', help: "Flow while in use, flow unit; defaults to the fixture type's flow.", range: 'fixtureFlow' }),
  durationSeconds: required(value.positive(), { label: 'Duration of use', range: 'useDuration' }),
  recurrenceSeconds: required(value.positive(), { label: 'Time between uses', range: 'useInterval' }),
});

export const FIXTURE_GROUP = element('fixture group', {
  fixtureTypeId: required(id(), {
    label: 'Fixture type',
    help: 'Fixture type id from the fixtures catalog; with `custom`, any reference (e.g. "project:<entry id>"), looked up only as a fallback.',
  }),
  count: required(value.count(), { label: 'Count', range: 'fixtureCount' }),
  custom: optional(value.element(CUSTOM_FIXTURE), { label: 'Project data', help: "The fixture type's own data, overriding the catalog's." }),
  demandCurve: optional(value.oneOf(['flush-tank', 'flush-valve']), { label: 'Demand curve', help: "Overrides the fixture type's demand curve." }),
  wsfuBasis: optional(value.oneOf(['cold', 'hot', 'total']), {
    label: 'Fixture-unit basis',
    help: "Which fixture-unit load counts: defaults to the system's service (cold or hot).",
  }),
  usage: optional(value.element(FIXTURE_USAGE), { label: 'Usage', help: "For Hunter's binomial method: flow, duration of use and time between uses." }),
});

export const CHECKED_FIXTURE = element('checked fixture', {
  id: required(id(), { label: 'Fixture id' }),
  fixtureTypeId: required(id(), { label: 'Fixture type' }),
  label: optional(value.text(B.labelLength), { label: 'Name' }),
  minFlowPressure: optional(value.nonNegative(), {
    label: 'Minimum flow pressure',
    help: 'Overrides the minimum flow pressure, pressure unit.',
    range: 'minFlowPressure',
  }),
  flowRate: optional(value.positive(), { label: 'Flow rate', help: "Overrides the fixture's flow rate (reported), flow unit.", range: 'fixtureFlow' }),
  expectedCritical: optional(value.boolean(), { label: 'Expected critical', help: 'The designer expects this fixture to be the critical one.' }),
});

/**
 * A node's position is exactly one of: an absolute `elevation`; a `floor` with an optional
 * `heightAboveFloor` (default 0); or neither, and then its feed segment's `rise` places it
 * (elevation = elevation of the upstream node + rise). Both `elevation` and `floor` at once is an
 * error, and so is a `rise` on the feed segment of a node that has either. Everything at a node is
 * the designer's: a field change changes none of it.
 */
export const NODE = element('node', {
  id: required(id(), { label: 'Node id' }),
  label: optional(value.text(B.labelLength), { label: 'Name' }),
  elevation: optional(value.number(), {
    label: 'Elevation',
    help: 'Absolute elevation, length unit, any datum (the same for all nodes and floors).',
    range: 'elevation',
  }),
  floor: optional(id(), { label: 'Floor', help: 'Id of the floor the node is on (instead of an absolute elevation).' }),
  heightAboveFloor: optional(value.number(), {
    label: 'Height above floor',
    help: 'Height above its floor, length unit (default 0); only with `floor`.',
    range: 'heightAboveFloor',
  }),
  fixtureGroups: withDefault(value.list(value.element(FIXTURE_GROUP), B.fixtureGroupsPerNode), [], { label: 'Fixture groups' }),
  continuousDemand: optional(value.nonNegative(), { label: 'Continuous demand', help: 'Continuous demand drawn at this node, flow unit.', range: 'flow' }),
  checkedFixtures: withDefault(value.list(value.element(CHECKED_FIXTURE), B.checkedFixturesPerNode), [], { label: 'Checked fixtures' }),
});

/** Every described element by its constant's name (the generated readers are named after them). */
export function describedElements(): Record<string, AnyElement> {
  return {
    CUSTOM_FITTING_K,
    CUSTOM_FITTING_EQUIVALENT_LENGTH,
    FITTING,
    CUSTOM_PIPE,
    SEGMENT,
    CUSTOM_FIXTURE,
    FIXTURE_USAGE,
    FIXTURE_GROUP,
    CHECKED_FIXTURE,
    NODE,
  };
}
