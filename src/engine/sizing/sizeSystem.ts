/**
 * Automatic sizing: the smallest catalog size of each segment's own material such that every
 * velocity is within its limit and every checked fixture keeps its minimum flow pressure plus a
 * margin, on the supply's minimum (design) pressure — the job the "pressure available for
 * friction" procedure of the model codes does by hand (IPC Appendix E, E103; UPC Appendix A,
 * A 104), done here with the engine's own analysis.
 *
 * What "smallest" means: among all size assignments of the segments that may change (each from
 * its material's catalog sizes, or the sizes the caller allows) that meet every velocity limit and
 * every fixture, the one with the least total pipe volume Σ length·π·d²/4 (inside diameter d).
 * Volume is the measure because it grows with every size step of every segment, weighted by
 * length, the way material and water held in the pipe do; ties are broken arbitrarily.
 *
 * The method, and why it is exact on a tree:
 *   1. One analysis of the document gives every segment's design flow. In a tree the design flow
 *      comes from the fixture units downstream, not from the sizes, so it is fixed.
 *   2. Probe analyses (one per size position, on a copy of the main tree with every segment's flow
 *      fixed by `flowOverride`, so no demand is recomputed) give each segment's friction and
 *      fitting loss L_e(s) and velocity at every candidate size s. The velocity limit removes the
 *      sizes below the smallest that meets it (a velocity only falls as the size grows).
 *   3. A fixture f's residual changes with the sizes only through the losses of the segments on
 *      its path: residual_f(S) = residual_f(S0) − Σ_{e ∈ path f} (L_e(s_e) − L_e(s0_e)). So f passes
 *      iff Σ ΔL_e ≤ slack_f = residual_f(S0) − required_f − margin: one linear constraint per
 *      fixture over a root-to-leaf path. A PRV or a variable-speed booster holds its outlet
 *      pressure, so a path is cut there: only the segments from the device's segment down count.
 *   4. Minimising a sum of per-segment costs under path constraints on a tree is solved exactly
 *      by dynamic programming from the leaves up: each subtree keeps its Pareto set of (volume,
 *      need), need being the largest Σ ΔL − slack over its fixtures; sibling sets combine by
 *      adding volume and taking the larger need (pareto.ts), and a segment adds each of its sizes.
 *      Points that no choice above can rescue are dropped; points that every choice above keeps
 *      feasible are merged into the cheapest. The root keeps the cheapest point with need ≤ 0.
 *   5. One analysis of the sized document verifies it. The model leaves out the sudden expansion
 *      or contraction loss where sizes change (reducerAuto), which depends on two neighbours' sizes;
 *      if the verification finds a fixture short by that amount, its slack is reduced by the
 *      shortfall (times REPAIR_FACTOR) and step 4 repeats (at most MAX_REPAIRS times); the answer is
 *      then a safe, not necessarily the least, choice where sizes change along a path.
 * On a tree without size-change losses the answer is therefore the exact minimum (proved by the
 * exhaustive-search test in tests/engine/sizing). When no choice passes, the result says by how
 * much (every free segment at its largest size) and what a booster at the source must add.
 *
 * Scope: the segments of the main tree that have a catalog material and size. Segments inside
 * typical units (placements) and custom pipes keep their size (they are sized in the unit type).
 */
import { analyzeValidated } from '../analysis/analyze';
import { parseDocument } from '../analysis/input';
import type { Analysis } from '../analysis/types';
import { MATERIALS, type MaterialId } from '../catalog/materials';
import type { SystemDocument } from '../model/schema';
import { combine, prune, type ParetoPoint } from './pareto';

/** Repairs of the size-change losses the model leaves out (step 5). */
const MAX_REPAIRS = 3;
/** A repair asks for 1.5 × the shortfall plus 10 Pa (about 0.0015 psi): a tuning choice of this engine, not a published value, chosen to converge in one or two rounds. */
const REPAIR_FACTOR = 1.5;
const REPAIR_ALLOWANCE_PA = 10;
/** Twins per probe analysis: within the document bound on segments with room for the main tree. */
const PROBE_SEGMENTS = 10_000;
/** Velocities equal to the limit within round-off pass (as the analysis's check does). */
const VELOCITY_RTOL = 1e-9;

export interface SizingOptions {
  /** Pressure each checked fixture must keep above its minimum, Pa (default 0). */
  marginPa?: number;
  /** Segments that keep their size. */
  lockedSegmentIds?: readonly string[];
  /** Only these segments may change (a selection, or a contractor's field change); default all. */
  segmentIds?: readonly string[];
  /** Size keys a segment may take (default: every size of its material's catalog). */
  candidateSizes?: Readonly<Record<string, readonly string[]>>;
}

export type Governing = 'velocity' | { fixtureId: string } | 'locked' | 'unchanged';

export interface SegmentSizing {
  segmentId: string;
  label: string | null;
  material: string | null;
  before: string | null;
  after: string | null;
  governing: Governing;
  /** false when even the largest allowed size exceeds the velocity limit. */
  velocityMet: boolean;
}

export interface FixtureMargin {
  fixtureId: string;
  label: string;
  /** Residual − minimum, Pa, before sizing. */
  beforePa: number;
  /** The same after sizing (null when no sizes pass and nothing was sized). */
  afterPa: number | null;
}

export interface SizingResult {
  /** true when the sizes found meet every velocity limit and every fixture with the margin. */
  feasible: boolean;
  /** The analysis of the sized document confirms every fixture and velocity (false: see `margins`). */
  verified: boolean;
  segments: SegmentSizing[];
  changedSegments: number;
  margins: FixtureMargin[];
  minMarginBeforePa: number | null;
  minMarginAfterPa: number | null;
  /** Pipe volume of the free segments before and after, m³ (the measure "smallest" minimises). */
  volumeBeforeM3: number;
  volumeAfterM3: number | null;
  /** When not feasible: how far the worst fixture stays short with every free segment at its largest size, Pa. */
  shortfallPa: number;
  /** When not feasible: the pressure a booster at the source must add at the design flow for the velocity-sized design to pass, Pa. */
  boosterPressurePa: number | null;
  /** The sized document (null when not feasible: nothing changes). */
  document: SystemDocument | null;
  /** Analyses run: the base, the probes and the verifications (for the performance ratio). */
  analyses: number;
}

export type SizingErrorCode = 'nothing-to-size' | 'analysis-incomplete' | 'unknown-segment' | 'unknown-size' | 'negative-margin';

/** Sizing cannot start: names the cause and, where there is one, the element. */
export class SizingError extends Error {
  override readonly name = 'SizingError';
  constructor(
    readonly code: SizingErrorCode,
    message: string,
    readonly elementId: string | null = null,
  ) {
    super(message);
  }
}

interface Free {
  index: number;
  docIndex: number;
  material: MaterialId;
  /** Allowed sizes, ascending, after the velocity filter. */
  sizes: string[];
  /** ΔL per allowed size, Pa (loss at that size − loss at the current size). */
  deltaPa: number[];
  volume: number[];
  velocityMet: boolean;
}

export function sizeSystem(input: unknown, options: SizingOptions = {}): SizingResult {
  const doc = parseDocument(input);
  const marginPa = options.marginPa ?? 0;
  if (!(marginPa >= 0)) throw new SizingError('negative-margin', 'The margin must be zero or more.');
  const docIndexById = new Map(doc.segments.map((s, i) => [s.id, i]));
  for (const id of [...(options.lockedSegmentIds ?? []), ...(options.segmentIds ?? []), ...Object.keys(options.candidateSizes ?? {})]) {
    if (!docIndexById.has(id)) throw new SizingError('unknown-segment', `No segment "${id}" in the system.`, id);
  }

  let analyses = 0;
  const run = (d: SystemDocument): Analysis => {
    analyses++;
    return analyzeValidated(d);
  };
  const base = run(doc);
  if (base.verdict.status === 'incomplete') {
    const first = base.verdict.incomplete[0];
    throw new SizingError(
      'analysis-incomplete',
      `The system is not completely described, so it cannot be sized: ${first?.message ?? 'see the analysis'}`,
      first?.elementId ?? null,
    );
  }
  const segs = base.si.segments;
  const segIndex = new Map(segs.map((s, i) => [s.id, i]));
  const locked = new Set(options.lockedSegmentIds ?? []);
  const selected = options.segmentIds ? new Set(options.segmentIds) : null;

  // Which segments may change, and their candidate sizes (ascending inside diameter).
  const candidates = new Map<number, { docIndex: number; material: MaterialId; sizes: string[] }>();
  for (const [docIndex, s] of doc.segments.entries()) {
    if (locked.has(s.id) || (selected && !selected.has(s.id)) || !s.material || !s.size || s.custom) continue;
    const material = MATERIALS[s.material as MaterialId];
    if (!material) continue;
    const allowed = options.candidateSizes?.[s.id];
    for (const key of allowed ?? []) {
      if (!material.sizes.some((z) => z.key === key)) {
        throw new SizingError('unknown-size', `Size "${key}" is not a size of ${material.label} (segment "${s.label ?? s.id}").`, s.id);
      }
    }
    const sizes = [...material.sizes]
      .filter((z) => !allowed || allowed.includes(z.key))
      .sort((a, b) => a.innerDiameterM - b.innerDiameterM)
      .map((z) => z.key);
    const index = segIndex.get(s.id);
    if (index !== undefined && sizes.length > 0) candidates.set(index, { docIndex, material: material.id, sizes });
  }
  if (candidates.size === 0) {
    throw new SizingError('nothing-to-size', 'Every segment is locked, outside the selection or not a catalog pipe: nothing can be sized.');
  }

  // Step 2: probes. Loss at the current size, without the size-change part (the model leaves it out).
  const baseLoss = segs.map((s) => s.frictionLoss + (s.totalK > 0 ? (s.fittingLoss * s.fittingsK) / s.totalK : 0));
  const probeLoss = new Map<string, number>();
  const probeVelocity = new Map<string, number>();
  const jobs = [...candidates].flatMap(([, c]) => c.sizes.map((size, k) => ({ docIndex: c.docIndex, size, k })));
  for (let from = 0; from < jobs.length; from += PROBE_SEGMENTS) {
    const r = run(probeDocument(doc, base, jobs.slice(from, from + PROBE_SEGMENTS))).si.segments;
    for (const s of r) {
      probeLoss.set(s.id, s.frictionLoss + s.fittingLoss);
      probeVelocity.set(s.id, s.velocity);
    }
  }

  const free = new Map<number, Free>();
  for (const [index, c] of candidates) {
    const limit = segs[index].velocityLimit;
    const rows = c.sizes.map((key, k) => {
      const id = probeId(doc.segments[c.docIndex].id, k);
      return { key, loss: probeLoss.get(id)!, velocity: probeVelocity.get(id)! };
    });
    let ok = rows.filter((r) => limit === null || r.velocity <= limit * (1 + VELOCITY_RTOL));
    const velocityMet = ok.length > 0;
    if (!velocityMet) ok = rows.slice(-1);
    const length = segs[index].length;
    const material = MATERIALS[c.material];
    free.set(index, {
      index,
      docIndex: c.docIndex,
      material: c.material,
      sizes: ok.map((r) => r.key),
      deltaPa: ok.map((r) => r.loss - baseLoss[index]),
      volume: ok.map((r) => {
        const d = material.sizes.find((z) => z.key === r.key)!.innerDiameterM;
        return (length * Math.PI * d * d) / 4;
      }),
      velocityMet,
    });
  }

  // Step 3: one constraint per checked fixture (slack_f), attached to its node's feed segment.
  const cuts = cutSegments(doc, segIndex);
  const nodeFeed = new Map(base.si.nodes.map((n) => [n.id, n.feedSegmentId]));
  const fixtures = base.si.fixtures;
  const slack = fixtures.map((f) => f.residual - f.required - marginPa);
  const children: number[][] = segs.map(() => []);
  const roots: number[] = [];
  segs.forEach((s, i) => {
    const p = s.parentSegmentId === null ? undefined : segIndex.get(s.parentSegmentId);
    if (p === undefined) roots.push(i);
    else children[p].push(i);
  });

  const constrainedPath = (f: (typeof fixtures)[number]): number[] => {
    const path = f.path.map((id) => segIndex.get(id)!);
    let start = 0;
    path.forEach((e, k) => {
      if (cuts.has(e)) start = k;
    });
    return path.slice(start).filter((e) => free.has(e));
  };
  const paths = fixtures.map(constrainedPath);
  const minDelta = (e: number) => Math.min(...free.get(e)!.deltaPa);
  const velocityDelta = (e: number) => free.get(e)!.deltaPa[0];

  const margins = (after: Analysis | null): FixtureMargin[] =>
    fixtures.map((f, i) => ({
      fixtureId: f.id,
      label: f.label,
      beforePa: f.margin,
      afterPa: after ? after.si.fixtures[i]?.margin ?? null : null,
    }));
  const volumeBefore = [...free.values()].reduce((sum, fr) => {
    const d = MATERIALS[fr.material].sizes.find((z) => z.key === doc.segments[fr.docIndex].size)!.innerDiameterM;
    return sum + (segs[fr.index].length * Math.PI * d * d) / 4;
  }, 0);

  // Infeasible before any search: a fixture stays short with every free segment at its largest size.
  const shortfall = Math.max(0, ...paths.map((p, i) => p.reduce((sum, e) => sum + minDelta(e), 0) - slack[i]));
  if (shortfall > 0) {
    const booster = Math.max(0, ...paths.map((p, i) => p.reduce((sum, e) => sum + velocityDelta(e), 0) - slack[i]));
    return {
      feasible: false,
      verified: false,
      segments: describe(doc, segs, segIndex, free, locked, selected, null, []),
      changedSegments: 0,
      margins: margins(null),
      minMarginBeforePa: minOf(fixtures.map((f) => f.margin)),
      minMarginAfterPa: null,
      volumeBeforeM3: volumeBefore,
      volumeAfterM3: null,
      shortfallPa: shortfall,
      boosterPressurePa: booster,
      document: null,
      analyses,
    };
  }

  const leafNeed: number[][] = segs.map(() => []);
  fixtures.forEach((f, i) => {
    const feed = nodeFeed.get(f.nodeId);
    if (feed) leafNeed[segIndex.get(feed)!].push(i);
  });

  // Bounds for pruning: the least and the most the free segments above e (up to e's closing cut) can add.
  const minAbove = new Float64Array(segs.length);
  const maxAbove = new Float64Array(segs.length);
  const order: number[] = [];
  const stack = [...roots];
  while (stack.length) {
    const e = stack.pop()!;
    order.push(e);
    for (const c of children[e]) {
      const fr = free.get(e);
      const own = cuts.has(c) ? null : e;
      minAbove[c] = own === null ? 0 : minAbove[e] + (fr ? Math.min(...fr.deltaPa) : 0);
      maxAbove[c] = own === null ? 0 : maxAbove[e] + (fr ? Math.max(...fr.deltaPa) : 0);
      stack.push(c);
    }
  }

  let adjust = new Float64Array(fixtures.length);
  let chosen = new Map<number, number>();
  let after: Analysis | null = null;
  let sized: SystemDocument | null = null;
  for (let round = 0; round <= MAX_REPAIRS; round++) {
    const best = search(order, children, free, cuts, leafNeed, slack.map((s, i) => s - adjust[i]), minAbove, maxAbove, roots);
    if (!best) break;
    chosen = best;
    sized = withSizes(doc, free, chosen);
    after = run(sized);
    const nextAdjust = Float64Array.from(adjust);
    let repaired = false;
    after.si.fixtures.forEach((f, i) => {
      const short = f.required + marginPa - f.residual;
      if (short > 0 && paths[i].length > 0) {
        // Overshoot so that the sizes the repair moves do not need another round for their own size changes.
        nextAdjust[i] += REPAIR_FACTOR * short + REPAIR_ALLOWANCE_PA;
        repaired = true;
      }
    });
    if (!repaired) break;
    adjust = nextAdjust;
  }

  const passes = (a: Analysis | null) =>
    a !== null && a.si.fixtures.every((f) => f.residual - f.required >= marginPa * (1 - 1e-9) - 1e-6) && [...free.keys()].every((e) => a.si.segments[e].velocityPass !== false);
  const verified = passes(after);
  const allVelocity = [...free.values()].every((f) => f.velocityMet);
  const governingFixture = new Map<number, string>();
  if (after) {
    const finalSlack = after.si.fixtures.map((f) => f.residual - f.required - marginPa);
    paths.forEach((p, i) => {
      for (const e of p) {
        const current = governingFixture.get(e);
        const j = current === undefined ? -1 : fixtures.findIndex((f) => f.id === current);
        if (j < 0 || finalSlack[i] < finalSlack[j]) governingFixture.set(e, fixtures[i].id);
      }
    });
  }
  const segments = describe(doc, segs, segIndex, free, locked, selected, chosen, [...governingFixture]);
  const volumeAfter = [...chosen].reduce((sum, [e, k]) => sum + free.get(e)!.volume[k], 0);
  return {
    feasible: verified && allVelocity,
    verified,
    segments,
    changedSegments: segments.filter((s) => s.before !== s.after).length,
    margins: margins(after),
    minMarginBeforePa: minOf(fixtures.map((f) => f.margin)),
    minMarginAfterPa: after ? minOf(after.si.fixtures.map((f) => f.margin)) : null,
    volumeBeforeM3: volumeBefore,
    volumeAfterM3: chosen.size ? volumeAfter : null,
    shortfallPa: verified ? 0 : Math.max(0, ...(after?.si.fixtures.map((f) => f.required + marginPa - f.residual) ?? [0])),
    boosterPressurePa: null,
    document: verified && allVelocity ? sized : null,
    analyses,
  };
}

/** Step 4: the dynamic programme over the tree; returns the chosen size index of each free segment, or null. */
function search(
  order: number[],
  children: number[][],
  free: Map<number, Free>,
  cuts: Set<number>,
  leafNeed: number[][],
  slack: number[],
  minAbove: Float64Array,
  maxAbove: Float64Array,
  roots: number[],
): Map<number, number> | null {
  const sets: ParetoPoint[][] = new Array(children.length);
  for (let k = order.length - 1; k >= 0; k--) {
    const e = order[k];
    let need = -Infinity;
    for (const f of leafNeed[e]) need = Math.max(need, -slack[f]);
    let acc: ParetoPoint[] = [{ cost: 0, need, choice: -1, seg: -1, parts: [] }];
    for (const c of children[e]) {
      acc = combine(acc, sets[c]);
      sets[c] = [];
    }
    const fr = free.get(e);
    let own: ParetoPoint[];
    if (!fr) own = acc;
    else {
      own = [];
      fr.sizes.forEach((_, s) => {
        for (const p of acc) own.push({ cost: p.cost + fr.volume[s], need: p.need + fr.deltaPa[s], choice: s, seg: e, parts: [p] });
      });
      own = prune(own);
    }
    // Closing at a cut (PRV or variable-speed booster): every fixture below must be met here.
    const lo = cuts.has(e) ? 0 : minAbove[e];
    const hi = cuts.has(e) ? 0 : maxAbove[e];
    const kept = own.filter((p) => p.need + lo <= 0);
    const safe = kept.filter((p) => p.need + hi <= 0);
    const rest = kept.filter((p) => p.need + hi > 0);
    const out = rest.slice();
    if (safe.length) {
      const cheapest = safe.reduce((a, b) => (b.cost < a.cost ? b : a));
      out.push({ cost: cheapest.cost, need: -Infinity, choice: -1, seg: -1, parts: [cheapest] });
    }
    if (out.length === 0) return null;
    sets[e] = prune(out);
  }
  let top: ParetoPoint[] = [{ cost: 0, need: -Infinity, choice: -1, seg: -1, parts: [] }];
  for (const r of roots) top = combine(top, sets[r]);
  const feasible = top.filter((p) => p.need <= 0);
  if (!feasible.length) return null;
  const best = feasible.reduce((a, b) => (b.cost < a.cost ? b : a));
  const chosen = new Map<number, number>();
  const walk = [best];
  while (walk.length) {
    const p = walk.pop()!;
    if (p.seg >= 0) chosen.set(p.seg, p.choice);
    walk.push(...p.parts);
  }
  return chosen;
}

/** Segments (analysis index) at whose inlet a PRV or a variable-speed booster holds the outlet pressure. */
function cutSegments(doc: SystemDocument, segIndex: Map<string, number>): Set<number> {
  const cuts = new Set<number>();
  for (const d of doc.devices) {
    const holds = d.kind === 'prv' || (d.kind === 'booster-pump' && d.boost !== undefined && 'control' in d.boost && d.boost.control === 'variable-speed');
    const e = segIndex.get(d.segmentId);
    if (holds && e !== undefined) cuts.add(e);
  }
  return cuts;
}

/**
 * The main tree with every segment's flow fixed at its design flow and placements removed, plus
 * one copy of a segment per size to measure: a dead-end twin from the same upstream node, level,
 * carrying the same flow, fittings and material at the size measured. One analysis so measures
 * many sizes (the copies do not change any flow: every flow is fixed).
 */
function probeDocument(doc: SystemDocument, base: Analysis, jobs: { docIndex: number; size: string; k: number }[]): SystemDocument {
  const flow = new Map(base.segments.map((s) => [s.id, s.designFlow]));
  const fixed = doc.segments.map((s) => ({ ...s, flowOverride: flow.get(s.id) ?? 0, reducerAuto: false }));
  const twins = jobs.map(({ docIndex, size, k }) => {
    const s = fixed[docIndex];
    return { ...s, id: probeId(s.id, k), label: undefined, to: probeId(s.to, k), size, rise: 0 };
  });
  const twinNodes = twins.map((t) => ({ id: t.to, fixtureGroups: [], checkedFixtures: [] }));
  return { ...doc, placements: undefined, unitTypes: undefined, nodes: [...doc.nodes, ...twinNodes], segments: [...fixed, ...twins] };
}

function probeId(id: string, k: number): string {
  return `${id}#size-${k}`;
}

function withSizes(doc: SystemDocument, free: Map<number, Free>, chosen: Map<number, number>): SystemDocument {
  const segments = doc.segments.slice();
  for (const [e, k] of chosen) {
    const fr = free.get(e)!;
    segments[fr.docIndex] = { ...segments[fr.docIndex], size: fr.sizes[k] };
  }
  return { ...doc, segments };
}

function describe(
  doc: SystemDocument,
  segs: Analysis['si']['segments'],
  segIndex: Map<string, number>,
  free: Map<number, Free>,
  locked: Set<string>,
  selected: Set<string> | null,
  chosen: Map<number, number> | null,
  governing: [number, string][],
): SegmentSizing[] {
  const gov = new Map(governing);
  return doc.segments.map((s) => {
    const e = segIndex.get(s.id);
    const fr = e === undefined ? undefined : free.get(e);
    const before = s.size ?? null;
    const base = { segmentId: s.id, label: s.label ?? null, material: s.material ?? null, before };
    if (locked.has(s.id)) return { ...base, after: before, governing: 'locked' as const, velocityMet: segs[e!]?.velocityPass !== false };
    if (!fr || (selected && !selected.has(s.id))) return { ...base, after: before, governing: 'unchanged' as const, velocityMet: e === undefined || segs[e].velocityPass !== false };
    const k = chosen?.get(e!) ?? 0;
    const fixtureId = k > 0 ? gov.get(e!) : undefined;
    return {
      ...base,
      after: chosen ? fr.sizes[k] : before,
      governing: fixtureId ? { fixtureId } : ('velocity' as const),
      velocityMet: fr.velocityMet,
    };
  });
}

function minOf(values: number[]): number | null {
  return values.length ? Math.min(...values) : null;
}
