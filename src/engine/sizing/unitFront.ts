/**
 * The sizing of a typical unit's piping (sizeSystem.ts, "Typical units"): the Pareto front of one
 * unit type's own choices, exact by dynamic programming over the unit's tree.
 *
 * A unit type's segment is one decision shared by every placement. Placements whose copies lose
 * alike (the same extra loss per size on every segment: no length, fitting or size override) form
 * a class; the fixtures of every placement of a class keep slacks that differ from the class's
 * own by one number per placement (the placement's offset: the main tree and the floor), so one
 * need per class tells every placement of it. A point of the front is (volume of every copy,
 * need of each class): need_k = max over the unit's fixtures f of (Σ extra loss on f's path inside
 * the unit − s_{f,k}). Lower is better in every coordinate, so only undominated points can be the
 * answer's; the front keeps all of them (up to MAX_UNIT_POINTS, beyond which it is thinned and
 * no longer proven whole).
 */

/** Points kept per subtree of a unit before thinning (a bound on time and memory, our choice: two such sets combine in well under a second). */
const MAX_UNIT_POINTS = 500;

/** One segment of the unit type as the front reads it. */
export interface UnitFrontSegment {
  /** Local parent segment (−1: the inlet segment). */
  parent: number;
  /** Volume of every sized copy at each allowed size, m³ (one entry: the segment keeps its size). */
  volume: readonly number[];
  /** Extra loss per class at each allowed size, Pa: deltaPa[class][size]. */
  deltaPa: readonly (readonly number[])[];
  /** Whether the segment is decided here (false: fixed, one "size" with no extra loss or volume). */
  sized: boolean;
}

export interface UnitFrontPoint {
  volume: number;
  need: Float64Array;
  /** Size index of each local segment (0 for a fixed one). */
  pick: Int32Array;
}

export interface UnitFront {
  points: UnitFrontPoint[];
  /** false when a subtree's front was thinned (MAX_UNIT_POINTS): the answer is then not proven least. */
  whole: boolean;
}

/**
 * The front of one unit type. `leafSlack[e][class]` is the least slack s_{f,class} among the
 * unit's fixtures at the node segment e feeds (+∞ when none). Points are returned by volume ascending.
 */
export function unitFront(segments: readonly UnitFrontSegment[], leafSlack: readonly Float64Array[], classes: number): UnitFront {
  const n = segments.length;
  const children: number[][] = Array.from({ length: n }, () => []);
  let root = -1;
  for (let e = 0; e < n; e++) {
    if (segments[e].parent === -1) root = e;
    else children[segments[e].parent].push(e);
  }
  const order: number[] = [];
  const stack = [root];
  while (stack.length) {
    const e = stack.pop()!;
    order.push(e);
    stack.push(...children[e]);
  }
  let whole = true;
  const sets: UnitFrontPoint[][] = new Array(n);
  for (let k = order.length - 1; k >= 0; k--) {
    const e = order[k];
    const leaf = new Float64Array(classes);
    for (let c = 0; c < classes; c++) leaf[c] = -leafSlack[e][c];
    let acc: UnitFrontPoint[] = [{ volume: 0, need: leaf, pick: new Int32Array(n) }];
    for (const ch of children[e]) {
      const next: UnitFrontPoint[] = [];
      for (const a of acc) {
        for (const b of sets[ch]) {
          const need = new Float64Array(classes);
          for (let c = 0; c < classes; c++) need[c] = Math.max(a.need[c], b.need[c]);
          const pick = a.pick.slice();
          for (let j = 0; j < n; j++) if (b.pick[j] !== 0) pick[j] = b.pick[j];
          next.push({ volume: a.volume + b.volume, need, pick });
        }
      }
      acc = pruneFront(next);
      if (acc.length > MAX_UNIT_POINTS) {
        whole = false;
        acc = thin(acc);
      }
    }
    const seg = segments[e];
    const own: UnitFrontPoint[] = [];
    for (let s = 0; s < seg.volume.length; s++) {
      for (const a of acc) {
        const need = new Float64Array(classes);
        for (let c = 0; c < classes; c++) need[c] = a.need[c] + seg.deltaPa[c][s];
        const pick = a.pick.slice();
        pick[e] = s;
        own.push({ volume: a.volume + seg.volume[s], need, pick });
      }
    }
    let set = pruneFront(own);
    if (set.length > MAX_UNIT_POINTS) {
      whole = false;
      set = thin(set);
    }
    sets[e] = set;
  }
  return { points: sets[root], whole };
}

/** Undominated points (no other with volume ≤ and every need ≤), by volume ascending. */
function pruneFront(points: UnitFrontPoint[]): UnitFrontPoint[] {
  const sum = (p: UnitFrontPoint) => p.need.reduce((a, b) => a + b, 0);
  points.sort((a, b) => a.volume - b.volume || sum(a) - sum(b));
  const kept: UnitFrontPoint[] = [];
  const classes = points[0]?.need.length ?? 0;
  for (const p of points) {
    let dominated = false;
    for (const q of kept) {
      let all = true;
      for (let c = 0; c < classes && all; c++) if (q.need[c] > p.need[c]) all = false;
      if (all) {
        dominated = true;
        break;
      }
    }
    if (!dominated) kept.push(p);
  }
  return kept;
}

/** Every k-th point by volume, and the last (the least need of all): the front thinned to the bound. */
function thin(set: UnitFrontPoint[]): UnitFrontPoint[] {
  const step = Math.ceil(set.length / MAX_UNIT_POINTS);
  const out = set.filter((_, i) => i % step === 0);
  if (out.at(-1) !== set.at(-1)) out.push(set.at(-1)!);
  return out;
}
