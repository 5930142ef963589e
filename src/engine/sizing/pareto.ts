/**
 * Pareto sets of (cost, need) pairs for the sizing search (sizeSystem.ts): lower cost is
 * better, lower need is better. A set is kept sorted by cost ascending with need strictly
 * descending, so that no point is dominated.
 */

export interface ParetoPoint {
  cost: number;
  /** Largest excess of extra loss over a fixture's pressure slack among the fixtures below (Pa); −∞ when none. */
  need: number;
  /** Back-pointer to rebuild the chosen sizes: the own choice and the children's points. */
  choice: number;
  /** Index of the segment whose size is `choice`, or −1 for a point that only combines its parts. */
  seg: number;
  parts: readonly ParetoPoint[];
}

/** Removes dominated points (keeps, for each cost, the smallest need, and only needs that fall as cost rises). */
export function prune(points: ParetoPoint[]): ParetoPoint[] {
  points.sort((a, b) => a.cost - b.cost || a.need - b.need);
  const out: ParetoPoint[] = [];
  for (const p of points) {
    if (out.length === 0 || p.need < out[out.length - 1].need) out.push(p);
  }
  return out;
}

/**
 * Combines two independent subtrees hanging below one node: the cost adds, the need is the
 * larger of the two (every fixture of both must be met). For each threshold t taken from either
 * set, the cheapest combination with need ≤ t is the cheapest point of each set with need ≤ t;
 * scanning the thresholds in falling order gives the whole Pareto set in O(|a| + |b|).
 */
export function combine(a: readonly ParetoPoint[], b: readonly ParetoPoint[]): ParetoPoint[] {
  const thresholds = [...new Set([...a.map((p) => p.need), ...b.map((p) => p.need)])].sort((x, y) => y - x);
  const out: ParetoPoint[] = [];
  let i = 0;
  let j = 0;
  for (const t of thresholds) {
    // Both sets are sorted by need descending: advance to the cheapest point with need ≤ t.
    while (i < a.length && a[i].need > t) i++;
    while (j < b.length && b[j].need > t) j++;
    if (i === a.length || j === b.length) break;
    out.push({ cost: a[i].cost + b[j].cost, need: Math.max(a[i].need, b[j].need), choice: -1, seg: -1, parts: [a[i], b[j]] });
  }
  return prune(out);
}
