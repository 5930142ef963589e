import type { SystemDocument } from '../../../engine';

/**
 * One truth for elevations (document version 2): a rise typed on a segment places its downstream
 * node, so that node loses any absolute elevation or floor it had (elevation(to) = elevation(from)
 * + rise; the nodes placed relative to it move with it). Without this, a rise typed at the pipe
 * step would contradict the node's own position — a structural error the engine refuses.
 */
export function followTypedRises(before: SystemDocument, after: SystemDocument): SystemDocument {
  // every segment that carries a rise places its node: a rise and a position together would be a
  // contradiction (the engine's rise-and-elevation error), so the rise the user sees wins
  void before;
  const placed = new Set(after.segments.filter((s) => s.rise !== undefined && Number.isFinite(s.rise)).map((s) => s.to));
  if (placed.size === 0) return after;
  return {
    ...after,
    nodes: after.nodes.map((n) => {
      if (!placed.has(n.id) || n.id === after.source.nodeId) return n;
      if (n.elevation === undefined && n.floor === undefined && n.heightAboveFloor === undefined) return n;
      const { elevation: _e, floor: _f, heightAboveFloor: _h, ...rest } = n;
      return rest as SystemDocument['nodes'][number];
    }),
  };
}
