/**
 * The elements of the system document, each described once (the vocabulary is describe.ts), down
 * from the document itself (SYSTEM_DOCUMENT, at the end): the source, devices, floors, nodes and
 * segments with what they hold, criteria, typical units and their placements, the hot-water
 * inputs and the record of an applied sizing. schema.ts exports the zod schemas derived from these;
 * the fast readers, the ranges and units, the field change's rules and the tree editor's policy
 * read the same descriptions.
 *
 * To add an optional key to an element: one entry below (value, label, help, range, who may change
 * it), then the engine code that uses it. Regenerate the JSON Schema (`npx tsx
 * scripts/export-schema.ts`) and the fast readers (`npx tsx scripts/generate-readers.ts`); a test
 * fails while either is stale.
 *
 * Units are the document's (schema.ts): length ft or m, inside diameter and roughness in or mm,
 * flow gpm or L/s; a range (limits.ts) gives a number's unit.
 */
import { DOCUMENT_BOUNDS as B } from './bounds';
import { element, optional, required, value, withDefault, type AnyElement } from './describe';

/** The version of the document format this file describes (version 1 is read through upgrade.ts). */
export const SCHEMA_VERSION = 2 as const;

const id = () => value.string(1, B.idLength);
const sourceText = () => value.string(1, B.sourceLength);
const label = () => value.text(B.labelLength);
const name = () => value.text(B.labelLength, { nonEmpty: true });
const date = () => value.text(B.dateLength);
const velocityClass = () => value.oneOf(['copper', 'plastic', 'steel']);
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
    short: 'Type',
    help: 'The fitting’s type in the fittings catalog; a fitting with project data (`custom`) names where that data came from instead (e.g. "project:<entry id>"), not looked up.',
  }),
  count: required(value.count(), { label: 'Count', range: 'fittingCount' }),
  custom: optional(CUSTOM_FITTING, {
    label: 'Project data',
    help: "Instead of the catalog's data: the fitting's own K or equivalent length.",
  }),
});

export const CUSTOM_PIPE = element('custom pipe', {
  innerDiameter: required(value.positive(), { label: 'Inside diameter', help: 'Inside diameter, diameter unit.', range: 'innerDiameter' }),
  roughness: required(value.nonNegative(), { label: 'Absolute roughness', help: 'Absolute roughness, diameter unit.', range: 'roughness' }),
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
    short: 'Length',
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
    short: 'Type',
    help: 'The fixture type in the fixtures catalog; a group with project data (`custom`) may name any reference instead (e.g. "project:<entry id>"), looked up only as a fallback.',
  }),
  count: required(value.count(), { label: 'Count', range: 'fixtureCount' }),
  custom: optional(value.element(CUSTOM_FIXTURE), { label: 'Project data', help: "The fixture type's own data, overriding the catalog's." }),
  demandCurve: optional(value.oneOf(['flush-tank', 'flush-valve']), { label: 'Demand curve', help: "Overrides the fixture type's demand curve." }),
  wsfuBasis: optional(value.oneOf(['cold', 'hot', 'total']), {
    label: 'Fixture units counted',
    help: "Which fixture-unit load counts: defaults to the system's service (cold or hot).",
  }),
  usage: optional(value.element(FIXTURE_USAGE), { label: 'Usage', help: "For Hunter's binomial method: flow, duration of use and time between uses." }),
});

export const CHECKED_FIXTURE = element('checked fixture', {
  id: required(id(), { label: 'Fixture id' }),
  fixtureTypeId: required(id(), { label: 'Fixture type', short: 'Type' }),
  label: optional(value.text(B.labelLength), { label: 'Name' }),
  minFlowPressure: optional(value.nonNegative(), {
    label: 'Minimum flow pressure',
    help: "Overrides the fixture type's minimum flow pressure from the catalog, pressure unit.",
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
    help: 'Absolute elevation, length unit, on the same datum as every other node and floor (any datum).',
    range: 'elevation',
  }),
  floor: optional(id(), { label: 'Floor', help: 'The floor the node is on, by its id (instead of an absolute elevation).' }),
  heightAboveFloor: optional(value.number(), {
    label: 'Height above floor',
    help: 'Height above its floor, length unit (default 0); only with `floor`.',
    range: 'heightAboveFloor',
  }),
  fixtureGroups: withDefault(value.list(value.element(FIXTURE_GROUP), B.fixtureGroupsPerNode), [], { label: 'Fixture groups' }),
  continuousDemand: optional(value.nonNegative(), { label: 'Continuous demand', help: 'Continuous demand drawn at this node, flow unit.', range: 'flow' }),
  checkedFixtures: withDefault(value.list(value.element(CHECKED_FIXTURE), B.checkedFixturesPerNode), [], { label: 'Checked fixtures' }),
});

// ---- the source

export const FLOW_TEST = element(
  'flow test',
  {
    staticPressure: required(value.positive(), {
      label: 'Test static pressure',
      help: 'Static pressure during the test (no flow), pressure unit.',
      range: 'staticPressure',
    }),
    residualPressure: required(value.nonNegative(), {
      label: 'Test residual pressure',
      help: 'Residual pressure while flowing the test flow, pressure unit.',
      range: 'staticPressure',
    }),
    flow: required(value.positive(), { label: 'Test flow', help: 'Flow during the test, flow unit.', range: 'flow' }),
    date: optional(date(), { label: 'Date of the test', help: 'As YYYY-MM-DD (ISO 8601).' }),
  },
  { help: 'Hydrant flow test (NFPA 291) at the connection.' },
);

/**
 * Where a hot-water system's supply comes from: the node of a cold-water system (same project) that
 * feeds its water heater. `resolution` is written by Headroom (src/engine/hotWater/fedFrom.ts, on
 * the server at every save, issue and read, and whenever the cold system changes; in the walk from
 * the cold system's current analysis), never typed: with it, the source's static pressures and basis
 * are the cold system's figures at that node. Unresolved (the cold system or its node missing, or
 * its analysis not computable) makes the verdict Incomplete with the reason.
 */
export const FED_FROM_UNRESOLVED_CODES = [
  'cold-system-missing',
  'cold-system-not-cold',
  'cold-node-missing',
  'cold-analysis-missing',
  'not-yet-resolved',
] as const;
/** Most closing elements a resolution records (a bound). */
export const FED_FROM_CLOSING_MAX = 50;

/** A device or check valve of the cold system upstream of the heater feed, as the resolver read it. */
export const FED_FROM_CLOSING = element('closing element', {
  kind: required(value.oneOf(['backflow-preventer', 'prv', 'check-valve']), { label: 'Kind' }),
  elementId: required(id(), { label: 'Element', help: 'The device id, or the segment id carrying the check valve.' }),
  label: required(label(), { label: 'Name', help: 'As labelled in the cold system.' }),
});
export const FED_FROM_RESOLVED = element('resolved feed', {
  status: required(value.literal('resolved'), { label: 'Status' }),
  systemName: required(label(), { label: 'Cold system', help: 'The cold system, as named when resolved.' }),
  nodeLabel: required(label(), { label: 'Node', help: 'The node, as labelled when resolved.' }),
  revisionNumber: required(value.count(), {
    label: 'Revision',
    help: "The cold system's revision whose analysis was read.",
    range: 'revisionNumber',
  }),
  revisionStatus: required(value.oneOf(['draft', 'issued']), { label: 'Revision status' }),
  residualPressure: required(value.nonNegative(), {
    label: 'Residual pressure',
    help: 'Residual pressure at the node at design flow, pressure unit (of this document).',
    range: 'staticPressure',
  }),
  staticPressureHigh: required(value.nonNegative(), {
    label: 'High static pressure',
    help: 'High static pressure at the node, pressure unit (of this document).',
    range: 'staticPressure',
  }),
  closedBy: optional(value.list(value.element(FED_FROM_CLOSING), FED_FROM_CLOSING_MAX), {
    label: 'Closed by',
    help: "The cold system's backflow preventers, PRVs and check valves between its source and the node: they close this hot system to thermal expansion.",
  }),
});
export const FED_FROM_UNRESOLVED = element('unresolved feed', {
  status: required(value.literal('unresolved'), { label: 'Status' }),
  code: required(value.oneOf(FED_FROM_UNRESOLVED_CODES), { label: 'Reason' }),
  message: required(sourceText(), { label: 'Message' }),
});
export const FED_FROM = element('cold-water feed', {
  systemId: required(id(), { label: 'Cold-water system feeding the heater', help: 'The cold-water system whose analysis feeds this hot system.' }),
  nodeId: required(id(), { label: 'Node of the cold system that feeds the heater', help: "Where the cold system's pipe reaches the water heater." }),
  resolution: optional(value.tagged('status', [FED_FROM_RESOLVED, FED_FROM_UNRESOLVED]), {
    label: 'Resolution',
    help: 'Written by Headroom from the cold system, never typed.',
  }),
});

export const SOURCE = element('source', {
  kind: required(value.oneOf(['utility-main', 'tank', 'booster-outlet']), { label: 'Kind of source' }),
  nodeId: required(id(), {
    label: 'Connection node',
    help: 'The node where the water enters; its elevation (absolute or on a floor) is the connection elevation.',
  }),
  staticPressureLow: required(value.nonNegative(), {
    label: 'Static pressure, low',
    help: 'The lowest static pressure the utility expects at the connection, pressure unit: the design figure.',
    range: 'staticPressure',
  }),
  staticPressureHigh: required(value.nonNegative(), {
    label: 'Static pressure, high',
    help: 'The highest static pressure expected at the connection, pressure unit: for the maximum static pressure check.',
    range: 'staticPressure',
  }),
  pressureBasis: required(sourceText(), {
    label: 'Where the pressure figures came from',
    help: 'For example: the utility’s pressure letter, a hydrant flow test, a gauge reading at the main.',
  }),
  pressureDate: optional(date(), { label: 'Date of the pressure figures', help: 'As YYYY-MM-DD (ISO 8601).' }),
  flowTest: optional(value.element(FLOW_TEST), { label: 'Flow test' }),
  fedFrom: optional(value.element(FED_FROM), {
    label: 'Fed from',
    help: 'Hot water only: the cold system and node feeding the heater; the static pressures then follow it.',
  }),
});

// ---- devices

export const DEVICE_LOSS_FIXED = element('fixed loss', {
  kind: required(value.literal('fixed'), { label: 'Loss kind' }),
  loss: required(value.nonNegative(), { label: 'Loss at any flow', help: 'Pressure loss at any flow, pressure unit.', range: 'pressureLoss' }),
});
export const CURVE_POINT = element('curve point', {
  flow: required(value.nonNegative(), { label: 'Flow', range: 'flow' }),
  loss: required(value.nonNegative(), { label: 'Loss', range: 'pressureLoss' }),
});
export const DEVICE_LOSS_CURVE = element('loss curve', {
  kind: required(value.literal('curve'), { label: 'Loss kind' }),
  points: required(value.list(value.element(CURVE_POINT), B.curvePoints, 1), {
    label: 'Curve points',
    help: "Manufacturer's loss at flow points (flow unit, pressure unit); (0, 0) is implied.",
  }),
});
export const DEVICE_LOSS = value.tagged('kind', [DEVICE_LOSS_FIXED, DEVICE_LOSS_CURVE]);

export const PRV = element('pressure-reducing valve', {
  setPressure: required(value.positive(), { label: 'PRV set pressure', help: 'Outlet set pressure, pressure unit.', range: 'pressureSetting' }),
  falloffPerFlow: withDefault(value.nonNegative(), 0, {
    label: 'PRV fall-off',
    help: 'Drop of the outlet pressure per unit of flow (psi per gpm or kPa per L/s).',
    range: 'pressureFalloff',
  }),
});

/**
 * A booster pump, by its control:
 *   - constant speed: its curve through the design point and the shutoff point. Between them the
 *     gain follows gain(Q) = shutoff − (shutoff − design)·(Q/Qd)², the parabola through both points
 *     (common practice for a centrifugal pump at fixed speed; pump affinity and curve-fitting texts).
 *     Qd is `designFlow` when given, else the design flow the analysis computes through the pump
 *     (then the gain at design flow is `designGain`). The static check adds the shutoff gain: at
 *     no flow the pump delivers its highest pressure.
 *   - variable speed: the drive holds the discharge at `setPressure` (while the inlet is below it),
 *     at any flow including none; the static check uses the set discharge pressure.
 *   - `{ gain }` (version 1's form, kept so that upgraded documents stay valid): read as constant
 *     speed with shutoff gain = design gain = gain. The shutoff is then an assumption and the
 *     verdict is incomplete (reason `booster-shutoff-missing`) until the pump's curve is entered.
 */
export const BOOST_CONSTANT_SPEED = element('constant-speed pump', {
  control: required(value.literal('constant-speed'), { label: 'Control' }),
  designGain: required(value.nonNegative(), {
    label: 'Pressure added at design flow',
    help: 'Pressure added at the design point, pressure unit.',
    range: 'pressureGain',
  }),
  shutoffGain: required(value.nonNegative(), {
    label: 'Pressure added at shutoff',
    help: 'Pressure added at zero flow (shutoff), pressure unit; not below the design gain.',
    range: 'pressureGain',
  }),
  designFlow: optional(value.positive(), {
    label: 'Design flow',
    help: "Flow at the design point, flow unit; defaults to the system's design flow through the pump.",
    range: 'flow',
  }),
});
export const BOOST_VARIABLE_SPEED = element('variable-speed pump', {
  control: required(value.literal('variable-speed'), { label: 'Control' }),
  setPressure: required(value.positive(), {
    label: 'Discharge pressure held',
    help: 'Discharge pressure the drive holds, pressure unit.',
    range: 'pressureSetting',
  }),
});
export const BOOST_GAIN = element('pump gain (version 1)', {
  gain: required(value.nonNegative(), {
    label: 'Gain',
    help: 'Version 1 form: pressure added at the design flow, pressure unit (shutoff unknown).',
    range: 'pressureGain',
  }),
});
export const BOOST = value.union([BOOST_CONSTANT_SPEED, BOOST_VARIABLE_SPEED, BOOST_GAIN]);

export const DEVICE = element('device', {
  id: required(id(), { label: 'Device id' }),
  kind: required(value.oneOf(['meter', 'backflow-preventer', 'prv', 'strainer', 'softener', 'filter', 'water-heater', 'booster-pump', 'other']), {
    label: 'Kind',
  }),
  label: required(name(), { label: 'Name' }),
  segmentId: required(id(), {
    label: 'On segment (at its inlet)',
    help: 'The segment at whose inlet the device sits; devices on one segment act in list order.',
  }),
  loss: required(DEVICE_LOSS, { label: 'Loss' }),
  prv: optional(value.element(PRV), { label: 'PRV', help: 'Required when kind is "prv".' }),
  boost: optional(BOOST, { label: 'Booster pump', help: 'Required when kind is "booster-pump".' }),
});

// ---- floors

/** A named level of the building; nodes placed on it move with it. */
export const FLOOR = element('floor', {
  id: required(id(), { label: 'Floor id' }),
  name: required(name(), { label: 'Name', help: 'Name of the level as the drawings give it ("Level 3", "Basement").' }),
  elevation: required(value.number(), {
    label: 'Elevation',
    help: 'Elevation of the finished floor, length unit, the datum of the node elevations.',
    range: 'elevation',
  }),
});

// ---- criteria

export const VELOCITY_LIMIT = element('velocity limit', {
  material: required(velocityClass(), { label: 'Velocity class' }),
  service: required(value.oneOf(['cold', 'hot']), { label: 'Service' }),
  maxVelocity: required(value.positive(), { label: 'Velocity limit', range: 'velocityLimit' }),
});

export const CRITERIA = element(
  'criteria',
  {
    maxStaticPressure: optional(value.positive(), { label: 'Maximum static pressure', range: 'staticPressure' }),
    minStaticPressure: optional(value.nonNegative(), { label: 'Minimum static pressure', range: 'staticPressure' }),
    velocityLimits: optional(value.list(value.element(VELOCITY_LIMIT), B.velocityLimits), {
      label: 'Velocity limits',
      help: 'Replace the default limit of each material class and service listed.',
    }),
    minFlowPressures: optional(value.record(id(), value.nonNegative(), { max: B.minFlowPressures, message: `at most ${B.minFlowPressures} fixture types` }), {
      label: 'Minimum flow pressures',
      help: 'Minimum flow pressure per fixture type id, pressure unit.',
      range: 'minFlowPressure',
    }),
    demandCurve: optional(value.oneOf(['auto', 'flush-tank', 'flush-valve']), { label: 'Demand curve' }),
    demandMethod: optional(value.oneOf(['hunter-table', 'hunter-binomial']), { label: 'Demand method' }),
    frictionMethod: optional(value.oneOf(['colebrook', 'swamee-jain', 'churchill-1977', 'hazen-williams']), { label: 'Friction method' }),
    fittingMethod: optional(value.oneOf(['crane', 'hooper-2k', 'darby-3k', 'equivalent-length']), { label: 'Loss method for fittings' }),
  },
  { help: "Overrides of the engine's default criteria; the local code governs." },
);

// ---- typical units and their placements

/**
 * Typical units (an apartment, a room, a restroom) defined once and placed on floors. A unit type
 * holds its own branch piping, fixture groups and checked fixtures with local ids; its one inlet
 * segment starts at "inlet", which a placement connects to a node of the main tree. The analysis
 * expands placements into ordinary nodes and segments first (src/engine/building/expand.ts), so
 * editing the type changes every placement, and a placement's override is data of its own.
 * Unit nodes sit on the placement's floor at their height above it; rises are never typed here.
 */
export const UNIT_INLET = 'inlet';

export const UNIT_NODE = element('unit node', {
  id: required(value.string(1, B.idLength, { except: UNIT_INLET, message: `"${UNIT_INLET}" names the unit's connection point` }), { label: 'Node id' }),
  label: optional(label(), { label: 'Name' }),
  heightAboveFloor: withDefault(value.between(0, 50), 0, {
    label: 'Height above floor',
    help: 'Height above the floor, length unit (0–50, the plausible range of limits.ts in feet; less in metres).',
    range: 'heightAboveFloor',
  }),
  fixtureGroups: withDefault(value.list(value.element(FIXTURE_GROUP), B.fixtureGroupsPerNode), [], { label: 'Fixture groups' }),
  checkedFixtures: withDefault(value.list(value.element(CHECKED_FIXTURE), B.checkedFixturesPerNode), [], { label: 'Checked fixtures' }),
});

export const UNIT_SEGMENT = element('unit segment', {
  id: required(id(), { label: 'Segment id' }),
  label: optional(label(), { label: 'Name' }),
  from: required(id(), { label: 'From node', help: `Upstream node: "${UNIT_INLET}" (the placement's connection) or a node of the unit.` }),
  to: required(id(), { label: 'To node', help: 'Downstream node of the unit.' }),
  material: optional(id(), { label: 'Material' }),
  size: optional(id(), { label: 'Size' }),
  custom: optional(value.element(CUSTOM_PIPE), { label: 'Custom pipe' }),
  length: required(value.positive(), { label: 'Developed length', help: 'Developed length, length unit.', range: 'length' }),
  fittings: withDefault(value.list(value.element(FITTING), B.fittingsPerSegment), [], { label: 'Fittings' }),
  sizeLocked: optional(value.boolean(), { label: 'Size locked', help: 'The designer fixed this size: automatic sizing keeps it.' }),
});

export const UNIT_TYPE = element('unit type', {
  id: required(id(), { label: 'Unit type id' }),
  name: required(name(), { label: 'Name' }),
  nodes: required(value.list(value.element(UNIT_NODE), B.unitNodes, 1), { label: 'Nodes' }),
  segments: required(value.list(value.element(UNIT_SEGMENT), B.unitSegments, 1), { label: 'Segments' }),
});

/** Fields a placement may change on one of its unit's segments or nodes. */
export const SEGMENT_OVERRIDE = element('segment override', {
  length: optional(value.positive(), { label: 'Developed length', range: 'length' }),
  material: optional(id(), { label: 'Material' }),
  size: optional(id(), { label: 'Size' }),
  fittings: optional(value.list(value.element(FITTING), B.fittingsPerSegment), { label: 'Fittings' }),
});
export const NODE_OVERRIDE = element('node override', {
  heightAboveFloor: optional(value.between(0, 50), { label: 'Height above floor', range: 'heightAboveFloor' }),
});
export const PLACEMENT_OVERRIDES = element('placement overrides', {
  segments: optional(value.record(id(), value.element(SEGMENT_OVERRIDE)), { label: 'Segment overrides' }),
  nodes: optional(value.record(id(), value.element(NODE_OVERRIDE)), { label: 'Node overrides' }),
});

export const PLACEMENT = element('placement', {
  id: required(id(), { label: 'Placement id' }),
  unitTypeId: required(id(), { label: 'Unit type' }),
  label: required(name(), { label: 'Name', help: 'The occurrence as the drawings name it, e.g. "Apt 704".' }),
  floor: required(id(), { label: 'Floor', help: 'Floor id.' }),
  at: required(id(), { label: 'Connection node', help: 'Node of the main tree where the unit connects (its inlet segment starts there).' }),
  overrides: optional(value.element(PLACEMENT_OVERRIDES), { label: 'Overrides' }),
});

// ---- hot water

/**
 * The thermal expansion tank of a hot-water system (sized by hotWater/expansionTank.ts): the volume
 * of water heated (the heaters' storage), the cold (incoming) and hot (stored) temperatures, the
 * supply pressure at the tank (its precharge) and the pressure it is sized for (the relief setting,
 * or somewhat below it). Its presence says the system has a tank.
 */
export const EXPANSION_TANK = element('expansion tank', {
  heaterVolume: required(value.nonNegative(), {
    label: 'Volume of water heated',
    help: 'Volume of water heated, gal (US) or L (SI); must be above zero to size the tank.',
    range: 'heaterVolume',
  }),
  coldTemperature: required(value.number(), {
    label: 'Cold water temperature',
    help: 'Temperature of the incoming cold water, °F or °C.',
    range: 'waterTemperature',
  }),
  hotTemperature: required(value.number(), {
    label: 'Stored hot water temperature',
    help: 'Stored hot-water temperature, °F or °C.',
    range: 'waterTemperature',
  }),
  supplyPressure: required(value.nonNegative(), {
    label: 'Supply pressure at the tank, its precharge',
    help: 'Supply pressure at the tank (its precharge), pressure unit.',
    range: 'staticPressure',
  }),
  reliefPressure: required(value.positive(), {
    label: 'Pressure sized for: relief setting or somewhat below',
    help: 'Pressure the tank is sized for: the relief setting or somewhat below it, pressure unit.',
    range: 'pressureSetting',
  }),
});

/** Most segments a recirculation loop may have (a bound, as DOCUMENT_BOUNDS gives the others). */
export const RECIRCULATION_SEGMENTS_MAX = 500;

/**
 * One pipe of a hot-water recirculation loop (sized by hotWater/recirculationDocument.ts): from the
 * heater out along the hot tree and back by the return. A segment with a size is checked at it; one
 * without is sized (the return).
 */
export const RECIRCULATION_SEGMENT = element('loop pipe', {
  id: required(id(), { label: 'Pipe id' }),
  label: optional(label(), { label: 'Name' }),
  from: required(id(), {
    label: 'From node',
    help: "Node the pipe leaves, toward the loop's end: the heater (the source node), a node of the hot tree, or a return-only node.",
  }),
  to: required(id(), { label: 'To node', help: 'Node the pipe reaches; the last pipe of the loop reaches the heater (the source node).' }),
  length: required(value.positive(), { label: 'Developed length', help: 'Developed length of pipe, length unit.', range: 'length' }),
  material: required(id(), { label: 'Material', help: 'Material id from the materials catalog.' }),
  size: optional(id(), {
    label: 'Size',
    help: 'Nominal size key; leave out (on the return) to have the smallest size within the velocity and friction limits chosen.',
  }),
  heatLoss: optional(value.nonNegative(), {
    label: 'Heat loss',
    help: "Heat lost by this pipe, Btu/h (US) or W (SI); without it the loop's heat loss per length applies.",
    range: 'loopHeatLoss',
  }),
});

/**
 * The recirculation loop of a hot-water system: its pipes, their heat loss, and the temperature
 * drop allowed around it; Headroom computes the loop flow, the return sizes and the pump's flow
 * and head (hotWater/recirculation.ts).
 */
export const RECIRCULATION = element('recirculation loop', {
  segments: required(value.list(value.element(RECIRCULATION_SEGMENT), RECIRCULATION_SEGMENTS_MAX), {
    label: 'Loop pipes',
    help: 'The loop, from the heater back to it.',
  }),
  heatLossPerLength: optional(value.nonNegative(), {
    label: 'Heat loss per length of pipe',
    help: 'For pipes without their own heat loss, Btu/h per ft (US) or W/m (SI): from the insulation maker’s tables.',
    range: 'loopHeatLossPerLength',
  }),
  temperatureDrop: required(value.number(), {
    label: 'Temperature drop allowed around the loop',
    help: 'Temperature drop allowed around the loop, °F (US) or K (SI); must be above zero.',
    range: 'loopTemperatureDrop',
  }),
  hotTemperature: optional(value.number(), {
    label: 'Temperature leaving the heater',
    help: "Temperature leaving the heater, °F or °C; default the system's water temperature.",
    range: 'waterTemperature',
  }),
  fittingAllowance: optional(value.between(0, 5), {
    label: 'Fitting allowance (fraction of the pipe friction)',
    help: 'Fittings and valves as a fraction of the loop’s pipe friction, for the pump head. Default 0.25 (fittings as a quarter of the pipe, a designers’ rule of thumb); 0 when fittings are counted in the lengths.',
    range: 'fittingAllowance',
  }),
  heaterLoss: optional(value.nonNegative(), {
    label: 'Heater loss at the loop flow',
    help: 'Pressure lost through the heater at the loop flow, pressure unit: from the heater maker’s pressure-drop data. Default 0.',
    range: 'pressureLoss',
  }),
});

// ---- the record of an applied sizing

export const CLASS_VELOCITY_LIMIT = element('class velocity limit', {
  material: required(velocityClass(), { label: 'Velocity class' }),
  maxVelocity: required(value.positive(), { label: 'Velocity limit', range: 'velocityLimit' }),
});

/**
 * What an applied automatic sizing was asked to meet (src/engine/sizing/basis.ts writes it when the
 * designer applies an answer): when, on which segments, the margin, the supply pressure and the
 * velocity limits it used, and a fingerprint of every segment's pipe after it, so a later edit of
 * the sizes can be told apart from the sizes it chose. Its absence says the sizes are the designer's.
 */
export const SIZING_BASIS = element('sizing basis', {
  sizedAt: required(date(), { label: 'Sized at', help: 'When the sizing was applied (ISO 8601, UTC).' }),
  scope: required(value.oneOf(['system', 'selection']), { label: 'Scope', help: 'Whether every segment of the system, or a selection, was sized.' }),
  margin: required(value.nonNegative(), {
    label: 'Margin kept',
    help: 'Margin kept above each checked fixture’s minimum, pressure unit.',
    range: 'minFlowPressure',
  }),
  supplyPressure: required(value.nonNegative(), {
    label: 'Supply pressure',
    help: 'The minimum supply pressure at the design flow the sizing used, pressure unit.',
    range: 'staticPressure',
  }),
  velocityLimits: required(value.list(value.element(CLASS_VELOCITY_LIMIT), B.velocityLimits), {
    label: 'Velocity limits',
    help: 'The velocity limit of each material class for the system’s service, velocity unit.',
  }),
  segmentsChanged: required(value.wholeNumber(), { label: 'Segments changed', help: 'Segments whose size the sizing changed.', range: 'segmentCount' }),
  segmentsLocked: required(value.wholeNumber(), {
    label: 'Segments locked',
    help: 'Segments the designer had locked, kept at their size.',
    range: 'segmentCount',
  }),
  sizesFingerprint: required(value.text(B.idLength), {
    label: 'Sizes fingerprint',
    help: 'Fingerprint of every segment’s material and size after the sizing was applied.',
  }),
});

// ---- the document

export const SYSTEM_DOCUMENT = element('system', {
  schemaVersion: required(value.literal(SCHEMA_VERSION), { label: 'Format version' }),
  id: required(id(), { label: 'System id' }),
  name: required(name(), { label: 'Name' }),
  service: required(value.oneOf(['cold', 'hot']), { label: 'Service' }),
  unitSystem: required(value.oneOf(['US', 'SI']), { label: 'Unit system' }),
  waterTemperature: required(value.number(), {
    label: 'Water temperature',
    help: 'Water temperature, °F or °C: sets the water’s density and viscosity.',
    range: 'waterTemperature',
  }),
  source: required(value.element(SOURCE), { label: 'Source' }),
  devices: withDefault(value.list(value.element(DEVICE), B.devices), [], { label: 'Devices' }),
  floors: withDefault(value.list(value.element(FLOOR), B.floors), [], { label: 'Floors', help: 'Named levels on which nodes may be placed.' }),
  nodes: required(value.list(value.element(NODE), B.nodes, 1), { label: 'Nodes' }),
  segments: required(value.list(value.element(SEGMENT), B.segments), { label: 'Segments' }),
  unitTypes: optional(value.list(value.element(UNIT_TYPE), B.unitTypes), { label: 'Unit types', help: 'Typical units, defined once.' }),
  placements: optional(value.list(value.element(PLACEMENT), B.placements), { label: 'Placements', help: 'Occurrences of the unit types on floors.' }),
  criteria: optional(value.element(CRITERIA), { label: 'Criteria' }),
  expansionTank: optional(value.element(EXPANSION_TANK), {
    label: 'Expansion tank',
    help: 'Hot water: the thermal expansion tank and its sizing inputs.',
  }),
  recirculation: optional(value.element(RECIRCULATION), {
    label: 'Recirculation',
    help: 'Hot water: the recirculation loop, its heat loss and allowed temperature drop.',
  }),
  notes: optional(value.text(B.notesLength), { label: 'Notes' }),
  sizingBasis: optional(value.element(SIZING_BASIS), {
    label: 'Sizing basis',
    help: 'The automatic sizing last applied to this draft; absent when the sizes are as entered.',
  }),
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
    FLOW_TEST,
    FED_FROM_CLOSING,
    FED_FROM_RESOLVED,
    FED_FROM_UNRESOLVED,
    FED_FROM,
    SOURCE,
    DEVICE_LOSS_FIXED,
    CURVE_POINT,
    DEVICE_LOSS_CURVE,
    PRV,
    BOOST_CONSTANT_SPEED,
    BOOST_VARIABLE_SPEED,
    BOOST_GAIN,
    DEVICE,
    FLOOR,
    VELOCITY_LIMIT,
    CRITERIA,
    UNIT_NODE,
    UNIT_SEGMENT,
    UNIT_TYPE,
    SEGMENT_OVERRIDE,
    NODE_OVERRIDE,
    PLACEMENT_OVERRIDES,
    PLACEMENT,
    EXPANSION_TANK,
    RECIRCULATION_SEGMENT,
    RECIRCULATION,
    CLASS_VELOCITY_LIMIT,
    SIZING_BASIS,
    SYSTEM_DOCUMENT,
  };
}
