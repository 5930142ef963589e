/**
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
 *
 * Version 2 (this file) holds one truth for elevations: a node is placed by an absolute
 * `elevation`, or on a `floor` (plus `heightAboveFloor`), or by its feed segment's `rise`; never
 * two of these at once. Version 1 documents are read through upgrade.ts (schemaV1.ts).
 *
 * Sizes are bounded (DOCUMENT_BOUNDS) so that a document no building needs is refused before it
 * costs time; numbers have plausible ranges by unit system (limits.ts), checked by the engine's
 * validation stage because the bounds depend on the document's unit system.
 */
import { z } from 'zod';

export const SCHEMA_VERSION = 2 as const;

/**
 * Bounds on every list and string of a document. Reference: a 40-storey tower with about 12
 * dwellings a floor has about 500 dwellings, 5,000 fixtures and, entered fixture by fixture, about
 * 5,000 segments; 20,000 nodes and segments is four times that. Per-element lists (fixture groups
 * at a node, fittings on a segment) are tens in practice; 100 each is headroom. Text fields are
 * names (200 characters, two lines of a drawing title block), sources and bases (1,000: a
 * citation with edition, table and row) and free notes (20,000).
 */
export const DOCUMENT_BOUNDS = Object.freeze({
  nodes: 20000,
  segments: 20000,
  /** Meters, backflow preventers, PRVs, pumps, heaters: a tower has tens; one per segment of a large riser zone bank is far more. */
  devices: 2000,
  /** A 40-storey tower has about 45 levels with basements and plant; 500 covers mezzanines and several buildings on one service. */
  floors: 500,
  fixtureGroupsPerNode: 100,
  checkedFixturesPerNode: 100,
  fittingsPerSegment: 100,
  /**
   * A unit type is one apartment, room or restroom: 200 segments is several times the branch
   * piping of the largest apartment or restroom core; 2,000 types and 20,000 placements cover a
   * 40-storey tower of 20 units a floor many times over.
   */
  unitSegments: 200,
  unitNodes: 201,
  unitTypes: 2000,
  placements: 20000,
  /** A manufacturer's loss curve is read at 5–20 points. */
  curvePoints: 100,
  /** Three material classes × two services, with room for repeats. */
  velocityLimits: 20,
  /** One per fixture type of the catalogs (about 60) with project types. */
  minFlowPressures: 500,
  idLength: 200,
  labelLength: 200,
  sourceLength: 1000,
  dateLength: 40,
  notesLength: 20000,
});

const B = DOCUMENT_BOUNDS;
const id = () => z.string().min(1).max(B.idLength);
const label = () => z.string().max(B.labelLength);
const sourceText = () => z.string().min(1).max(B.sourceLength);
const date = () => z.string().max(B.dateLength);
const finite = () => z.number();
const nonNegative = () => z.number().nonnegative();
const positive = () => z.number().positive();

export const DemandCurveSchema = z.enum(['flush-tank', 'flush-valve']);
export const ServiceSchema = z.enum(['cold', 'hot']);
export const UnitSystemSchema = z.enum(['US', 'SI']);
export const VelocityClassSchema = z.enum(['copper', 'plastic', 'steel']);

export const FlowTestSchema = z
  .strictObject({
    staticPressure: positive().describe('Static pressure during the test (no flow), pressure unit.'),
    residualPressure: nonNegative().describe('Residual pressure while flowing the test flow, pressure unit.'),
    flow: positive().describe('Flow during the test, flow unit.'),
    date: date().optional().describe('Date of the test (ISO 8601).'),
  })
  .describe('Hydrant flow test (NFPA 291) at the connection.');

/**
 * Where a hot-water system's supply comes from: the node of a cold-water system (same project) that
 * feeds its water heater. `resolution` is written by Headroom (src/engine/hotWater/fedFrom.ts, on
 * the server at every save, issue and read, and whenever the cold system changes; in the walk from
 * the cold system's current analysis), never typed: with it, the source's static pressures and basis
 * are the cold system's figures at that node. Unresolved (the cold system or its node missing, or
 * its analysis not computable) makes the verdict Incomplete with the reason.
 */
export const FED_FROM_UNRESOLVED_CODES = ['cold-system-missing', 'cold-system-not-cold', 'cold-node-missing', 'cold-analysis-missing', 'not-yet-resolved'] as const;
export const FedFromSchema = z.strictObject({
  systemId: id().describe('The cold-water system whose analysis feeds this hot system.'),
  nodeId: id().describe("The cold system's node that feeds the water heater."),
  resolution: z
    .discriminatedUnion('status', [
      z.strictObject({
        status: z.literal('resolved'),
        systemName: label().describe('The cold system, as named when resolved.'),
        nodeLabel: label().describe('The node, as labelled when resolved.'),
        revisionNumber: z.number().int().positive().describe("The cold system's revision whose analysis was read."),
        revisionStatus: z.enum(['draft', 'issued']),
        residualPressure: nonNegative().describe('Residual pressure at the node at design flow, pressure unit (of this document).'),
        staticPressureHigh: nonNegative().describe('High static pressure at the node, pressure unit (of this document).'),
      }),
      z.strictObject({
        status: z.literal('unresolved'),
        code: z.enum(FED_FROM_UNRESOLVED_CODES),
        message: sourceText(),
      }),
    ])
    .optional()
    .describe('Written by Headroom from the cold system, never typed.'),
});

export const SourceSchema = z.strictObject({
  kind: z.enum(['utility-main', 'tank', 'booster-outlet']),
  nodeId: id().describe('The node where the water enters; its elevation (absolute or on a floor) is the connection elevation.'),
  staticPressureLow: nonNegative().describe('Lowest expected static pressure at the connection, pressure unit.'),
  staticPressureHigh: nonNegative().describe('Highest expected static pressure at the connection, pressure unit.'),
  pressureBasis: sourceText().describe('Where the pressure figures came from: utility letter, flow test, gauge reading, ...'),
  pressureDate: date().optional().describe('Date of the pressure figures (ISO 8601).'),
  flowTest: FlowTestSchema.optional(),
  fedFrom: FedFromSchema.optional().describe('Hot water only: the cold system and node feeding the heater; the static pressures then follow it.'),
});

export const DeviceLossSchema = z.discriminatedUnion('kind', [
  z.strictObject({
    kind: z.literal('fixed'),
    loss: nonNegative().describe('Pressure loss at any flow, pressure unit.'),
  }),
  z.strictObject({
    kind: z.literal('curve'),
    points: z
      .array(z.strictObject({ flow: nonNegative(), loss: nonNegative() }))
      .min(1)
      .max(B.curvePoints)
      .describe("Manufacturer's loss at flow points (flow unit, pressure unit); (0, 0) is implied."),
  }),
]);

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
export const BoostSchema = z.union([
  z.strictObject({
    control: z.literal('constant-speed'),
    designGain: nonNegative().describe('Pressure added at the design point, pressure unit.'),
    shutoffGain: nonNegative().describe('Pressure added at zero flow (shutoff), pressure unit; not below the design gain.'),
    designFlow: positive().optional().describe("Flow at the design point, flow unit; defaults to the system's design flow through the pump."),
  }),
  z.strictObject({
    control: z.literal('variable-speed'),
    setPressure: positive().describe('Discharge pressure the drive holds, pressure unit.'),
  }),
  z.strictObject({ gain: nonNegative().describe('Version 1 form: pressure added at the design flow, pressure unit (shutoff unknown).') }),
]);

export const DeviceSchema = z.strictObject({
  id: id(),
  kind: z.enum([
    'meter',
    'backflow-preventer',
    'prv',
    'strainer',
    'softener',
    'filter',
    'water-heater',
    'booster-pump',
    'other',
  ]),
  label: label().min(1),
  segmentId: id().describe('The segment at whose inlet the device sits; devices on one segment act in list order.'),
  loss: DeviceLossSchema,
  prv: z
    .strictObject({
      setPressure: positive().describe('Outlet set pressure, pressure unit.'),
      falloffPerFlow: nonNegative()
        .default(0)
        .describe('Drop of the outlet pressure per unit of flow (psi per gpm or kPa per L/s).'),
    })
    .optional()
    .describe('Required when kind is "prv".'),
  boost: BoostSchema.optional().describe('Required when kind is "booster-pump".'),
});

/**
 * A fixture type given by its own data (a project's fixture type copied into the document), in
 * place of the fixtures catalog's values for this group. Fixture units are per fixture; an absent
 * cold or hot value counts as no load on that service, as a catalog type without one does.
 * `flushValve` sets the demand curve (true: flush-valve, false: flush-tank); without it the
 * catalog type's curve applies, or flush-tank when `fixtureTypeId` is not a catalog type.
 * The values and their `source` are the designer's: the analysis repeats them in a note.
 */
export const CustomFixtureSchema = z.strictObject({
  label: label().min(1).describe('Name of the fixture type, as the project catalog gives it.'),
  wsfuCold: nonNegative().optional().describe('Cold-water fixture units per fixture.'),
  wsfuHot: nonNegative().optional().describe('Hot-water fixture units per fixture.'),
  wsfuTotal: nonNegative().describe('Total fixture units per fixture.'),
  flushValve: z.boolean().optional().describe('Flush-valve demand curve (true) or flush-tank (false).'),
  source: sourceText().describe('Where the values come from (standard, table, manufacturer).'),
});

export const FixtureGroupSchema = z.strictObject({
  fixtureTypeId: id().describe(
    'Fixture type id from the fixtures catalog; with `custom`, any reference (e.g. "project:<entry id>"), looked up only as a fallback.',
  ),
  count: z.number().int().positive(),
  custom: CustomFixtureSchema.optional().describe("The fixture type's own data, overriding the catalog's."),
  demandCurve: DemandCurveSchema.optional().describe("Overrides the fixture type's demand curve."),
  wsfuBasis: z
    .enum(['cold', 'hot', 'total'])
    .optional()
    .describe("Which fixture-unit load counts: defaults to the system's service (cold or hot)."),
  usage: z
    .strictObject({
      flow: positive().optional().describe("Flow while in use, flow unit; defaults to the fixture type's flow."),
      durationSeconds: positive(),
      recurrenceSeconds: positive(),
    })
    .optional()
    .describe("For Hunter's binomial method: flow, duration of use and time between uses."),
});

export const CheckedFixtureSchema = z.strictObject({
  id: id(),
  fixtureTypeId: id(),
  label: label().optional(),
  minFlowPressure: nonNegative().optional().describe('Overrides the minimum flow pressure, pressure unit.'),
  flowRate: positive().optional().describe("Overrides the fixture's flow rate (reported), flow unit."),
  expectedCritical: z.boolean().optional().describe('The designer expects this fixture to be the critical one.'),
});

/** A named level of the building; nodes placed on it move with it. */
export const FloorSchema = z.strictObject({
  id: id(),
  name: label().min(1).describe('Name of the level as the drawings give it ("Level 3", "Basement").'),
  elevation: finite().describe('Elevation of the finished floor, length unit, the datum of the node elevations.'),
});

/**
 * A node's position is exactly one of: an absolute `elevation`; a `floor` with an optional
 * `heightAboveFloor` (default 0); or neither, and then its feed segment's `rise` places it
 * (elevation = elevation of the upstream node + rise). Both `elevation` and `floor` at once is an
 * error, and so is a `rise` on the feed segment of a node that has either.
 */
export const NodeSchema = z.strictObject({
  id: id(),
  label: label().optional(),
  elevation: finite().optional().describe('Absolute elevation, length unit, any datum (the same for all nodes and floors).'),
  floor: id().optional().describe('Id of the floor the node is on (instead of an absolute elevation).'),
  heightAboveFloor: finite().optional().describe('Height above its floor, length unit (default 0); only with `floor`.'),
  fixtureGroups: z.array(FixtureGroupSchema).max(B.fixtureGroupsPerNode).default([]),
  continuousDemand: nonNegative().optional().describe('Continuous demand drawn at this node, flow unit.'),
  checkedFixtures: z.array(CheckedFixtureSchema).max(B.checkedFixturesPerNode).default([]),
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
export const CustomFittingSchema = z.union([
  z.strictObject({
    label: label().min(1).describe('Name of the fitting type, as the project catalog gives it.'),
    k: nonNegative().describe('Loss coefficient K (velocity heads), referred to the segment velocity.'),
    source: sourceText().describe('Where the value comes from (standard, table, manufacturer).'),
  }),
  z.strictObject({
    label: label().min(1).describe('Name of the fitting type, as the project catalog gives it.'),
    equivalentLength: nonNegative().describe('Equivalent length of the segment pipe, length unit.'),
    source: sourceText().describe('Where the value comes from (standard, table, manufacturer).'),
  }),
]);

export const FittingSchema = z.strictObject({
  typeId: id().describe(
    'Fitting type id from the fittings catalog; with `custom`, a reference to where the data came from (e.g. "project:<entry id>"), not looked up.',
  ),
  count: z.number().int().positive(),
  custom: CustomFittingSchema.optional().describe("Instead of the catalog's data: the fitting's own K or equivalent length."),
});

export const CustomPipeSchema = z.strictObject({
  innerDiameter: positive().describe('Inside diameter, diameter unit.'),
  roughness: nonNegative().describe('Absolute roughness, diameter unit.'),
  hazenWilliamsC: positive(),
  velocityClass: VelocityClassSchema.describe('Which velocity limit applies.'),
});

export const SegmentSchema = z.strictObject({
  id: id(),
  label: label().optional(),
  from: id().describe('Upstream node (toward the source).'),
  to: id().describe('Downstream node.'),
  material: id().optional().describe('Material id from the materials catalog (with size).'),
  size: id().optional().describe("Nominal size key in the material's catalog, e.g. \"3/4\"."),
  custom: CustomPipeSchema.optional().describe('Instead of material and size: a pipe given by its own data.'),
  length: positive().describe('Developed length of pipe, length unit.'),
  rise: finite()
    .optional()
    .describe(
      'Rise from the upstream to the downstream node, length unit; places the downstream node, so only where that node has neither an elevation nor a floor.',
    ),
  fittings: z.array(FittingSchema).max(B.fittingsPerSegment).default([]),
  flowOverride: nonNegative().optional().describe('Design flow to use instead of the fixture-unit demand, flow unit.'),
  reducerAuto: z
    .boolean()
    .default(true)
    .describe('Add a sudden expansion or contraction loss where the size differs from the feeding segment.'),
  sizeLocked: z
    .boolean()
    .optional()
    .describe('The designer fixed this size: automatic sizing keeps it.'),
});

export const CriteriaOverridesSchema = z
  .strictObject({
    maxStaticPressure: positive().optional(),
    minStaticPressure: nonNegative().optional(),
    velocityLimits: z
      .array(z.strictObject({ material: VelocityClassSchema, service: ServiceSchema, maxVelocity: positive() }))
      .max(B.velocityLimits)
      .optional()
      .describe('Replace the default limit of each material class and service listed.'),
    minFlowPressures: z
      .record(id(), nonNegative())
      .refine((r) => Object.keys(r).length <= B.minFlowPressures, { message: `at most ${B.minFlowPressures} fixture types` })
      .optional()
      .describe('Minimum flow pressure per fixture type id, pressure unit.'),
    demandCurve: z.enum(['auto', 'flush-tank', 'flush-valve']).optional(),
    demandMethod: z.enum(['hunter-table', 'hunter-binomial']).optional(),
    frictionMethod: z.enum(['colebrook', 'swamee-jain', 'churchill-1977', 'hazen-williams']).optional(),
    fittingMethod: z.enum(['crane', 'hooper-2k', 'darby-3k', 'equivalent-length']).optional(),
  })
  .describe("Overrides of the engine's default criteria; the local code governs.");

/**
 * Typical units (an apartment, a room, a restroom) defined once and placed on floors. A unit type
 * holds its own branch piping, fixture groups and checked fixtures with local ids; its one inlet
 * segment starts at "inlet", which a placement connects to a node of the main tree. The analysis
 * expands placements into ordinary nodes and segments first (src/engine/building/expand.ts), so
 * editing the type changes every placement, and a placement's override is data of its own.
 * Unit nodes sit on the placement's floor at their height above it; rises are never typed here.
 */
export const UNIT_INLET = 'inlet';

export const UnitNodeSchema = z.strictObject({
  id: id().refine((v) => v !== UNIT_INLET, { message: `"${UNIT_INLET}" names the unit's connection point` }),
  label: label().optional(),
  heightAboveFloor: z.number().min(0).max(50).default(0).describe('Height above the floor, length unit (0–50, the plausible range of limits.ts in feet; less in metres).'),
  fixtureGroups: z.array(FixtureGroupSchema).max(B.fixtureGroupsPerNode).default([]),
  checkedFixtures: z.array(CheckedFixtureSchema).max(B.checkedFixturesPerNode).default([]),
});

export const UnitSegmentSchema = z.strictObject({
  id: id(),
  label: label().optional(),
  from: id().describe(`Upstream node: "${UNIT_INLET}" (the placement's connection) or a node of the unit.`),
  to: id().describe('Downstream node of the unit.'),
  material: id().optional(),
  size: id().optional(),
  custom: CustomPipeSchema.optional(),
  length: positive().describe('Developed length, length unit.'),
  fittings: z.array(FittingSchema).max(B.fittingsPerSegment).default([]),
});

export const UnitTypeSchema = z.strictObject({
  id: id(),
  name: label().min(1),
  nodes: z.array(UnitNodeSchema).min(1).max(B.unitNodes),
  segments: z.array(UnitSegmentSchema).min(1).max(B.unitSegments),
});

/** Fields a placement may change on one of its unit's segments or nodes. */
export const SegmentOverrideSchema = z.strictObject({
  length: positive().optional(),
  material: id().optional(),
  size: id().optional(),
  fittings: z.array(FittingSchema).max(B.fittingsPerSegment).optional(),
});
export const NodeOverrideSchema = z.strictObject({
  heightAboveFloor: z.number().min(0).max(50).optional(),
});

export const PlacementSchema = z.strictObject({
  id: id(),
  unitTypeId: id(),
  label: label().min(1).describe('The occurrence as the drawings name it, e.g. "Apt 704".'),
  floor: id().describe('Floor id.'),
  at: id().describe('Node of the main tree where the unit connects (its inlet segment starts there).'),
  overrides: z
    .strictObject({
      segments: z.record(id(), SegmentOverrideSchema).optional(),
      nodes: z.record(id(), NodeOverrideSchema).optional(),
    })
    .optional(),
});

/**
 * The thermal expansion tank of a hot-water system (sized by hotWater/expansionTank.ts): the volume
 * of water heated (the heaters' storage), the cold (incoming) and hot (stored) temperatures, the
 * supply pressure at the tank (its precharge) and the pressure it is sized for (the relief setting,
 * or somewhat below it). Its presence says the system has a tank.
 */
export const ExpansionTankSchema = z.strictObject({
  heaterVolume: nonNegative().describe('Volume of water heated, gal (US) or L (SI); must be above zero to size the tank.'),
  coldTemperature: finite().describe('Temperature of the incoming cold water, °F or °C.'),
  hotTemperature: finite().describe('Stored hot-water temperature, °F or °C.'),
  supplyPressure: nonNegative().describe('Supply pressure at the tank (its precharge), pressure unit.'),
  reliefPressure: positive().describe('Pressure the tank is sized for: the relief setting or somewhat below it, pressure unit.'),
});

/**
 * What an applied automatic sizing was asked to meet (src/engine/sizing/basis.ts writes it when the
 * designer applies an answer): when, on which segments, the margin, the supply pressure and the
 * velocity limits it used, and a fingerprint of every segment's pipe after it, so a later edit of
 * the sizes can be told apart from the sizes it chose. Its absence says the sizes are the designer's.
 */
export const SizingBasisSchema = z.strictObject({
  sizedAt: date().describe('When the sizing was applied (ISO 8601, UTC).'),
  scope: z.enum(['system', 'selection']).describe('Whether every segment of the system, or a selection, was sized.'),
  margin: nonNegative().describe('Margin kept above each checked fixture’s minimum, pressure unit.'),
  supplyPressure: nonNegative().describe('The minimum supply pressure at the design flow the sizing used, pressure unit.'),
  velocityLimits: z
    .array(z.strictObject({ material: VelocityClassSchema, maxVelocity: positive() }))
    .max(B.velocityLimits)
    .describe('The velocity limit of each material class for the system’s service, velocity unit.'),
  segmentsChanged: z.number().int().nonnegative().describe('Segments whose size the sizing changed.'),
  segmentsLocked: z.number().int().nonnegative().describe('Segments the designer had locked, kept at their size.'),
  sizesFingerprint: z.string().max(B.idLength).describe('Fingerprint of every segment’s material and size after the sizing was applied.'),
});

export const SystemDocumentSchema = z.strictObject({
  schemaVersion: z.literal(SCHEMA_VERSION),
  id: id(),
  name: label().min(1),
  service: ServiceSchema,
  unitSystem: UnitSystemSchema,
  waterTemperature: finite().describe('Water temperature, °F or °C.'),
  source: SourceSchema,
  devices: z.array(DeviceSchema).max(B.devices).default([]),
  floors: z.array(FloorSchema).max(B.floors).default([]).describe('Named levels on which nodes may be placed.'),
  nodes: z.array(NodeSchema).min(1).max(B.nodes),
  segments: z.array(SegmentSchema).max(B.segments),
  unitTypes: z.array(UnitTypeSchema).max(B.unitTypes).optional().describe('Typical units, defined once.'),
  placements: z.array(PlacementSchema).max(B.placements).optional().describe('Occurrences of the unit types on floors.'),
  criteria: CriteriaOverridesSchema.optional(),
  expansionTank: ExpansionTankSchema.optional().describe('Hot water: the thermal expansion tank and its sizing inputs.'),
  notes: z.string().max(B.notesLength).optional(),
  sizingBasis: SizingBasisSchema.optional().describe('The automatic sizing last applied to this draft; absent when the sizes are as entered.'),
});

export type SystemDocument = z.infer<typeof SystemDocumentSchema>;
/** What may be written in a file (defaults not yet applied). */
export type SystemDocumentInput = z.input<typeof SystemDocumentSchema>;
export type Source = z.infer<typeof SourceSchema>;
export type FedFrom = z.infer<typeof FedFromSchema>;
export type ExpansionTank = z.infer<typeof ExpansionTankSchema>;
export type SizingBasis = z.infer<typeof SizingBasisSchema>;
export type Device = z.infer<typeof DeviceSchema>;
export type Boost = z.infer<typeof BoostSchema>;
export type Floor = z.infer<typeof FloorSchema>;
export type UnitType = z.infer<typeof UnitTypeSchema>;
export type UnitTypeInput = z.input<typeof UnitTypeSchema>;
export type Placement = z.infer<typeof PlacementSchema>;
export type PlacementInput = z.input<typeof PlacementSchema>;
export type DeviceLoss = z.infer<typeof DeviceLossSchema>;
export type SystemNode = z.infer<typeof NodeSchema>;
export type FixtureGroup = z.infer<typeof FixtureGroupSchema>;
export type CheckedFixture = z.infer<typeof CheckedFixtureSchema>;
export type Segment = z.infer<typeof SegmentSchema>;
export type Fitting = z.infer<typeof FittingSchema>;
export type CustomFitting = z.infer<typeof CustomFittingSchema>;
export type CustomFixture = z.infer<typeof CustomFixtureSchema>;
export type CustomPipe = z.infer<typeof CustomPipeSchema>;
export type CriteriaOverrides = z.infer<typeof CriteriaOverridesSchema>;

/** The JSON Schema (draft 2020-12) of a system document as written in a file. */
export function systemDocumentJsonSchema(): Record<string, unknown> {
  return z.toJSONSchema(SystemDocumentSchema, { io: 'input', target: 'draft-2020-12' }) as Record<string, unknown>;
}
