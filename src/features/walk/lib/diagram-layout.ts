/**
 * Lays a tree out for the riser diagram: height by node elevation, branches side by side.
 * A node's children are ordered with the one that climbs most first; that one stays in the
 * node's column, so a riser draws as one straight vertical line and branches step out to the right.
 */
export interface LayoutInput {
  sourceNodeId: string;
  nodes: { id: string; elevation: number }[];
  segments: { id: string; from: string; to: string; rise: number }[];
}

export interface LayoutResult {
  column: Map<string, number>;
  columns: number;
  minElevation: number;
  maxElevation: number;
}

export function layoutTree(input: LayoutInput): LayoutResult {
  const children = new Map<string, { to: string; rise: number }[]>();
  for (const s of input.segments) {
    const list = children.get(s.from) ?? [];
    list.push({ to: s.to, rise: s.rise });
    children.set(s.from, list);
  }
  for (const list of children.values()) list.sort((a, b) => b.rise - a.rise);
  const column = new Map<string, number>();
  let next = 1;
  // pre-order: a node's first child keeps its column when it climbs (a riser stays one vertical
  // line); every other child (a branch running level, or a second riser) opens a new column
  const stack: { id: string; col: number }[] = [{ id: input.sourceNodeId, col: 0 }];
  while (stack.length) {
    const { id, col } = stack.pop()!;
    if (column.has(id)) continue;
    column.set(id, col);
    const kids = (children.get(id) ?? []).filter((k) => !column.has(k.to));
    const placed = kids.map((k, i) => ({ id: k.to, col: i === 0 && k.rise > 0 ? col : next++ }));
    for (let i = placed.length - 1; i >= 0; i--) stack.push(placed[i]);
  }
  for (const n of input.nodes) if (!column.has(n.id)) column.set(n.id, next++);
  const zs = input.nodes.map((n) => n.elevation);
  return { column, columns: Math.max(1, next), minElevation: Math.min(0, ...zs), maxElevation: Math.max(1, ...zs) };
}
