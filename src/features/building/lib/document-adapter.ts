/**
 * The one place the building page reads and writes the system document. Everything else on the
 * page works on the building module's own shapes (floors, unit types, placements, the riser
 * builder's output); when the document's format changes, only this file does.
 */
import type { SystemDocument } from '../../../engine';
import { expandPlacements } from '../../../engine/building/expand';
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

/** The floors, unit types and placements the document keeps (none in a document without them). */
export function readBuilding(doc: Doc): BuildingData {
  const d = doc as Doc & Partial<BuildingData>;
  return { floors: d.floors ?? [], unitTypes: d.unitTypes ?? [], placements: d.placements ?? [] };
}

/** A node's elevation in the document's length unit, or null when the document does not give it. */
export function nodeElevation(doc: Doc, nodeId: string): number | null {
  const node = doc.nodes.find((n) => n.id === nodeId);
  return node && Number.isFinite(node.elevation) ? node.elevation : null;
}

/** The segments and nodes downstream of a node (what "replace" takes away), in tree order. */
export function downstreamOf(doc: Doc, startNodeId: string): { segments: DocSegment[]; nodes: DocNode[] } {
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
  return { segments, nodes: doc.nodes.filter((n) => nodeIds.has(n.id)) };
}

/** Every generated id (nodes, segments, placements) with a prefix, so a second riser can sit beside the first. */
export function prefixGenerated(built: GeneratedBuilding, prefix: string, startNodeId: string): GeneratedBuilding {
  const p = (id: string) => (id === startNodeId ? id : `${prefix}${id}`);
  return {
    floors: built.floors,
    nodes: built.nodes.map((n) => ({ ...n, id: p(n.id) })),
    segments: built.segments.map((s) => ({ ...s, id: p(s.id), from: p(s.from), to: p(s.to) })),
    placements: built.placements.map((pl) => ({ ...pl, id: p(pl.id), at: p(pl.at) })),
  };
}

export interface GenerateOptions {
  startNodeId: string;
  /** replace: everything after the start node goes; append: the new riser joins what is there */
  mode: 'replace' | 'append';
}

/**
 * The draft with the generated building written in: one change. The unit types of the building
 * replace those of the same id. Throws an Error with a plain message when the result would
 * contradict itself (a floor of the same name at another elevation).
 */
export function writeGenerated(doc: Doc, built: GeneratedBuilding, unitTypes: readonly UnitType[], opts: GenerateOptions): Doc {
  const before = readBuilding(doc);
  const floors = mergeFloors(before.floors, built.floors);
  const removed = opts.mode === 'replace' ? downstreamOf(doc, opts.startNodeId) : { segments: [], nodes: [] };
  const goneSegments = new Set(removed.segments.map((s) => s.id));
  const goneNodes = new Set(removed.nodes.map((n) => n.id));
  const types = [...before.unitTypes.filter((t) => !unitTypes.some((u) => u.id === t.id)), ...unitTypes];
  const placements = [...before.placements.filter((p) => !goneNodes.has(p.at)), ...built.placements.map((p) => PlacementSchema.parse(p))];
  const floorElevation = new Map(floors.map((f) => [f.id, f.elevation]));
  // This document format keeps absolute node elevations and no placements: the building is
  // written out as ordinary nodes and segments (its floors fix every elevation).
  const placed = expandPlacements(types, placements, new Set(floors.map((f) => f.id)), new Set([...doc.nodes.map((n) => n.id), ...built.nodes.map((n) => n.id)]));
  const newNodes: DocNode[] = [...built.nodes, ...placed.nodes].map((n) => ({
    id: n.id,
    label: n.label,
    elevation: floorElevation.get(n.floor)! + n.heightAboveFloor,
    fixtureGroups: 'fixtureGroups' in n ? n.fixtureGroups : [],
    checkedFixtures: 'checkedFixtures' in n ? n.checkedFixtures : [],
  }));
  const newSegments: DocSegment[] = [...built.segments, ...placed.segments].map((s) => ({ ...s, reducerAuto: true }) as DocSegment);
  const keptNodes = doc.nodes.filter((n) => !goneNodes.has(n.id));
  const clash = newNodes.find((n) => keptNodes.some((k) => k.id === n.id));
  if (clash) throw new Error(`The draft already has a point “${clash.label ?? clash.id}”: replace what follows the start point, or start the new riser elsewhere.`);
  return {
    ...doc,
    devices: doc.devices.filter((d) => !goneSegments.has(d.segmentId)),
    nodes: [...keptNodes, ...newNodes],
    segments: [...doc.segments.filter((s) => !goneSegments.has(s.id)), ...newSegments],
  };
}

function mergeFloors(existing: readonly Floor[], added: readonly Floor[]): Floor[] {
  const out = [...existing];
  for (const f of added) {
    const same = out.find((e) => e.id === f.id);
    if (!same) out.push(f);
    else if (same.elevation !== f.elevation) throw new Error(`Floor “${f.name}” is at ${same.elevation} in the draft and at ${f.elevation} here: use one elevation.`);
  }
  return out.sort((a, b) => a.elevation - b.elevation);
}

/** The draft with a unit type changed (every placement of it follows). */
export function writeUnitType(doc: Doc, type: UnitType): Doc {
  void type;
  return doc;
}

/** The draft with one placement changed (its overrides). */
export function writePlacement(doc: Doc, placement: Placement): Doc {
  void placement;
  return doc;
}
