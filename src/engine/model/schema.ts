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

// The bounds live in bounds.ts so that the element descriptions (elements.ts) can use them too.
export { DOCUMENT_BOUNDS } from './bounds';
import { DOCUMENT_BOUNDS } from './bounds';
import { CHECKED_FIXTURE, CUSTOM_FITTING, CUSTOM_FIXTURE, CUSTOM_PIPE, FITTING, FIXTURE_GROUP, NODE, SEGMENT } from './elements';

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
export const FedFromClosingSchema = z.strictObject({
  kind: z.enum(['backflow-preventer', 'prv', 'check-valve']),
  elementId: id().describe('The device id, or the segment id carrying the check valve.'),
  label: label().describe('As labelled in the cold system.'),
});
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
        closedBy: z
          .array(FedFromClosingSchema)
          .max(FED_FROM_CLOSING_MAX)
          .optional()
          .describe(
            "The cold system's backflow preventers, PRVs and check valves between its source and the node: they close this hot system to thermal expansion.",
          ),
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
  kind: z.enum(['meter', 'backflow-preventer', 'prv', 'strainer', 'softener', 'filter', 'water-heater', 'booster-pump', 'other']),
  label: label().min(1),
  segmentId: id().describe('The segment at whose inlet the device sits; devices on one segment act in list order.'),
  loss: DeviceLossSchema,
  prv: z
    .strictObject({
      setPressure: positive().describe('Outlet set pressure, pressure unit.'),
      falloffPerFlow: nonNegative().default(0).describe('Drop of the outlet pressure per unit of flow (psi per gpm or kPa per L/s).'),
    })
    .optional()
    .describe('Required when kind is "prv".'),
  boost: BoostSchema.optional().describe('Required when kind is "booster-pump".'),
});

// The fixture groups and checked fixtures are described once in elements.ts; their zod schemas:
export const CustomFixtureSchema = CUSTOM_FIXTURE.schema;
export const FixtureGroupSchema = FIXTURE_GROUP.schema;
export const CheckedFixtureSchema = CHECKED_FIXTURE.schema;

/** A named level of the building; nodes placed on it move with it. */
export const FloorSchema = z.strictObject({
  id: id(),
  name: label().min(1).describe('Name of the level as the drawings give it ("Level 3", "Basement").'),
  elevation: finite().describe('Elevation of the finished floor, length unit, the datum of the node elevations.'),
});

/** A node (its position, fixture groups, checked fixtures), described once in elements.ts. */
export const NodeSchema = NODE.schema;

// The segment and what it holds are described once in elements.ts (keys, ranges, who may change
// them, labels); these are their zod schemas, derived from the descriptions.
export const CustomFittingSchema = CUSTOM_FITTING.zod;
export const FittingSchema = FITTING.schema;
export const CustomPipeSchema = CUSTOM_PIPE.schema;
export const SegmentSchema = SEGMENT.schema;

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
  heightAboveFloor: z
    .number()
    .min(0)
    .max(50)
    .default(0)
    .describe('Height above the floor, length unit (0–50, the plausible range of limits.ts in feet; less in metres).'),
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

/** Most segments a recirculation loop may have (a bound, as DOCUMENT_BOUNDS gives the others). */
export const RECIRCULATION_SEGMENTS_MAX = 500;

/**
 * One pipe of a hot-water recirculation loop (sized by hotWater/recirculationDocument.ts): from the
 * heater out along the hot tree and back by the return. A segment with a size is checked at it; one
 * without is sized (the return).
 */
export const RecirculationSegmentSchema = z.strictObject({
  id: id(),
  label: label().optional(),
  from: id().describe("Node the pipe leaves, toward the loop's end: the heater (the source node), a node of the hot tree, or a return-only node."),
  to: id().describe('Node the pipe reaches; the last pipe of the loop reaches the heater (the source node).'),
  length: positive().describe('Developed length of pipe, length unit.'),
  material: id().describe('Material id from the materials catalog.'),
  size: id().optional().describe('Nominal size key; leave out (on the return) to have the smallest size within the velocity and friction limits chosen.'),
  heatLoss: nonNegative().optional().describe("Heat lost by this pipe, Btu/h (US) or W (SI); without it the loop's heat loss per length applies."),
});

/**
 * The recirculation loop of a hot-water system: its pipes, their heat loss, and the temperature
 * drop allowed around it; Headroom computes the loop flow, the return sizes and the pump's flow
 * and head (hotWater/recirculation.ts).
 */
export const RecirculationSchema = z.strictObject({
  segments: z.array(RecirculationSegmentSchema).max(RECIRCULATION_SEGMENTS_MAX).describe('The loop, from the heater back to it.'),
  heatLossPerLength: nonNegative()
    .optional()
    .describe('Heat lost per length of loop pipe, Btu/h per ft (US) or W/m (SI), for pipes without their own heat loss.'),
  temperatureDrop: finite().describe('Temperature drop allowed around the loop, °F (US) or K (SI); must be above zero.'),
  hotTemperature: finite().optional().describe("Temperature leaving the heater, °F or °C; default the system's water temperature."),
  fittingAllowance: z
    .number()
    .min(0)
    .max(5)
    .optional()
    .describe("Fittings and valves as a fraction of the loop's pipe friction, for the pump head (default 0.25, a designers' rule of thumb)."),
  heaterLoss: nonNegative().optional().describe('Pressure lost through the heater at the loop flow, pressure unit (default 0).'),
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
  recirculation: RecirculationSchema.optional().describe('Hot water: the recirculation loop, its heat loss and allowed temperature drop.'),
  notes: z.string().max(B.notesLength).optional(),
  sizingBasis: SizingBasisSchema.optional().describe('The automatic sizing last applied to this draft; absent when the sizes are as entered.'),
});

export type SystemDocument = z.infer<typeof SystemDocumentSchema>;
/** What may be written in a file (defaults not yet applied). */
export type SystemDocumentInput = z.input<typeof SystemDocumentSchema>;
export type Source = z.infer<typeof SourceSchema>;
export type FedFrom = z.infer<typeof FedFromSchema>;
export type ExpansionTank = z.infer<typeof ExpansionTankSchema>;
export type Recirculation = z.infer<typeof RecirculationSchema>;
export type RecirculationSegment = z.infer<typeof RecirculationSegmentSchema>;
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
