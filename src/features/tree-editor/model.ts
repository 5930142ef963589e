/**
 * The tree editor's rows and edits, as plain functions of the document (no React): one row per
 * segment in tree order with what the row shows, the rows left visible by collapsed branches and
 * floors, and the edits a row or a selection makes.
 */
import { roundedFromSI } from '../../engine/building/convertUnits';
import type { CustomPipe, Device, Fitting, Segment, SegmentResult, SystemDocument } from '../../engine';
import { DeviceSchema } from '../../engine/model/schema';
import { MATERIALS } from '../../engine/catalog/materials';
import { fittingLabel } from '../../engine/model/labels';
import { treeOrder } from '../walk/lib/tree';
import { followTypedRises } from '../walk/lib/rises';

export interface TreeRow {
  id: string;
  /** position in document.segments */
  index: number;
  /** position in tree order */
  position: number;
  depth: number;
  name: string;
  fromName: string;
  toName: string;
  toId: string;
  /** whether the segment's end node sits on a floor (its rise then follows the floor, not a typed value) */
  toOnFloor: boolean;
  /** how many segments its subtree holds below it */
  below: number;
  floorId: string | null;
  floorLabel: string | null;
}

/** "2× 90° elbow, 1× tee, flow through the branch" — the fittings in a line. */
export function fittingsSummary(fittings: readonly Fitting[]): string {
  if (!fittings.length) return 'none';
  return fittings.map((f) => `${f.count}× ${fittingLabel(f)}`).join(', ');
}

/** The rows of the tree, in tree order (pre-order from the source), with the size of each subtree. */
export function treeRows(doc: SystemDocument): TreeRow[] {
  const order = treeOrder(doc.segments, doc.source.nodeId);
  const nodes = new Map(doc.nodes.map((n) => [n.id, n]));
  const floors = new Map((doc.floors ?? []).map((f) => [f.id, f]));
  const nameOf = (id: string) => nodes.get(id)?.label || id;
  const rows: TreeRow[] = order.map(({ index, depth }, position) => {
    const s = doc.segments[index];
    const toNode = nodes.get(s.to);
    const floorId = toNode?.floor ?? nodes.get(s.from)?.floor ?? null;
    const floor = floorId ? floors.get(floorId) : undefined;
    return {
      id: s.id,
      index,
      position,
      depth,
      name: s.label || s.id,
      fromName: nameOf(s.from),
      toName: nameOf(s.to),
      toId: s.to,
      toOnFloor: toNode?.floor !== undefined,
      below: 0,
      floorId,
      floorLabel: floor ? floor.name || floor.id : floorId,
    };
  });
  // pre-order: a row's subtree is the rows after it that are deeper than it
  // (one pass: a row leaving the stack hands its count and itself to the row under it)
  const stack: number[] = [];
  const close = () => {
    const k = stack.pop()!;
    if (stack.length) rows[stack[stack.length - 1]].below += rows[k].below + 1;
  };
  rows.forEach((r, i) => {
    while (stack.length && rows[stack[stack.length - 1]].depth >= r.depth) close();
    stack.push(i);
  });
  while (stack.length) close();
  return rows;
}

/** A line of the editor: a segment's row, or a floor's heading when grouped by floor. */
export type TreeLine =
  { kind: 'segment'; row: TreeRow; hiddenBelow: number } | { kind: 'floor'; floorId: string; label: string; count: number; collapsed: boolean };

/**
 * The lines left visible: a collapsed branch hides its subtree (its line says how many); grouped by
 * floor, each floor (in the document's floor order, then "no floor") is a heading whose segments
 * follow in tree order unless the floor is collapsed.
 */
export function visibleLines(
  rows: readonly TreeRow[],
  collapsed: ReadonlySet<string>,
  byFloor: { floors: readonly { id: string; name?: string }[]; collapsed: ReadonlySet<string> } | null,
): TreeLine[] {
  if (byFloor) {
    const NO_FLOOR = '';
    const groups = new Map<string, TreeRow[]>();
    for (const f of byFloor.floors) groups.set(f.id, []);
    groups.set(NO_FLOOR, []);
    for (const r of rows) (groups.get(r.floorId ?? NO_FLOOR) ?? groups.get(NO_FLOOR)!).push(r);
    const out: TreeLine[] = [];
    for (const [floorId, list] of groups) {
      if (!list.length) continue;
      const floor = byFloor.floors.find((f) => f.id === floorId);
      const isCollapsed = byFloor.collapsed.has(floorId);
      out.push({ kind: 'floor', floorId, label: floor ? floor.name || floor.id : 'Not on a floor', count: list.length, collapsed: isCollapsed });
      if (!isCollapsed) for (const row of list) out.push({ kind: 'segment', row, hiddenBelow: 0 });
    }
    return out;
  }
  const out: TreeLine[] = [];
  for (let i = 0; i < rows.length; i++) {
    const row = rows[i];
    const hide = collapsed.has(row.id) ? row.below : 0;
    out.push({ kind: 'segment', row, hiddenBelow: hide });
    i += hide;
  }
  return out;
}

/** The segment ids of a row's branch: the row and everything it feeds. */
export function branchIds(rows: readonly TreeRow[], id: string): string[] {
  const at = rows.findIndex((r) => r.id === id);
  if (at < 0) return [];
  return rows.slice(at, at + rows[at].below + 1).map((r) => r.id);
}

/** The segment ids between two rows (inclusive), in tree order: a shift-click. */
export function rangeIds(rows: readonly TreeRow[], a: string, b: string): string[] {
  const i = rows.findIndex((r) => r.id === a);
  const j = rows.findIndex((r) => r.id === b);
  if (i < 0 || j < 0) return [b];
  return rows.slice(Math.min(i, j), Math.max(i, j) + 1).map((r) => r.id);
}

// ---- edits: each returns the new document and leaves the rest of every segment as it was

function mapSegments(doc: SystemDocument, ids: Iterable<string>, change: (s: Segment) => Segment): SystemDocument {
  const set = new Set(ids);
  return { ...doc, segments: doc.segments.map((s) => (set.has(s.id) ? change(s) : s)) };
}

/** The sizes a catalog material offers. */
export function sizesOf(materialId: string | undefined): readonly string[] {
  const m = materialId ? MATERIALS[materialId as keyof typeof MATERIALS] : undefined;
  return m ? m.sizes.map((s) => s.key) : [];
}

/**
 * A catalog material on these segments: a size the new material also has is kept, another is
 * cleared (the row then asks for a size; the verdict says Incomplete until then), custom data dropped.
 */
export function setMaterial(doc: SystemDocument, ids: Iterable<string>, materialId: string): SystemDocument {
  const sizes = new Set(sizesOf(materialId));
  return mapSegments(doc, ids, (s) => {
    const { custom: _c, size, ...rest } = s;
    return { ...rest, material: materialId, ...(size !== undefined && sizes.has(size) ? { size } : {}) } as Segment;
  });
}

/** A size on these segments; a segment whose material has no such size is left as it is and counted. */
export function setSize(doc: SystemDocument, ids: Iterable<string>, size: string): { doc: SystemDocument; skipped: string[] } {
  const skipped: string[] = [];
  const next = mapSegments(doc, ids, (s) => {
    if (!sizesOf(s.material).includes(size)) {
      skipped.push(s.id);
      return s;
    }
    return { ...s, size };
  });
  return { doc: next, skipped };
}

/** A pipe given by its own data (a project material copied in) on these segments: no catalog reference. */
export function setCustomPipe(doc: SystemDocument, ids: Iterable<string>, pipe: CustomPipe): SystemDocument {
  return mapSegments(doc, ids, (s) => {
    const { material: _m, size: _s, ...rest } = s;
    return { ...rest, custom: { ...pipe } } as Segment;
  });
}

export function setLength(doc: SystemDocument, id: string, length: number): SystemDocument {
  return mapSegments(doc, [id], (s) => ({ ...s, length }));
}

/** A typed rise places the downstream node (document version 2: one truth for elevations). */
export function setRise(doc: SystemDocument, id: string, rise: number | undefined): SystemDocument {
  const next = mapSegments(doc, [id], (s) => {
    const { rise: _r, ...rest } = s;
    return rise === undefined ? (rest as Segment) : { ...rest, rise };
  });
  return followTypedRises(doc, next);
}

/** A fittings set on these segments: `replace` puts exactly this set, otherwise it is added to what each has. */
export function setFittings(doc: SystemDocument, ids: Iterable<string>, fittings: readonly Fitting[], replace: boolean): SystemDocument {
  return mapSegments(doc, ids, (s) => ({ ...s, fittings: replace ? fittings.map((f) => ({ ...f })) : [...s.fittings, ...fittings.map((f) => ({ ...f }))] }));
}

/** The loss a row shows: friction plus fittings, in the project's pressure unit. */
export const lossOf = (r: SegmentResult | undefined) => (r ? r.frictionLoss + r.fittingLoss : undefined);

/**
 * A device from a catalog template on a segment, as the devices step makes one: the template's
 * loss curve converted to the document's units, at the segment's inlet, after its devices.
 * Templates of a PRV or a booster need settings the template does not carry: not offered here.
 */
export function deviceFromTemplate(
  doc: SystemDocument,
  template: { id: string; label: string; data: { kind: string; points: readonly { flowM3s: number; lossPa: number }[] } },
  segmentId: string,
): Device | null {
  const kind = DeviceSchema.shape.kind.safeParse(template.data.kind);
  const k = kind.success ? kind.data : 'meter';
  if (k === 'prv' || k === 'booster-pump') return null;
  const taken = new Set(doc.devices.map((d) => d.id));
  let n = 1;
  while (taken.has(`${k}-${n}`)) n++;
  const sys = doc.unitSystem;
  return {
    id: `${k}-${n}`,
    kind: k,
    label: template.label,
    segmentId,
    loss: {
      kind: 'curve',
      points: template.data.points.map((p) => ({ flow: roundedFromSI('flow', p.flowM3s, sys), loss: roundedFromSI('pressure', p.lossPa, sys) })),
    },
  } as Device;
}
