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

// The bounds live in bounds.ts so that the element descriptions (elements.ts) can use them too.
export { DOCUMENT_BOUNDS } from './bounds';
import {
  BOOST,
  CHECKED_FIXTURE,
  CRITERIA,
  CUSTOM_FITTING,
  CUSTOM_FIXTURE,
  CUSTOM_PIPE,
  DEVICE,
  DEVICE_LOSS,
  EXPANSION_TANK,
  FED_FROM,
  FITTING,
  FIXTURE_GROUP,
  FLOOR,
  FLOW_TEST,
  NODE,
  PLACEMENT,
  RECIRCULATION,
  RECIRCULATION_SEGMENT,
  SEGMENT,
  SIZING_BASIS,
  SOURCE,
  SYSTEM_DOCUMENT,
  UNIT_TYPE,
} from './elements';
export { FED_FROM_CLOSING_MAX, UNIT_INLET } from './elements';

export const DemandCurveSchema = z.enum(['flush-tank', 'flush-valve']);

// Every element of the document is described once in elements.ts (keys, ranges, who may change
// them, labels and help); these are their zod schemas, derived from the descriptions.
export const FlowTestSchema = FLOW_TEST.schema;
export const FedFromSchema = FED_FROM.schema;
export const SourceSchema = SOURCE.schema;
export const DeviceLossSchema = DEVICE_LOSS.zod;
/** A booster pump by its control (constant speed, variable speed, or version 1's gain): see BOOST_CONSTANT_SPEED in elements.ts. */
export const BoostSchema = BOOST.zod;
export const DeviceSchema = DEVICE.schema;
export const CustomFixtureSchema = CUSTOM_FIXTURE.schema;
export const FixtureGroupSchema = FIXTURE_GROUP.schema;
export const CheckedFixtureSchema = CHECKED_FIXTURE.schema;
/** A named level of the building; nodes placed on it move with it. */
export const FloorSchema = FLOOR.schema;
/** A node (its position, fixture groups, checked fixtures). */
export const NodeSchema = NODE.schema;
export const CustomFittingSchema = CUSTOM_FITTING.zod;
export const FittingSchema = FITTING.schema;
export const CustomPipeSchema = CUSTOM_PIPE.schema;
export const SegmentSchema = SEGMENT.schema;
export const CriteriaOverridesSchema = CRITERIA.schema;
/** Typical units defined once and placed on floors (see UNIT_INLET in elements.ts), with their nodes and segments and a placement's overrides. */
export const UnitTypeSchema = UNIT_TYPE.schema;
export const PlacementSchema = PLACEMENT.schema;
export const ExpansionTankSchema = EXPANSION_TANK.schema;
export const RecirculationSegmentSchema = RECIRCULATION_SEGMENT.schema;
export const RecirculationSchema = RECIRCULATION.schema;
export const SizingBasisSchema = SIZING_BASIS.schema;
export const SystemDocumentSchema = SYSTEM_DOCUMENT.schema;

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
