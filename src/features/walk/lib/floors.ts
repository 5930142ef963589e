/**
 * The floor-height helper of the elevation step: floor levels from the number of floors, a typical
 * floor-to-floor height and the ground floor's own height, on the datum of the node elevations.
 * Floor 1 is the ground floor; floor k is at groundLevel + groundHeight + (k − 2)·typicalHeight for
 * k ≥ 2. Every length is in the document's length unit.
 */
export interface FloorPlan {
  floors: number;
  /** floor-to-floor height of the floors above the ground floor */
  typicalHeight: number;
  /** floor-to-floor height from the ground floor to floor 2 (often taller: retail at grade); defaults to typicalHeight */
  groundHeight?: number;
  /** the ground floor's level on the datum (0 when the datum is the ground floor) */
  groundLevel: number;
  /** how far above its floor a node sits (fixture branches run at about the same height on every floor) */
  aboveFloor: number;
}

export function planProblems(p: FloorPlan): string[] {
  const problems: string[] = [];
  if (!Number.isInteger(p.floors) || p.floors < 1) problems.push('The number of floors must be a whole number, at least 1.');
  if (!(p.typicalHeight > 0)) problems.push('The typical floor-to-floor height must be more than zero.');
  if (p.groundHeight !== undefined && !(p.groundHeight > 0)) problems.push('The ground floor’s height must be more than zero.');
  if (!Number.isFinite(p.groundLevel)) problems.push('Give the ground floor’s level.');
  if (!Number.isFinite(p.aboveFloor)) problems.push('Give the height above the floor (0 for at the floor).');
  return problems;
}

/** The level of each floor, floor 1 first. */
export function floorLevels(p: FloorPlan): number[] {
  const ground = p.groundHeight ?? p.typicalHeight;
  return Array.from({ length: p.floors }, (_, i) => (i === 0 ? p.groundLevel : p.groundLevel + ground + (i - 1) * p.typicalHeight));
}

/** The floor (1-based) a node at `elevation` stands on: the highest floor level at or below it, 1 below the ground floor. */
export function floorOf(elevation: number, levels: readonly number[], aboveFloor = 0): number {
  // a hundredth of a length unit: rounding in typed elevations, not a real difference of level
  const slack = 0.01;
  let floor = 1;
  for (let k = 0; k < levels.length; k++) if (elevation - aboveFloor >= levels[k] - slack) floor = k + 1;
  return floor;
}

/**
 * Node elevations from their floors: each assigned node at its floor's level plus `aboveFloor`;
 * the connection at its own elevation; unassigned nodes keep theirs. Rounded to 6 decimals so a
 * sum of heights shows as typed (3 × 10.1 = 30.3, not 30.299999999999997).
 */
export function elevationsFromFloors(
  nodes: readonly { id: string; elevation: number }[],
  assignment: ReadonlyMap<string, number>,
  plan: FloorPlan,
  connection: { nodeId: string; elevation: number } | null,
): { id: string; elevation: number }[] {
  const levels = floorLevels(plan);
  return nodes.map((n) => {
    if (connection && n.id === connection.nodeId) return { id: n.id, elevation: connection.elevation };
    const floor = assignment.get(n.id);
    if (floor === undefined || floor < 1 || floor > levels.length) return { id: n.id, elevation: n.elevation };
    return { id: n.id, elevation: Number((levels[floor - 1] + plan.aboveFloor).toFixed(6)) };
  });
}
