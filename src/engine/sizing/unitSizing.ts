/**
 * Sizing inside typical units (sizeSystem.ts, "Typical units", explains the method and why it is
 * exact): the unit types' decided segments in classes of placements, the main tree with each
 * placement as a leaf, the search over the unit types' fronts, and the answer's rows.
 */
import type { StageResults } from '../analysis/results';
import type { MaterialId } from '../catalog/materials';
import { placedId } from '../building/expand';
import { UNIT_INLET, type SystemDocument } from '../model/schema';
import { worstFixtureOf, type FixtureRow, type ProbeSegment, type SegmentSizing } from './sizeSystem';
import { unitFront, type UnitFrontPoint, type UnitFrontSegment } from './unitFront';

/** Combinations of unit-type front points searched one by one; beyond it, coordinate descent (our choice of bound). */
const MAX_UNIT_COMBINATIONS = 256;
/** Placements of one class whose fixtures' slack offsets differ by more than this are split apart, Pa (round-off only). */
const OFFSET_TOLERANCE_PA = 1e-6;
/** Classes of placements per unit type searched apart; beyond, they are merged on the safe side (our choice of bound: the front's points grow with the classes). */
const MAX_UNIT_CLASSES = 8;

/**
 * How the options name a unit type's segment (one decision shared by every placement): the unit
 * type's id and the segment's local id, "<unit type id>/<segment id>".
 */
export const unitTypeSegmentKey = (unitTypeId: string, segmentId: string) => `${unitTypeId}/${segmentId}`;

/** A unit type's segment that the sizing decides: one size for all its copies. */
export interface UnitSeg {
  key: string;
  /** Index of its unit type in the document, and of the segment in the unit type. */
  type: number;
  local: number;
  material: MaterialId;
  /** Candidate sizes, ascending (after the velocity filter, once the probes have run). */
  sizes: string[];
  /** Pipe volume of all its copies at each size, m³. */
  volume: number[];
  velocityMet: boolean;
  velocityRemoved: boolean;
  /** The copies that take the unit type's size (placements overriding the size keep theirs). */
  copies: { placement: number; index: number; seg: ProbeSegment; deltaPa: number[] }[];
}

// ---- typical units (see the doc comment, "Typical units")

/** A unit type with at least one segment the sizing decides: its local tree, fixtures, placements and their classes. */
interface PlannedType {
  type: number;
  /** The decided segment at each local index (null: keeps its size). */
  segs: (UnitSeg | null)[];
  parentLocal: number[];
  /** The unit's checked fixtures: the local segment feeding the fixture's node, and its row index per placement (by position in `placements`). */
  fixtures: { feed: number; rows: number[] }[];
  placements: { q: number; inlet: number; cls: number; offsetPa: number }[];
  /** Per class: the extra loss table of each local segment in the class's placements (null: no decided copy). */
  classes: (number[] | null)[][];
  /** The classes were more than MAX_UNIT_CLASSES and merged into one (safe, not proven least). */
  merged: boolean;
}

interface UnitPlan {
  types: PlannedType[];
  /** Row of a unit fixture → where it sits: its planned type, its placement's copies by local index, its local path. */
  fixtureOf: Map<number, { st: number; copies: (UnitSeg['copies'][number] | null)[]; localPath: number[] }>;
}

function sameTable(a: readonly number[] | null, b: readonly number[] | null): boolean {
  if (a === null || b === null) return a === b;
  return a.length === b.length && a.every((x, i) => x === b[i]);
}

/**
 * The unit types to decide, with their placements put in classes: placements whose copies lose
 * alike and whose fixtures' slacks differ from the class's first placement's by one offset (within
 * OFFSET_TOLERANCE_PA; the least difference is taken, the safe side).
 */
export function unitPlan(input: {
  units: UnitSeg[];
  unitTypes: NonNullable<SystemDocument['unitTypes']>;
  placements: NonNullable<SystemDocument['placements']>;
  fixtures: FixtureRow[];
  slack: number[];
  segIndex: Map<string, number>;
}): UnitPlan {
  const { units, unitTypes, placements, fixtures, slack, segIndex } = input;
  const rowOf = new Map(fixtures.map((f, i) => [f.id, i]));
  const types: PlannedType[] = [];
  const fixtureOf: UnitPlan['fixtureOf'] = new Map();
  const byType = new Map<number, UnitSeg[]>();
  for (const u of units) byType.set(u.type, [...(byType.get(u.type) ?? []), u]);
  for (const [type, decided] of byType) {
    const t = unitTypes[type];
    const segs: (UnitSeg | null)[] = t.segments.map((_, local) => decided.find((u) => u.local === local) ?? null);
    const feedOf = new Map(t.segments.map((s, local) => [s.to, local]));
    const parentLocal = t.segments.map((s) => (s.from === UNIT_INLET ? -1 : feedOf.get(s.from)!));
    const inletLocal = parentLocal.indexOf(-1);
    const mine = placements.map((p, q) => ({ p, q })).filter(({ p }) => p.unitTypeId === t.id);
    const unitFixtures = t.nodes.flatMap((n) =>
      n.checkedFixtures.map((fx) => ({ feed: feedOf.get(n.id)!, rows: mine.map(({ p }) => rowOf.get(placedId(p.id, fx.id))!) })),
    );
    const tables = mine.map(({ q }) => segs.map((u) => (u ? (u.copies.find((c) => c.placement === q)?.deltaPa ?? null) : null)));
    const classes: (number[] | null)[][] = [];
    const reps: number[] = [];
    const planned: PlannedType['placements'] = mine.map(({ p, q }, j) => {
      let cls = -1;
      let offsetPa = 0;
      for (let k = 0; k < classes.length && cls === -1; k++) {
        if (!tables[j].every((tab, e) => sameTable(tab, classes[k][e]))) continue;
        const d = unitFixtures.map((f) => slack[f.rows[j]] - slack[f.rows[reps[k]]]);
        if (d.length && Math.max(...d) - Math.min(...d) > OFFSET_TOLERANCE_PA) continue;
        cls = k;
        offsetPa = d.length ? Math.min(...d) : 0;
      }
      if (cls === -1) {
        cls = classes.length;
        classes.push(tables[j]);
        reps.push(j);
      }
      return { q, inlet: segIndex.get(placedId(p.id, t.segments[inletLocal].id))!, cls, offsetPa };
    });
    // Too many classes: one class whose table is the largest extra loss of any, each placement at
    // its least offset from the first placement (every constraint kept or tightened: safe).
    let merged = false;
    if (classes.length > MAX_UNIT_CLASSES) {
      merged = true;
      const table = segs.map((u, e) => {
        if (!u) return null;
        const known = classes.map((c) => c[e]).filter((c): c is number[] => c !== null);
        // a placement whose copy keeps an overridden size has no extra loss there (0 joins the maximum)
        const fixedSomewhere = known.length < classes.length;
        return known.length ? u.sizes.map((_, k) => Math.max(...known.map((c) => c[k]), ...(fixedSomewhere ? [0] : []))) : null;
      });
      classes.splice(0, classes.length, table);
      planned.forEach((p, j) => {
        const d = unitFixtures.map((f) => slack[f.rows[j]] - slack[f.rows[reps[0]]]);
        p.cls = 0;
        p.offsetPa = d.length ? Math.min(...d) : 0;
      });
    }
    const st = types.length;
    types.push({ type, segs, parentLocal, fixtures: unitFixtures, placements: planned, classes, merged });
    for (const f of unitFixtures) {
      const localPath: number[] = [];
      for (let e = f.feed; e !== -1; e = parentLocal[e]) localPath.push(e);
      f.rows.forEach((row, j) => {
        const q = planned[j].q;
        fixtureOf.set(row, { st, copies: segs.map((u) => (u ? (u.copies.find((c) => c.placement === q) ?? null) : null)), localPath });
      });
    }
  }
  return { types, fixtureOf };
}

/** The main tree without the decided unit types' piping: their inlets leave `children` and `roots`; each placement is a leaf constraint. */
export function unitLeaves(input: {
  plan: UnitPlan;
  children: number[][];
  roots: number[];
  leafNeed: number[][];
  parentOf: Int32Array | number[];
  firstConstraint: number;
}) {
  const { plan, parentOf, firstConstraint } = input;
  const inlets = new Set(plan.types.flatMap((t) => t.placements.map((p) => p.inlet)));
  const children = input.children.map((c) => c.filter((e) => !inlets.has(e)));
  const roots = input.roots.filter((e) => !inlets.has(e));
  const leafNeed = input.leafNeed.map((l) => l.slice());
  /** Placements connected at the source itself: no main segment above them. */
  const atSource: number[] = [];
  let j = 0;
  for (const t of plan.types) {
    for (const p of t.placements) {
      const attach = parentOf[p.inlet];
      if (attach === -1) atSource.push(j);
      else leafNeed[attach].push(firstConstraint + j);
      j++;
    }
  }
  const order: number[] = [];
  const stack = [...roots];
  while (stack.length) {
    const e = stack.pop()!;
    order.push(e);
    for (const c of children[e]) stack.push(c);
  }
  return { children, roots, leafNeed, order, atSource };
}

/**
 * The search with typical units: each decided unit type's front (unitFront.ts), then the main
 * tree's search for each combination of front points, the cheapest total kept. Combinations are
 * taken by total unit volume ascending and stop once the main tree's least possible volume (its
 * search with every placement at the least need any point gives) plus the units' volume reaches
 * the best found; beyond MAX_UNIT_COMBINATIONS, coordinate descent over the types (not proven least).
 */
export function searchWithUnits(input: {
  plan: UnitPlan;
  adjusted: number[];
  atSource: readonly number[];
  main: (placementSlack: number[]) => Map<number, number> | null;
  mainVolume: (chosen: Map<number, number>) => number;
}): { chosen: Map<number, number>; unitPick: Map<UnitSeg, number>; proven: boolean } | null {
  const { plan, adjusted } = input;
  let proven = true;
  const fronts = plan.types.map((t) => {
    const classes = t.classes.length;
    const leafSlack = t.segs.map(() => new Float64Array(classes).fill(Infinity));
    for (const f of t.fixtures) {
      f.rows.forEach((row, j) => {
        const p = t.placements[j];
        leafSlack[f.feed][p.cls] = Math.min(leafSlack[f.feed][p.cls], adjusted[row] - p.offsetPa);
      });
    }
    const segments: UnitFrontSegment[] = t.segs.map((u, e) => ({
      parent: t.parentLocal[e],
      sized: u !== null,
      volume: u ? u.volume : [0],
      deltaPa: t.classes.map((c) => (u ? (c[e] ?? u.volume.map(() => 0)) : [0])),
    }));
    const front = unitFront(segments, leafSlack, classes);
    if (!front.whole || t.merged) proven = false;
    return front.points;
  });
  const placementSlack = (points: readonly UnitFrontPoint[]): number[] => {
    const out: number[] = [];
    plan.types.forEach((t, st) => t.placements.forEach((p) => out.push(p.offsetPa - points[st].need[p.cls])));
    return out;
  };
  const evaluate = (points: readonly UnitFrontPoint[]) => {
    const ps = placementSlack(points);
    // A placement at the source has no main segment above it: its unit alone must meet its fixtures.
    if (input.atSource.some((j) => !(ps[j] >= 0))) return null;
    const chosen = input.main(ps);
    if (!chosen) return null;
    return { chosen, cost: input.mainVolume(chosen) + points.reduce((sum, p) => sum + p.volume, 0) };
  };
  // The least need any point gives, per class: the main tree's search with it bounds every combination from below.
  const least = fronts.map((f, st) => {
    const need = new Float64Array(plan.types[st].classes.length).fill(Infinity);
    for (const p of f) p.need.forEach((v, c) => (need[c] = Math.min(need[c], v)));
    return { volume: 0, need, pick: new Int32Array(0) };
  });
  if (fronts.some((f) => f.length === 0)) return null;
  const bound = evaluate(least);
  if (!bound) return null;
  const lowerMain = bound.cost;
  let best: { chosen: Map<number, number>; cost: number; picks: number[] } | null = null;
  const tryPicks = (picks: number[]) => {
    const points = picks.map((k, st) => fronts[st][k]);
    const unitVolume = points.reduce((sum, p) => sum + p.volume, 0);
    if (best && lowerMain + unitVolume >= best.cost) return false;
    const r = evaluate(points);
    if (r && (!best || r.cost < best.cost)) best = { ...r, picks };
    return true;
  };
  const combinations = fronts.reduce((n, f) => n * f.length, 1);
  if (combinations <= MAX_UNIT_COMBINATIONS) {
    const all: number[][] = [[]];
    for (const f of fronts) {
      const next: number[][] = [];
      for (const a of all) for (let k = 0; k < f.length; k++) next.push([...a, k]);
      all.splice(0, all.length, ...next);
    }
    const volumeOf = (picks: number[]) => picks.reduce((sum, k, st) => sum + fronts[st][k].volume, 0);
    all.sort((a, b) => volumeOf(a) - volumeOf(b));
    for (const picks of all) if (!tryPicks(picks) && best) break;
  } else {
    proven = false;
    // Coordinate descent from every type's largest point (the least need of its front's volumes).
    tryPicks(fronts.map((f) => f.length - 1));
    for (let pass = 0; pass < 4 && best; pass++) {
      const before: number = (best as { cost: number }).cost;
      for (let st = 0; st < fronts.length; st++) {
        const current: number[] = (best as { picks: number[] }).picks;
        for (let k = 0; k < fronts[st].length; k++) tryPicks(current.map((x, i) => (i === st ? k : x)));
      }
      if ((best as { cost: number }).cost >= before) break;
    }
  }
  if (!best) return null;
  const found = best as { chosen: Map<number, number>; cost: number; picks: number[] };
  const unitPick = new Map<UnitSeg, number>();
  plan.types.forEach((t, st) => {
    const point = fronts[st][found.picks[st]];
    t.segs.forEach((u, e) => {
      if (u) unitPick.set(u, point.pick[e]);
    });
  });
  return { chosen: found.chosen, unitPick, proven };
}

/** The document with the unit types' decided segments at their chosen sizes. */
export function withUnitSizes(doc: SystemDocument, pick: Map<UnitSeg, number>): SystemDocument {
  if (pick.size === 0 || !doc.unitTypes) return doc;
  const unitTypes = doc.unitTypes.map((t) => ({ ...t, segments: t.segments.slice() }));
  for (const [u, k] of pick) {
    const s = unitTypes[u.type].segments[u.local];
    if (s.size !== u.sizes[k]) unitTypes[u.type].segments[u.local] = { ...s, size: u.sizes[k] };
  }
  return { ...doc, unitTypes };
}

/**
 * One row per segment of every placed unit type (its copies together): sizes before and after,
 * why, the highest velocity among its copies, the worst fixture below any copy, and how many
 * placements its size applies to (those that do not override it).
 */
export function describeUnits(input: {
  base: StageResults;
  segIndex: Map<string, number>;
  locked: Set<string>;
  fixtures: FixtureRow[];
  units: UnitSeg[];
  unitTypes: NonNullable<SystemDocument['unitTypes']>;
  placements: NonNullable<SystemDocument['placements']>;
  unitPick: Map<UnitSeg, number> | null;
  unitGoverning: Map<UnitSeg, number>;
  after: StageResults | null;
}): SegmentSizing[] {
  const { base, segIndex, locked, fixtures, units, unitTypes, placements, unitPick, unitGoverning, after } = input;
  const marginOf = (i: number) => (after ? after.checks.fixtures[i].marginPa : fixtures[i].margin);
  const rows: SegmentSizing[] = [];
  unitTypes.forEach((t, type) => {
    const mine = placements.filter((p) => p.unitTypeId === t.id);
    if (mine.length === 0) return;
    t.segments.forEach((s, local) => {
      const key = unitTypeSegmentKey(t.id, s.id);
      const u = units.find((x) => x.type === type && x.local === local);
      const copies = mine
        .filter((p) => p.overrides?.segments?.[s.id]?.size === undefined)
        .map((p) => segIndex.get(placedId(p.id, s.id)))
        .filter((e): e is number => e !== undefined);
      const copySet = new Set(copies);
      let w: number | undefined;
      fixtures.forEach((f, i) => {
        if (f.path.some((e) => copySet.has(e)) && (w === undefined || marginOf(i) < marginOf(w))) w = i;
      });
      const k = u && unitPick ? unitPick.get(u) : undefined;
      const g = u && k !== undefined && k > 0 ? unitGoverning.get(u) : undefined;
      const maxOf = (a: ArrayLike<number>) => (copies.length ? Math.max(...copies.map((e) => a[e])) : 0);
      rows.push({
        segmentId: key,
        label: `${t.name} · ${s.label ?? s.id}`,
        material: s.material ?? null,
        before: s.size ?? null,
        velocityBefore: maxOf(base.hyd.velocity),
        velocityAfter: after ? maxOf(after.hyd.velocity) : null,
        velocityLimit: copies.length ? base.checks.velocityLimitMs[copies[0]] : null,
        worstFixture: worstFixtureOf(fixtures, w, after),
        after: u && k !== undefined ? u.sizes[k] : (s.size ?? null),
        governing: locked.has(key)
          ? 'locked'
          : !u
            ? 'unchanged'
            : g !== undefined
              ? { fixtureId: fixtures[g].id, fixtureLabel: fixtures[g].label }
              : u.velocityRemoved
                ? 'velocity'
                : 'smallest',
        velocityMet: u ? u.velocityMet : copies.every((e) => base.checks.velocityPass[e] !== false),
        unitType: { id: t.id, name: t.name, segmentId: s.id, placements: copies.length },
      });
    });
  });
  return rows;
}
