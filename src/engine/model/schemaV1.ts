/**
 * The system document as it was written in schemaVersion 1 (frozen: read only to be upgraded by
 * upgrade.ts; new documents are schemaVersion 2, schema.ts). In version 1 every node had an
 * absolute elevation and a segment's optional rise was only checked against them.
 *
 * The system document: one water distribution system (a source, in-line devices and a tree of
 * segments from the source node out to the fixtures), as stored, exchanged and analysed.
 *
 * Every number is in the document's `unitSystem`:
 *   US: pressure psi (gauge), length and elevation ft, inside diameter in, flow gpm, temperature °F,
 *       velocity ft/s; PRV fall-off psi per gpm.
 *   SI: pressure kPa (gauge), length and elevation m, inside diameter mm, flow L/s, temperature °C,
 *       velocity m/s; PRV fall-off kPa per L/s.
 * Roughness of a custom pipe is in the diameter unit (in or mm).
 * The analysis converts to SI base units at input (src/engine/units.ts) and back at output.
 *
 * Catalog references (material, size, fitting type, fixture type) are plain strings here and are
 * checked against the catalogs by the validation stage, so the format does not change when a
 * catalog grows. Objects are strict: an unknown key is an error, which catches misspelt fields.
 */
import { z } from 'zod';

export const SCHEMA_VERSION_V1 = 1 as const;

const id = () => z.string().min(1).max(200);
const finite = () => z.number();
const nonNegative = () => z.number().nonnegative();
const positive = () => z.number().positive();

export const DemandCurveSchemaV1 = z.enum(['flush-tank', 'flush-valve']);
export const ServiceSchemaV1 = z.enum(['cold', 'hot']);
export const UnitSystemSchemaV1 = z.enum(['US', 'SI']);
export const VelocityClassSchemaV1 = z.enum(['copper', 'plastic', 'steel']);

export const FlowTestSchemaV1 = z
  .strictObject({
    staticPressure: positive().describe('Static pressure during the test (no flow), pressure unit.'),
    residualPressure: nonNegative().describe('Residual pressure while flowing the test flow, pressure unit.'),
    flow: positive().describe('Flow during the test, flow unit.'),
    date: z.string().optional().describe('Date of the test (ISO 8601).'),
  })
  .describe('Hydrant flow test (NFPA 291) at the connection.');

export const SourceSchemaV1 = z.strictObject({
  kind: z.enum(['utility-main', 'tank', 'booster-outlet']),
  nodeId: id().describe('The node where the water enters; its elevation is the connection elevation.'),
  staticPressureLow: nonNegative().describe('Lowest expected static pressure at the connection, pressure unit.'),
  staticPressureHigh: nonNegative().describe('Highest expected static pressure at the connection, pressure unit.'),
  pressureBasis: z.string().min(1).describe('Where the pressure figures came from: utility letter, flow test, gauge reading, ...'),
  pressureDate: z.string().optional().describe('Date of the pressure figures (ISO 8601).'),
  flowTest: FlowTestSchemaV1.optional(),
});

export const DeviceLossSchemaV1 = z.discriminatedUnion('kind', [
  z.strictObject({
    kind: z.literal('fixed'),
    loss: nonNegative().describe('Pressure loss at any flow, pressure unit.'),
  }),
  z.strictObject({
    kind: z.literal('curve'),
    points: z
      .array(z.strictObject({ flow: nonNegative(), loss: nonNegative() }))
      .min(1)
      .describe("Manufacturer's loss at flow points (flow unit, pressure unit); (0, 0) is implied."),
  }),
]);

export const DeviceSchemaV1 = z.strictObject({
  id: id(),
  kind: z.enum(['meter', 'backflow-preventer', 'prv', 'strainer', 'softener', 'filter', 'water-heater', 'booster-pump', 'other']),
  label: z.string().min(1),
  segmentId: id().describe('The segment at whose inlet the device sits; devices on one segment act in list order.'),
  loss: DeviceLossSchemaV1,
  prv: z
    .strictObject({
      setPressure: positive().describe('Outlet set pressure, pressure unit.'),
      falloffPerFlow: nonNegative().default(0).describe('Drop of the outlet pressure per unit of flow (psi per gpm or kPa per L/s).'),
    })
    .optional()
    .describe('Required when kind is "prv".'),
  boost: z
    .strictObject({ gain: nonNegative().describe('Pressure added at the design flow, pressure unit.') })
    .optional()
    .describe('Required when kind is "booster-pump".'),
});

/**
 * A fixture type given by its own data (a project's fixture type copied into the document), in
 * place of the fixtures catalog's values for this group. Fixture units are per fixture; an absent
 * cold or hot value counts as no load on that service, as a catalog type without one does.
 * `flushValve` sets the demand curve (true: flush-valve, false: flush-tank); without it the
 * catalog type's curve applies, or flush-tank when `fixtureTypeId` is not a catalog type.
 * The values and their `source` are the designer's: the analysis repeats them in a note.
 */
export const CustomFixtureSchemaV1 = z.strictObject({
  label: z.string().min(1).describe('Name of the fixture type, as the project catalog gives it.'),
  wsfuCold: nonNegative().optional().describe('Cold-water fixture units per fixture.'),
  wsfuHot: nonNegative().optional().describe('Hot-water fixture units per fixture.'),
  wsfuTotal: nonNegative().describe('Total fixture units per fixture.'),
  flushValve: z.boolean().optional().describe('Flush-valve demand curve (true) or flush-tank (false).'),
  source: z.string().min(1).describe('Where the values come from (standard, table, manufacturer).'),
});

export const FixtureGroupSchemaV1 = z.strictObject({
  fixtureTypeId: id().describe(
    'Fixture type id from the fixtures catalog; with `custom`, any reference (e.g. "project:<entry id>"), looked up only as a fallback.',
  ),
  count: z.number().int().positive(),
  custom: CustomFixtureSchemaV1.optional().describe("The fixture type's own data, overriding the catalog's."),
  demandCurve: DemandCurveSchemaV1.optional().describe("Overrides the fixture type's demand curve."),
  wsfuBasis: z.enum(['cold', 'hot', 'total']).optional().describe("Which fixture-unit load counts: defaults to the system's service (cold or hot)."),
  usage: z
    .strictObject({
      flow: positive().optional().describe("Flow while in use, flow unit; defaults to the fixture type's flow."),
      durationSeconds: positive(),
      recurrenceSeconds: positive(),
    })
    .optional()
    .describe("For Hunter's binomial method: flow, duration of use and time between uses."),
});

export const CheckedFixtureSchemaV1 = z.strictObject({
  id: id(),
  fixtureTypeId: id(),
  label: z.string().optional(),
  minFlowPressure: nonNegative().optional().describe('Overrides the minimum flow pressure, pressure unit.'),
  flowRate: positive().optional().describe("Overrides the fixture's flow rate (reported), flow unit."),
  expectedCritical: z.boolean().optional().describe('The designer expects this fixture to be the critical one.'),
});

export const NodeSchemaV1 = z.strictObject({
  id: id(),
  label: z.string().optional(),
  elevation: finite().describe('Elevation, length unit, any datum (the same for all nodes).'),
  fixtureGroups: z.array(FixtureGroupSchemaV1).default([]),
  continuousDemand: nonNegative().optional().describe('Continuous demand drawn at this node, flow unit.'),
  checkedFixtures: z.array(CheckedFixtureSchemaV1).default([]),
});

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
export const CustomFittingSchemaV1 = z.union([
  z.strictObject({
    label: z.string().min(1).describe('Name of the fitting type, as the project catalog gives it.'),
    k: nonNegative().describe('Loss coefficient K (velocity heads), referred to the segment velocity.'),
    source: z.string().min(1).describe('Where the value comes from (standard, table, manufacturer).'),
  }),
  z.strictObject({
    label: z.string().min(1).describe('Name of the fitting type, as the project catalog gives it.'),
    equivalentLength: nonNegative().describe('Equivalent length of the segment pipe, length unit.'),
    source: z.string().min(1).describe('Where the value comes from (standard, table, manufacturer).'),
  }),
]);

export const FittingSchemaV1 = z.strictObject({
  typeId: id().describe(
    'Fitting type id from the fittings catalog; with `custom`, a reference to where the data came from (e.g. "project:<entry id>"), not looked up.',
  ),
  count: z.number().int().positive(),
  custom: CustomFittingSchemaV1.optional().describe("Instead of the catalog's data: the fitting's own K or equivalent length."),
});

export const CustomPipeSchemaV1 = z.strictObject({
  innerDiameter: positive().describe('Inside diameter, diameter unit.'),
  roughness: nonNegative().describe('Absolute roughness, diameter unit.'),
  hazenWilliamsC: positive(),
  velocityClass: VelocityClassSchemaV1.describe('Which velocity limit applies.'),
});

export const SegmentSchemaV1 = z.strictObject({
  id: id(),
  label: z.string().optional(),
  from: id().describe('Upstream node (toward the source).'),
  to: id().describe('Downstream node.'),
  material: z.string().min(1).optional().describe('Material id from the materials catalog (with size).'),
  size: z.string().min(1).optional().describe('Nominal size key in the material\'s catalog, e.g. "3/4".'),
  custom: CustomPipeSchemaV1.optional().describe('Instead of material and size: a pipe given by its own data.'),
  length: positive().describe('Developed length of pipe, length unit.'),
  rise: finite().optional().describe('Rise from the upstream to the downstream node, length unit; checked against the node elevations.'),
  fittings: z.array(FittingSchemaV1).default([]),
  flowOverride: nonNegative().optional().describe('Design flow to use instead of the fixture-unit demand, flow unit.'),
  reducerAuto: z.boolean().default(true).describe('Add a sudden expansion or contraction loss where the size differs from the feeding segment.'),
});

export const CriteriaOverridesSchemaV1 = z
  .strictObject({
    maxStaticPressure: positive().optional(),
    minStaticPressure: nonNegative().optional(),
    velocityLimits: z
      .array(z.strictObject({ material: VelocityClassSchemaV1, service: ServiceSchemaV1, maxVelocity: positive() }))
      .optional()
      .describe('Replace the default limit of each material class and service listed.'),
    minFlowPressures: z.record(z.string(), nonNegative()).optional().describe('Minimum flow pressure per fixture type id, pressure unit.'),
    demandCurve: z.enum(['auto', 'flush-tank', 'flush-valve']).optional(),
    demandMethod: z.enum(['hunter-table', 'hunter-binomial']).optional(),
    frictionMethod: z.enum(['colebrook', 'swamee-jain', 'churchill-1977', 'hazen-williams']).optional(),
    fittingMethod: z.enum(['crane', 'hooper-2k', 'darby-3k', 'equivalent-length']).optional(),
    riseTolerance: nonNegative().optional().describe('Allowed difference between a rise and its node elevations, length unit.'),
  })
  .describe("Overrides of the engine's default criteria; the local code governs.");

export const SystemDocumentSchemaV1 = z.strictObject({
  schemaVersion: z.literal(SCHEMA_VERSION_V1),
  id: id(),
  name: z.string().min(1),
  service: ServiceSchemaV1,
  unitSystem: UnitSystemSchemaV1,
  waterTemperature: finite().describe('Water temperature, °F or °C.'),
  source: SourceSchemaV1,
  devices: z.array(DeviceSchemaV1).default([]),
  nodes: z.array(NodeSchemaV1).min(1),
  segments: z.array(SegmentSchemaV1),
  criteria: CriteriaOverridesSchemaV1.optional(),
  notes: z.string().optional(),
});

export type SystemDocumentV1 = z.infer<typeof SystemDocumentSchemaV1>;
export type SystemDocumentV1Input = z.input<typeof SystemDocumentSchemaV1>;
