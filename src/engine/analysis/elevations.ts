/**
 * Stage 3b: elevations (document version 2). A node placed by an elevation or a floor keeps it
 * (input.ts); any other node is placed by its feed segment's rise, z(to) = z(from) + rise, walking
 * the tree from the source so every upstream node is placed first.
 *
 * A node with neither a position nor a rise on its feed segment is not an error: the verdict is
 * incomplete (`node-elevation-missing`), and to keep every number finite the node is computed at
 * its upstream node's elevation (a level run), which the reason says. A source without an
 * elevation or floor is computed at elevation 0 (`source-elevation-missing`). Nodes below an
 * unplaced node are computed relative to that assumption and are not reported again.
 */
import type { SiModel } from './input';
import type { Topology } from './topology';

export interface ElevationResult {
  /** Rise of each segment used by the hydraulics: the typed rise, or z(to) − z(from) of two placed nodes. */
  riseM: Float64Array;
  /** Nodes with no position and no rise on the feed segment: the node index and its feed segment index. */
  missing: { nodeIdx: number; segIdx: number }[];
  /** True when the source node has neither an elevation nor a floor. */
  sourceMissing: boolean;
}

export function resolveElevations(model: SiModel, topo: Topology): ElevationResult {
  const z = model.elevationM;
  const { from, to, riseEnteredM } = model.seg;
  const riseM = new Float64Array(model.seg.count);
  const missing: ElevationResult['missing'] = [];
  const src = model.source.nodeIdx;
  const sourceMissing = model.placed[src] === 0;
  if (sourceMissing) z[src] = 0;
  for (let k = 0; k < topo.order.length; k++) {
    const s = topo.order[k];
    const a = from[s];
    const b = to[s];
    const entered = riseEnteredM[s];
    if (model.placed[b] === 1) {
      riseM[s] = z[b] - z[a];
    } else if (!Number.isNaN(entered)) {
      riseM[s] = entered;
      z[b] = z[a] + entered;
    } else {
      riseM[s] = 0;
      z[b] = z[a];
      missing.push({ nodeIdx: b, segIdx: s });
    }
  }
  // Nodes not reached from the source (verdict incomplete, topology.ts) and not placed: at the
  // source's elevation, so that every number stays finite.
  for (const n of topo.unreachedNodes) if (model.placed[n] === 0) z[n] = z[src];
  return { riseM, missing, sourceMissing };
}
