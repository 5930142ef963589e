/**
 * Placements of typical units → ordinary nodes and segments (pure).
 *
 * Each placement copies its unit type's nodes and segments with ids prefixed by the placement id
 * (`<placement>.<local id>`), so every element keeps one stable, readable id; labels read
 * "<placement label> · <local label>". The unit's "inlet" is the placement's `at` node. Unit
 * nodes sit on the placement's floor at their height above it; overrides replace single fields.
 * A unit segment's `sizeLocked` is carried to each copy, so the expanded document keeps the lock.
 * Checked fixtures are copied with the same prefix, so "Apt 704 · shower valve" is its own
 * checked fixture with its own verdict.
 */
import { EngineInputError } from '../errors';
import { UNIT_INLET, type Placement, type UnitType } from './schema';
import { DOCUMENT_BOUNDS } from '../model/schema';

/** The node and segment shapes the expansion writes (the system document's, schemaVersion 2). */
export interface ExpandedNode {
  id: string;
  label?: string;
  floor: string;
  heightAboveFloor: number;
  fixtureGroups: UnitType['nodes'][number]['fixtureGroups'];
  checkedFixtures: UnitType['nodes'][number]['checkedFixtures'];
}
export interface ExpandedSegment {
  id: string;
  label?: string;
  from: string;
  to: string;
  material?: string;
  size?: string;
  custom?: UnitType['segments'][number]['custom'];
  length: number;
  fittings: UnitType['segments'][number]['fittings'];
  reducerAuto: boolean;
  sizeLocked?: boolean;
}

export const placedId = (placementId: string, localId: string) => `${placementId}.${localId}`;

function buildingError(elementId: string, message: string): EngineInputError {
  return new EngineInputError({ code: 'schema-violation', elementType: 'system', elementId, field: null, message });
}

/**
 * The nodes and segments of every placement. `floorIds` and `treeNodeIds` are the document's own
 * floors and nodes (a placement must name one of each). Throws EngineInputError naming the
 * placement and field for a missing unit type, floor or connection node, or an override of an
 * element the unit type does not have.
 */
export function expandPlacements(
  unitTypes: readonly UnitType[],
  placements: readonly Placement[],
  floorIds: ReadonlySet<string>,
  treeNodeIds: ReadonlySet<string>,
): { nodes: ExpandedNode[]; segments: ExpandedSegment[] } {
  const types = new Map<string, UnitType>();
  for (const t of unitTypes) {
    if (types.has(t.id)) throw buildingError(t.id, `unit type "${t.id}": two unit types share this id`);
    checkUnitType(t);
    types.set(t.id, t);
  }
  // The expanded tree obeys the document's own bounds: placements × unit size may not exceed them.
  const perType = new Map(unitTypes.map((t) => [t.id, t.segments.length]));
  let expandedCount = treeNodeIds.size;
  for (const p of placements) expandedCount += perType.get(p.unitTypeId) ?? 0;
  if (expandedCount > DOCUMENT_BOUNDS.segments) {
    throw buildingError(
      'placements',
      `The placements expand to ${expandedCount} nodes and segments; a system holds at most ${DOCUMENT_BOUNDS.segments}. Split the building into systems (or zones).`,
    );
  }
  const nodes: ExpandedNode[] = [];
  const segments: ExpandedSegment[] = [];
  const seen = new Set<string>();
  for (const p of placements) {
    if (seen.has(p.id)) throw buildingError(p.id, `placement "${p.label}": two placements share the id "${p.id}"`);
    seen.add(p.id);
    const t = types.get(p.unitTypeId);
    if (!t) throw buildingError(p.id, `placement "${p.label}": unit type "${p.unitTypeId}" does not exist`);
    if (!floorIds.has(p.floor)) throw buildingError(p.id, `placement "${p.label}": floor "${p.floor}" does not exist`);
    if (!treeNodeIds.has(p.at)) throw buildingError(p.id, `placement "${p.label}": connection node "${p.at}" does not exist`);
    const segOverrides = p.overrides?.segments ?? {};
    const nodeOverrides = p.overrides?.nodes ?? {};
    for (const key of Object.keys(segOverrides)) {
      if (!t.segments.some((s) => s.id === key))
        throw buildingError(p.id, `placement "${p.label}": override of segment "${key}", which ${t.name} does not have`);
    }
    for (const key of Object.keys(nodeOverrides)) {
      if (!t.nodes.some((n) => n.id === key)) throw buildingError(p.id, `placement "${p.label}": override of node "${key}", which ${t.name} does not have`);
    }
    for (const n of t.nodes) {
      const o = nodeOverrides[n.id];
      nodes.push({
        id: placedId(p.id, n.id),
        label: `${p.label} · ${n.label ?? n.id}`,
        floor: p.floor,
        heightAboveFloor: o?.heightAboveFloor ?? n.heightAboveFloor,
        fixtureGroups: n.fixtureGroups,
        checkedFixtures: n.checkedFixtures.map((fx) => ({
          ...fx,
          id: placedId(p.id, fx.id),
          label: `${p.label} · ${fx.label ?? fx.id}`,
        })),
      });
    }
    for (const s of t.segments) {
      const o = segOverrides[s.id];
      const seg: ExpandedSegment = {
        id: placedId(p.id, s.id),
        label: `${p.label} · ${s.label ?? s.id}`,
        from: s.from === UNIT_INLET ? p.at : placedId(p.id, s.from),
        to: placedId(p.id, s.to),
        length: o?.length ?? s.length,
        fittings: o?.fittings ?? s.fittings,
        reducerAuto: true,
      };
      const material = o?.material ?? s.material;
      const size = o?.size ?? s.size;
      if (material !== undefined) seg.material = material;
      if (size !== undefined) seg.size = size;
      if (s.custom && o?.material === undefined && o?.size === undefined) seg.custom = s.custom;
      // The unit type's lock holds in every copy, on the size the copy has (a placement's override of the size wins).
      if (s.sizeLocked === true) seg.sizeLocked = true;
      segments.push(seg);
    }
  }
  return { nodes, segments };
}

/** A unit type is a tree hanging from its inlet: every node fed exactly once, every segment reachable. */
function checkUnitType(t: UnitType): void {
  const nodeIds = new Set<string>();
  for (const n of t.nodes) {
    if (nodeIds.has(n.id)) throw buildingError(t.id, `unit type "${t.name}": two nodes share the id "${n.id}"`);
    nodeIds.add(n.id);
  }
  const fed = new Set<string>();
  const segIds = new Set<string>();
  let inlets = 0;
  for (const s of t.segments) {
    if (segIds.has(s.id)) throw buildingError(t.id, `unit type "${t.name}": two segments share the id "${s.id}"`);
    segIds.add(s.id);
    if (s.from === UNIT_INLET) inlets++;
    else if (!nodeIds.has(s.from))
      throw buildingError(t.id, `unit type "${t.name}", segment "${s.label ?? s.id}": upstream node "${s.from}" is not in the unit`);
    if (!nodeIds.has(s.to)) throw buildingError(t.id, `unit type "${t.name}", segment "${s.label ?? s.id}": downstream node "${s.to}" is not in the unit`);
    if (fed.has(s.to)) throw buildingError(t.id, `unit type "${t.name}": node "${s.to}" is fed by two segments; a unit's piping is a tree`);
    fed.add(s.to);
  }
  if (inlets !== 1) throw buildingError(t.id, `unit type "${t.name}": exactly one segment must start at "${UNIT_INLET}" (found ${inlets})`);
  for (const n of t.nodes) {
    if (!fed.has(n.id)) throw buildingError(t.id, `unit type "${t.name}": node "${n.label ?? n.id}" is not fed by any segment`);
  }
  // Reachability from the inlet (catches a closed loop among the unit's own nodes).
  const children = new Map<string, string[]>();
  for (const s of t.segments) children.set(s.from, [...(children.get(s.from) ?? []), s.to]);
  const reached = new Set<string>();
  const stack = [UNIT_INLET];
  while (stack.length > 0) {
    const at = stack.pop()!;
    for (const c of children.get(at) ?? []) {
      if (!reached.has(c)) {
        reached.add(c);
        stack.push(c);
      }
    }
  }
  for (const n of t.nodes) {
    if (!reached.has(n.id)) throw buildingError(t.id, `unit type "${t.name}": node "${n.label ?? n.id}" cannot be reached from the inlet`);
  }
}

/** A document that may carry typical units (the fields the expansion reads and removes). */
export interface BuildingDocument {
  floors?: readonly { id: string }[];
  nodes: readonly { id: string }[];
  segments: readonly unknown[];
  unitTypes?: readonly UnitType[];
  placements?: readonly Placement[];
}

/**
 * The document with its placements expanded into ordinary nodes and segments, and without
 * `unitTypes` and `placements`: what the analysis reads. A document without placements is
 * returned as it is.
 */
export function expandBuilding<D extends BuildingDocument>(doc: D): Omit<D, 'unitTypes' | 'placements'> {
  if (!doc.placements?.length && !doc.unitTypes?.length) return doc;
  const { unitTypes = [], placements = [], ...rest } = doc;
  const floorIds = new Set((doc.floors ?? []).map((f) => f.id));
  const treeNodeIds = new Set(doc.nodes.map((n) => n.id));
  const placed = expandPlacements(unitTypes, placements, floorIds, treeNodeIds);
  return { ...rest, nodes: [...doc.nodes, ...placed.nodes], segments: [...doc.segments, ...placed.segments] } as Omit<D, 'unitTypes' | 'placements'>;
}
