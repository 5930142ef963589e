/**
 * The one place the building page reads and writes the system document. Everything else on the
 * page works on the building module's own shapes (floors, unit types, placements, the riser
 * builder's output); when the document's format changes, only this file does.
 */
import { nodeElevations, type SystemDocument } from '../../../engine';
import type { Floor, GeneratedBuilding } from '../../../engine/building/riserBuilder';
import { PlacementSchema, type Placement, type UnitType } from '../../../engine/building/schema';

export interface BuildingData {
  floors: Floor[];
  unitTypes: UnitType[];
  placements: Placement[];
}

type Doc = SystemDocument;
type DocNode = Doc['nodes'][number];
type DocSegment = Doc['segments'][number];
type DocDevice = Doc['devices'][number];

/** A zone's PRV or booster as the document keeps it: no loss of its own until the designer enters the product's curve. */
function deviceOf(d: GeneratedBuilding['devices'][number]): DocDevice {
  const base = { id: d.id, label: d.label, segmentId: d.segmentId, loss: { kind: 'fixed' as const, loss: 0 } };
  return d.kind === 'prv'
    ? { ...base, kind: 'prv', prv: { setPressure: d.setPressure, falloffPerFlow: 0 } }
    : { ...base, kind: 'booster-pump', boost: { control: 'variable-speed', setPressure: d.setPressure } };
}

/** The floors, unit types and placements the document keeps (none in a document without them). */
export function readBuilding(doc: Doc): BuildingData {
  return { floors: doc.floors ?? [], unitTypes: doc.unitTypes ?? [], placements: doc.placements ?? [] };
}

/** A node's elevation in the document's length unit (absolute, on its floor, or by rises), or null when the document does not place it. */
export function nodeElevation(doc: Doc, nodeId: string): number | null {
  return nodeElevations(doc).get(nodeId) ?? null;
}

/** The segments, nodes and placements after a node (what "replace" takes away), in tree order. */
export function downstreamOf(doc: Doc, startNodeId: string): { segments: DocSegment[]; nodes: DocNode[]; placements: Placement[] } {
  const children = new Map<string, DocSegment[]>();
  for (const s of doc.segments) children.set(s.from, [...(children.get(s.from) ?? []), s]);
  const segments: DocSegment[] = [];
  const nodeIds = new Set<string>();
  const stack = [startNodeId];
  while (stack.length > 0) {
    for (const s of children.get(stack.pop()!) ?? []) {
      if (nodeIds.has(s.to)) continue;
      segments.push(s);
      nodeIds.add(s.to);
      stack.push(s.to);
    }
  }
  const placements = (doc.placements ?? []).filter((p) => p.at === startNodeId || nodeIds.has(p.at));
  return { segments, nodes: doc.nodes.filter((n) => nodeIds.has(n.id)), placements };
}

export interface GenerateOptions {
  startNodeId: string;
  /** replace: everything after the start node goes; append: the new riser joins what is there */
  mode: 'replace' | 'append';
}

/**
 * The draft with the generated building written in: one change. Riser and main nodes sit on
 * their floors (no rise is written: the floors give the climb); the units stay placements of
 * their types, which the analysis expands. The unit types of the building replace those of the
 * same id. Throws an Error with a plain message when the result would contradict itself (a floor
 * of the same name at another elevation, an id the draft already uses).
 */
export function writeGenerated(doc: Doc, built: GeneratedBuilding, unitTypes: readonly UnitType[], opts: GenerateOptions): Doc {
  const before = readBuilding(doc);
  const { floors, idOf } = mergeFloors(before.floors, built.floors);
  const removed = opts.mode === 'replace' ? downstreamOf(doc, opts.startNodeId) : { segments: [], nodes: [], placements: [] };
  const goneSegments = new Set(removed.segments.map((s) => s.id));
  const goneNodes = new Set(removed.nodes.map((n) => n.id));
  const gonePlacements = new Set(removed.placements.map((p) => p.id));
  const keptNodes = doc.nodes.filter((n) => !goneNodes.has(n.id));
  const keptPlacements = before.placements.filter((p) => !gonePlacements.has(p.id));
  const keptDevices = doc.devices.filter((d) => !goneSegments.has(d.segmentId));
  const clash =
    built.nodes.find((n) => keptNodes.some((k) => k.id === n.id)) ??
    built.placements.find((p) => keptPlacements.some((k) => k.id === p.id)) ??
    built.devices.find((d) => keptDevices.some((k) => k.id === d.id));
  if (clash) throw new Error(`The draft already has “${clash.label ?? clash.id}”: replace what follows the start point, or start the new riser elsewhere.`);
  const newNodes: DocNode[] = built.nodes.map((n) => ({
    id: n.id,
    label: n.label,
    floor: idOf(n.floor),
    heightAboveFloor: n.heightAboveFloor,
    fixtureGroups: [],
    checkedFixtures: [],
  }));
  const newSegments: DocSegment[] = built.segments.map((s) => ({ ...s, reducerAuto: true }));
  return {
    ...doc,
    floors,
    devices: [...keptDevices, ...built.devices.map(deviceOf)],
    nodes: [...keptNodes, ...newNodes],
    segments: [...doc.segments.filter((s) => !goneSegments.has(s.id)), ...newSegments],
    unitTypes: [...before.unitTypes.filter((t) => !unitTypes.some((u) => u.id === t.id)), ...unitTypes],
    placements: [...keptPlacements, ...built.placements.map((p) => PlacementSchema.parse({ ...p, floor: idOf(p.floor) }))],
  };
}

/**
 * The draft's floors with the generated ones joined: a generated floor is the draft's floor of the
 * same name (letter case and spaces aside), whatever id either has, so a draft whose floors came from
 * elsewhere (an import, another tool's ids) does not get a second "Level 3"; a generated floor whose
 * id the draft already gives to a floor of another name gets a fresh id. `idOf` maps a generated
 * floor id to the id it has in the result.
 */
function mergeFloors(existing: readonly Floor[], added: readonly Floor[]): { floors: Floor[]; idOf: (generatedId: string) => string } {
  const out = [...existing];
  const renamed = new Map<string, string>();
  const key = (name: string) => name.trim().replace(/\s+/g, ' ').toLowerCase();
  for (const f of added) {
    const same = out.find((e) => key(e.name) === key(f.name));
    if (same) {
      if (same.elevation !== f.elevation)
        throw new Error(`Floor “${f.name}” is at ${same.elevation} in the draft and at ${f.elevation} here: use one elevation.`);
      if (same.id !== f.id) renamed.set(f.id, same.id);
      continue;
    }
    const level = out.find((e) => e.elevation === f.elevation);
    if (level) throw new Error(`Floor “${f.name}” is at ${f.elevation}, where the draft has “${level.name}”: give it the draft's name, or another elevation.`);
    let id = f.id;
    for (let n = 2; out.some((e) => e.id === id); n++) id = `${f.id}-${n}`;
    if (id !== f.id) renamed.set(f.id, id);
    out.push({ ...f, id });
  }
  return { floors: out.sort((a, b) => a.elevation - b.elevation), idOf: (generatedId) => renamed.get(generatedId) ?? generatedId };
}

/** The draft with a unit type changed: every placement of it follows (the analysis expands them). */
export function writeUnitType(doc: Doc, type: UnitType): Doc {
  const types = doc.unitTypes ?? [];
  return { ...doc, unitTypes: types.some((t) => t.id === type.id) ? types.map((t) => (t.id === type.id ? type : t)) : [...types, type] };
}

/** The draft with one placement changed (its overrides). */
export function writePlacement(doc: Doc, placement: Placement): Doc {
  return { ...doc, placements: (doc.placements ?? []).map((p) => (p.id === placement.id ? placement : p)) };
}
