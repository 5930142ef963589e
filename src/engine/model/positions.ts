/**
 * Node elevations of a version 2 document as the analysis places them, for display and editing
 * (the client shows a derived rise read-only, and the elevation of a node placed by a rise).
 * A node is at its `elevation`, at its floor's elevation plus `heightAboveFloor`, or at its
 * upstream node's elevation plus its feed segment's `rise`; null where none of these reaches it
 * (no position and no rise, an unknown floor, or not connected to a placed node).
 * Pure and tolerant: works on a document in editing that may not pass validation.
 */
import type { SystemDocument } from './schema';

type PositionDoc = Pick<SystemDocument, 'nodes' | 'segments'> & { floors?: SystemDocument['floors'] };

export function nodeElevations(doc: PositionDoc): Map<string, number | null> {
  const floorZ = new Map<string, number>();
  for (const f of doc.floors ?? []) floorZ.set(f.id, f.elevation);
  const z = new Map<string, number | null>();
  for (const n of doc.nodes) {
    if (n.elevation !== undefined) z.set(n.id, n.elevation);
    else if (n.floor !== undefined) {
      const f = floorZ.get(n.floor);
      z.set(n.id, f === undefined ? null : f + (n.heightAboveFloor ?? 0));
    } else z.set(n.id, null);
  }
  // Rises place nodes downstream of placed ones; repeat until nothing changes (a tree settles in
  // at most its depth of passes; the pass count is bounded by the segment count for safety).
  const relative = doc.segments.filter((s) => s.rise !== undefined);
  const nodeById = new Map(doc.nodes.map((n) => [n.id, n]));
  for (let pass = 0; pass <= relative.length; pass++) {
    let changed = false;
    for (const s of relative) {
      const from = z.get(s.from);
      if (from === null || from === undefined || z.get(s.to) !== null) continue;
      const node = nodeById.get(s.to);
      if (!node || node.elevation !== undefined || node.floor !== undefined) continue;
      z.set(s.to, from + s.rise!);
      changed = true;
    }
    if (!changed) break;
  }
  return z;
}
