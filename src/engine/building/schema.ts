/**
 * Typical units and their placements: the schemas live with the system document
 * (src/engine/model/schema.ts); this module re-exports them for the building tools.
 */
export { UNIT_INLET, UnitTypeSchema, PlacementSchema, type UnitType, type UnitTypeInput, type Placement, type PlacementInput } from '../model/schema';
