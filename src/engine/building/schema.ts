/**
 * A building described the way a designer thinks of it: named floors, typical units (an
 * apartment, a room, a restroom) defined once, and placements of those units on floors.
 *
 * A unit type holds its own branch piping, fixture groups and checked fixtures, with local ids;
 * a placement puts one occurrence of it on a floor, connected at a node of the main tree (a
 * floor-main node), and may override a field of one of its segments or nodes. `expandBuilding`
 * turns the placements into ordinary nodes and segments before the analysis, so editing the type
 * changes every placement and an override is visible as data of its own.
 *
 * Unit nodes sit on the placement's floor at their `heightAboveFloor`; a unit segment's rise is
 * derived from its two nodes (never typed), so the climb is never entered twice.
 * Numbers are in the document's unit system (ft or m, psi or kPa, gpm or L/s).
 */
import { z } from 'zod';
import { CheckedFixtureSchema, CustomPipeSchema, FittingSchema, FixtureGroupSchema } from '../model/schema';

const id = () => z.string().min(1).max(200);
const label = () => z.string().min(1).max(200);

/** The local id of the connection point of a unit type: its inlet segment starts there. */
export const UNIT_INLET = 'inlet';

/**
 * Bounds: a unit type is one apartment, room or restroom — 200 segments is several times the
 * branch piping of the largest apartment or public restroom (common practice: a restroom core has
 * a few dozen fixtures); 2,000 unit types and 20,000 placements cover a 40-storey tower of
 * 20 units a floor many times over.
 */
export const BUILDING_BOUNDS = { unitSegments: 200, unitNodes: 201, unitTypes: 2_000, placements: 20_000 } as const;

export const UnitNodeSchema = z.strictObject({
  id: id().refine((v) => v !== UNIT_INLET, { message: `"${UNIT_INLET}" names the unit's connection point` }),
  label: label().optional(),
  heightAboveFloor: z.number().min(0).max(100).default(0).describe('Height above the floor, length unit.'),
  fixtureGroups: z.array(FixtureGroupSchema).max(50).default([]),
  checkedFixtures: z.array(CheckedFixtureSchema).max(50).default([]),
});

export const UnitSegmentSchema = z.strictObject({
  id: id(),
  label: label().optional(),
  from: id().describe(`Upstream node: "${UNIT_INLET}" (the placement's connection) or a node of the unit.`),
  to: id().describe('Downstream node of the unit.'),
  material: z.string().min(1).max(100).optional(),
  size: z.string().min(1).max(20).optional(),
  custom: CustomPipeSchema.optional(),
  length: z.number().positive().describe('Developed length, length unit.'),
  fittings: z.array(FittingSchema).max(100).default([]),
});

export const UnitTypeSchema = z.strictObject({
  id: id(),
  name: label(),
  nodes: z.array(UnitNodeSchema).min(1).max(BUILDING_BOUNDS.unitNodes),
  segments: z.array(UnitSegmentSchema).min(1).max(BUILDING_BOUNDS.unitSegments),
});

/** Fields a placement may change on one of its unit's segments or nodes. */
export const SegmentOverrideSchema = z.strictObject({
  length: z.number().positive().optional(),
  material: z.string().min(1).max(100).optional(),
  size: z.string().min(1).max(20).optional(),
  fittings: z.array(FittingSchema).max(100).optional(),
});
export const NodeOverrideSchema = z.strictObject({
  heightAboveFloor: z.number().min(0).max(100).optional(),
});

export const PlacementSchema = z.strictObject({
  id: id(),
  unitTypeId: id(),
  label: label().describe('The occurrence as the drawings name it, e.g. "Apt 704".'),
  floor: id().describe('Floor id.'),
  at: id().describe('Node of the main tree where the unit connects (its inlet segment starts there).'),
  overrides: z
    .strictObject({
      segments: z.record(z.string().max(200), SegmentOverrideSchema).optional(),
      nodes: z.record(z.string().max(200), NodeOverrideSchema).optional(),
    })
    .optional(),
});

export type UnitType = z.infer<typeof UnitTypeSchema>;
export type UnitTypeInput = z.input<typeof UnitTypeSchema>;
export type Placement = z.infer<typeof PlacementSchema>;
export type PlacementInput = z.input<typeof PlacementSchema>;
