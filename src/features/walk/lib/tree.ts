/** Tree helpers over a document's segments (from → to, away from the source). */
export interface Edge {
  id: string;
  from: string;
  to: string;
}

/**
 * Segment indices in pre-order from the source (each segment followed by the ones it feeds),
 * with their depth (1 for a segment leaving the source); segments the source cannot reach come
 * last at depth 1. Iterative, so a tall riser does not run out of call stack.
 */
export function treeOrder<T extends Edge>(segments: readonly T[], sourceNodeId: string): { index: number; depth: number }[] {
  const children = new Map<string, number[]>();
  segments.forEach((s, i) => {
    const list = children.get(s.from);
    if (list) list.push(i);
    else children.set(s.from, [i]);
  });
  const order: { index: number; depth: number }[] = [];
  const seen = new Set<number>();
  const stack: { index: number; depth: number }[] = [];
  const pushChildren = (node: string, depth: number) => {
    const kids = children.get(node) ?? [];
    for (let k = kids.length - 1; k >= 0; k--) if (!seen.has(kids[k])) stack.push({ index: kids[k], depth });
  };
  pushChildren(sourceNodeId, 1);
  while (stack.length) {
    const item = stack.pop()!;
    if (seen.has(item.index)) continue;
    seen.add(item.index);
    order.push(item);
    pushChildren(segments[item.index].to, item.depth + 1);
  }
  segments.forEach((_, i) => {
    if (!seen.has(i)) order.push({ index: i, depth: 1 });
  });
  return order;
}
