/**
 * Stage 3: topology. The segments must form a tree rooted at the source node, each segment
 * running from upstream (`from`) to downstream (`to`). Produces parent pointers and one
 * breadth-first order of the segments (every segment after the one feeding it), so that the
 * later stages are single linear passes: forward for pressures, backward for demand.
 *
 * A loop is an error (the analysis is for trees). Parts of the tree that do not reach the source
 * (a segment whose upstream end has no feed, a node no segment reaches) are not errors: they are
 * left out of `order` and listed, and the verdict is incomplete (report.ts) — a drawing in
 * progress is described, not wrong.
 */
import { inputError } from '../errors';
import type { SiModel } from './input';

export interface Topology {
  /** Segment index feeding each node; −1 for the source (and only the source). */
  feedSeg: Int32Array;
  /** Segment indices reached from the source, each after the segment feeding its upstream node. */
  order: Int32Array;
  /** Nodes not reached from the source (no chain of segments from it), in document order. */
  unreachedNodes: number[];
  /** Segments not reached from the source, in document order. */
  unreachedSegments: number[];
  /** Segment index feeding each segment's upstream node; −1 for segments leaving the source. */
  parentSeg: Int32Array;
  /**
   * Segments leaving each node, as one compressed list: those of node n are
   * childSegs[childStart[n]] … childSegs[childStart[n + 1] − 1], in document order.
   */
  childStart: Int32Array;
  childSegs: Int32Array;
}

export function buildTopology(model: SiModel): Topology {
  const nNodes = model.nodeIds.length;
  const { from: segFrom, to: segTo, id: segId } = model.seg;
  const nSegs = model.seg.count;
  const source = model.source.nodeIdx;
  const feedSeg = new Int32Array(nNodes).fill(-1);

  for (let s = 0; s < nSegs; s++) {
    const to = segTo[s];
    if (segFrom[s] === to) throw inputError('self-loop', 'segment', segId[s], 'to');
    if (to === source) throw inputError('source-has-feed', 'segment', segId[s], 'to');
    const existing = feedSeg[to];
    if (existing !== -1) {
      throw inputError(
        'multiple-feeds',
        'node',
        model.nodeIds[to],
        null,
        `node is fed by segments "${segId[existing]}" and "${segId[s]}"; Headroom analyses trees only (segments run from the source outward)`,
      );
    }
    feedSeg[to] = s;
  }

  // Children of each node as a compressed adjacency list (counting sort by `from`).
  const childStart = new Int32Array(nNodes + 1);
  for (let s = 0; s < nSegs; s++) childStart[segFrom[s] + 1]++;
  for (let i = 0; i < nNodes; i++) childStart[i + 1] += childStart[i];
  const fill = childStart.slice(0, nNodes);
  const children = new Int32Array(nSegs);
  for (let s = 0; s < nSegs; s++) children[fill[segFrom[s]]++] = s;

  // Breadth-first from the source.
  const order = new Int32Array(nSegs);
  const reached = new Uint8Array(nNodes);
  reached[source] = 1;
  let head = 0;
  let tail = 0;
  for (let c = childStart[source]; c < childStart[source + 1]; c++) order[tail++] = children[c];
  while (head < tail) {
    const s = order[head++];
    const to = segTo[s];
    reached[to] = 1;
    for (let c = childStart[to]; c < childStart[to + 1]; c++) order[tail++] = children[c];
  }

  const unreachedSegments: number[] = [];
  if (tail < nSegs) {
    // Some segments were not reached: each node has one feed at most, so walking up the feeds
    // from an unreached segment either closes a loop (a cycle) or stops at a node with no feed.
    const inOrder = new Uint8Array(nSegs);
    for (let k = 0; k < tail; k++) inOrder[order[k]] = 1;
    for (let s = 0; s < nSegs; s++) {
      if (inOrder[s]) continue;
      const seen = new Set<number>();
      let node = segFrom[s];
      while (feedSeg[node] !== -1 && !seen.has(node)) {
        seen.add(node);
        node = segFrom[feedSeg[node]];
      }
      if (seen.has(node)) {
        throw inputError(
          'cycle',
          'segment',
          segId[feedSeg[node]],
          null,
          `segments form a closed loop through node "${model.nodeIds[node]}"; Headroom analyses trees only`,
        );
      }
      unreachedSegments.push(s);
    }
  }
  const unreachedNodes: number[] = [];
  for (let i = 0; i < nNodes; i++) if (!reached[i]) unreachedNodes.push(i);

  const parentSeg = new Int32Array(nSegs);
  for (let s = 0; s < nSegs; s++) parentSeg[s] = feedSeg[segFrom[s]];
  return { feedSeg, order: tail < nSegs ? order.slice(0, tail) : order, parentSeg, unreachedNodes, unreachedSegments, childStart, childSegs: children };
}
