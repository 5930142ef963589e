import type { SystemDocument } from '../../../engine';

/**
 * One truth for elevations while documents still carry both a node elevation and a segment rise
 * (schema version 1): a rise typed on a segment moves its downstream node — and every node fed
 * through it — so that elevation(to) = elevation(from) + rise. Without this a rise typed at the
 * pipe step left the new node at its parent's elevation, and the engine (which climbs by node
 * elevations) silently ignored the climb. Segments are taken from the source outward, so a rise
 * typed on a riser carries the branches above it along.
 */
export function followTypedRises(before: SystemDocument, after: SystemDocument): SystemDocument {
  const oldRise = new Map(before.segments.map((s) => [s.id, s.rise]));
  const changed = after.segments.filter((s) => s.rise !== undefined && Number.isFinite(s.rise) && (!oldRise.has(s.id) || oldRise.get(s.id) !== s.rise));
  if (changed.length === 0) return after;
  const children = new Map<string, string[]>();
  for (const s of after.segments) children.set(s.from, [...(children.get(s.from) ?? []), s.to]);
  const elevation = new Map(after.nodes.map((n) => [n.id, n.elevation]));
  // source outward: a segment's depth is its from-node's distance from the source
  const depth = new Map<string, number>([[after.source.nodeId, 0]]);
  const queue = [after.source.nodeId];
  while (queue.length) {
    const n = queue.shift()!;
    for (const c of children.get(n) ?? []) if (!depth.has(c)) {
      depth.set(c, (depth.get(n) ?? 0) + 1);
      queue.push(c);
    }
  }
  const ordered = [...changed].sort((a, b) => (depth.get(a.from) ?? 1e9) - (depth.get(b.from) ?? 1e9));
  for (const s of ordered) {
    const from = elevation.get(s.from);
    const to = elevation.get(s.to);
    if (from === undefined || to === undefined) continue;
    const delta = from + (s.rise as number) - to;
    if (delta === 0) continue;
    const seen = new Set<string>();
    const stack = [s.to];
    while (stack.length) {
      const n = stack.pop()!;
      if (seen.has(n) || n === after.source.nodeId) continue;
      seen.add(n);
      elevation.set(n, (elevation.get(n) ?? 0) + delta);
      stack.push(...(children.get(n) ?? []));
    }
  }
  return { ...after, nodes: after.nodes.map((n) => (elevation.get(n.id) === n.elevation ? n : { ...n, elevation: elevation.get(n.id)! })) };
}
