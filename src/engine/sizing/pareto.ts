/**
 * Pareto sets of (cost, need) pairs for the sizing search (sizeSystem.ts): lower cost is
 * better, lower need is better. A set is a list of point numbers kept sorted by cost ascending
 * with need strictly descending, so that no point is dominated.
 *
 * The points themselves live in one store of flat arrays per search (ParetoStore): a building
 * of 5,000 segments makes hundreds of thousands of points, and numbers in typed arrays cost the
 * garbage collector nothing, where as many small objects cost more than the search itself.
 */

/** The points of one search: point p is (cost[p], need[p]) with its back-pointers. */
export class ParetoStore {
  cost: Float64Array;
  /** Largest excess of extra loss over a fixture's pressure slack among the fixtures below (Pa); −∞ when none. */
  need: Float64Array;
  /** Index of the segment whose size is `choice`, or −1 for a point that only combines its parts. */
  seg: Int32Array;
  /** The own choice: the size index of `seg`. */
  choice: Int32Array;
  /** Back-pointers to rebuild the chosen sizes: up to two parts (−1: none). */
  left: Int32Array;
  right: Int32Array;
  count = 0;

  constructor(capacity = 1024) {
    this.cost = new Float64Array(capacity);
    this.need = new Float64Array(capacity);
    this.seg = new Int32Array(capacity);
    this.choice = new Int32Array(capacity);
    this.left = new Int32Array(capacity);
    this.right = new Int32Array(capacity);
  }

  add(cost: number, need: number, seg: number, choice: number, left: number, right: number): number {
    if (this.count === this.cost.length) this.grow();
    const p = this.count++;
    this.cost[p] = cost;
    this.need[p] = need;
    this.seg[p] = seg;
    this.choice[p] = choice;
    this.left[p] = left;
    this.right[p] = right;
    return p;
  }

  private grow(): void {
    const n = this.cost.length * 2;
    const floats = (a: Float64Array) => {
      const b = new Float64Array(n);
      b.set(a);
      return b;
    };
    const ints = (a: Int32Array) => {
      const b = new Int32Array(n);
      b.set(a);
      return b;
    };
    this.cost = floats(this.cost);
    this.need = floats(this.need);
    this.seg = ints(this.seg);
    this.choice = ints(this.choice);
    this.left = ints(this.left);
    this.right = ints(this.right);
  }
}

/**
 * Removes dominated points (keeps, for each cost, the smallest need, and only needs that fall as
 * cost rises). The sort is stable: among equal points the first listed is kept.
 */
export function prune(store: ParetoStore, points: number[]): number[] {
  const { cost, need } = store;
  points.sort((a, b) => cost[a] - cost[b] || need[a] - need[b]);
  const out: number[] = [];
  let last = Infinity;
  for (const p of points) {
    if (out.length === 0 || need[p] < last) {
      out.push(p);
      last = need[p];
    }
  }
  return out;
}

/**
 * Combines two independent subtrees hanging below one node: the cost adds, the need is the
 * larger of the two (every fixture of both must be met). For each threshold t taken from either
 * set, the cheapest combination with need ≤ t is the cheapest point of each set with need ≤ t;
 * scanning the thresholds in falling order (both sets list their needs falling, so a merge of
 * the two lists gives them) gives the whole Pareto set in O(|a| + |b|).
 */
export function combine(store: ParetoStore, a: readonly number[], b: readonly number[]): number[] {
  // The points of a and b exist before any is added here, so the arrays read now (the store may
  // grow into new ones while adding) still hold them.
  const { cost, need } = store;
  const out: number[] = [];
  let i = 0;
  let j = 0;
  // The next threshold of each set (equal values taken once).
  let ta = 0;
  let tb = 0;
  let lastI = -1;
  let lastJ = -1;
  while (ta < a.length || tb < b.length) {
    let t: number;
    if (tb >= b.length) t = need[a[ta]];
    else if (ta >= a.length) t = need[b[tb]];
    else t = Math.max(need[a[ta]], need[b[tb]]);
    while (ta < a.length && need[a[ta]] >= t) ta++;
    while (tb < b.length && need[b[tb]] >= t) tb++;
    // Both sets are sorted by need descending: advance to the cheapest point with need ≤ t.
    while (i < a.length && need[a[i]] > t) i++;
    while (j < b.length && need[b[j]] > t) j++;
    if (i === a.length || j === b.length) break;
    // The same pair again would add only a copy that pruning drops.
    if (i === lastI && j === lastJ) continue;
    lastI = i;
    lastJ = j;
    const p = a[i];
    const q = b[j];
    out.push(store.add(cost[p] + cost[q], Math.max(need[p], need[q]), -1, -1, p, q));
  }
  return prune(store, out);
}
