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
