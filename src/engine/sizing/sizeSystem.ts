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
 *   2. A probe analysis (twins of the segments hung from the source, each at one candidate size
 *      with its design flow fixed by `flowOverride`, so no demand is recomputed; segments alike in
 *      material, length, fittings and flow share one twin) gives each segment's friction and
 *      fitting loss L_e(s) and velocity at every candidate size s. The velocity limit removes the
 *      sizes below the smallest that meets it (a velocity only falls as the size grows).
 *   3. A fixture f's residual changes with the sizes only through the losses of the segments on
 *      its path: residual_f(S) = residual_f(S0) − Σ_{e ∈ path f} (L_e(s_e) − L_e(s0_e)). So f passes
 *      iff Σ ΔL_e ≤ slack_f = residual_f(S0) − required_f − margin: one linear constraint per
 *      fixture over a root-to-leaf path. A PRV or a variable-speed booster holds its outlet
 *      pressure, so a path is cut there: only the segments from the device's segment down count.
 *      A PRV holds only while its inlet stays above what it delivers, so the segments above it
 *      get one more constraint of the same form (its holding slack); a PRV that does not hold in
 *      the analysis, or cannot at any size, is no cut. An idling variable-speed booster (inlet
 *      above its set pressure) is counted at its set pressure, the least it delivers.
 *   4. Minimising a sum of per-segment costs under path constraints on a tree is solved exactly
 *      by dynamic programming from the leaves up: each subtree keeps its Pareto set of (volume,
 *      need), need being the largest Σ ΔL − slack over its fixtures; sibling sets combine by
 *      adding volume and taking the larger need (pareto.ts), and a segment adds each of its sizes.
 *      Points that no choice above can rescue are dropped; points that every choice above keeps
 *      feasible are merged into the cheapest. The root keeps the cheapest point with need ≤ 0.
 *   5. One analysis of the sized document verifies it. The model leaves out the sudden expansion
 *      or contraction loss where sizes change (reducerAuto), which depends on two neighbours' sizes;
 *      if the verification finds a fixture short, its slack is reduced by the loss the search did
 *      not count on its path (or the shortfall, whichever asks more; times REPAIR_FACTOR) and step 4 repeats (at most MAX_REPAIRS times); the answer is
 *      then a safe, not necessarily the least, choice where sizes change along a path.
 * On a tree without size-change losses the answer is therefore the exact minimum (proved by the
 * exhaustive-search test in tests/engine/sizing). When no choice passes, the result says by how
 * much (every free segment at its largest size) and what a booster at the source must add.
 * Cost: one full analysis (the base), one small probe analysis, and one or two verifications; the
 * probes and verifications run only the stages that compute the numbers (analyzeHydraulics), and
 * every step reads the analyses' stage arrays, never building a result object per segment.
 *
 * Typical units. A unit type's segment is one decision shared by every placement (the document
 * stores its size in the unit type), so the placements' copies cannot be sized one by one. The
 * probes also measure every copy (alike copies share a twin), so ΔL_{e,p}(s) is known per copy;
 * a size passes the velocity limit only if it does in every copy. A fixture f of the unit in
 * placement p has the constraint Σ_{main path to p} ΔL + Σ_{unit path of f} ΔL_{e,p}(u_e) ≤ slack_{f,p}.
 *   - Classes: placements whose copies have the same ΔL tables (no length, fitting or size
 *     override, same flows) and whose fixtures' slacks differ from the class's first placement's
 *     by one number c_p for every fixture (the main tree and the floor shift them all alike) share
 *     need_k(u) = max_f (Σ_{unit path} ΔL − s_{f,k}); placement p's need is need_k(u) − c_p. A
 *     placement with an override is simply a class of its own, so overrides stay exact.
 *   - The unit type's front (unitFront.ts): the same tree DP on one copy of the unit, over points
 *     (volume of all copies, need of each class), keeping every undominated point. Any answer's
 *     unit choice can be replaced by a front point no worse in volume or any need, so the fronts
 *     hold an optimal choice.
 *   - The main tree's DP runs with each placement as a leaf at the segment feeding its connection
 *     node, need need_k(u) − c_p, for each combination of front points; the total is the main
 *     volume plus the units' volume, and the cheapest feasible combination is kept. Combinations
 *     go by units' volume ascending and stop once the main tree's least volume (its DP with every
 *     placement at the least need any point gives, a lower bound for all) plus the units' volume
 *     reaches the best found. The probes are shared: the extra cost is DP runs, not analyses.
 *   - Exact, as for the main tree, up to the size-change loss (step 5; unit segments always carry
 *     it, at the unit's inlet and inside), the tolerance of OFFSET_TOLERANCE_PA (placements are
 *     split apart beyond it; within it the least offset is taken, the safe side), and three
 *     bounds: beyond MAX_UNIT_COMBINATIONS combinations of several unit types the search is
 *     coordinate descent over the types; beyond MAX_UNIT_CLASSES kinds of placement of one unit
 *     type they are merged into one class with the largest extra loss of any and each placement's
 *     least offset (every constraint kept or tightened); and a unit's front beyond its bound
 *     (unitFront.ts) is thinned. Each marks the answer `unitPiping.leastProven: false`; it still
 *     passes its verification.
 *   - Left at their size (named in `unitPiping.left`): custom pipes, segments without a catalog
 *     material and size, a segment whose material a placement changes, and a unit type with a
 *     device on any copy (a device's hold would cut its fixtures' paths per placement). A copy
 *     whose size a placement overrides keeps that size. A unit type's segment marked `sizeLocked`
 *     keeps its size in every placement; locks given as options and selections name a unit
 *     type's segment by unitTypeSegmentKey ("<unit type id>/<segment id>").
 * The exhaustive-search tests in tests/engine/sizing (sizeSystem.test.ts, sizeUnits.test.ts) prove
 * the least volume against every size assignment, analysed in full.
 *
 * Scope: the segments of the main tree and of the placed unit types that have a catalog material
 * and size; custom pipes keep theirs.
 */
import { analyzeHydraulics, analyzeWithStages } from '../analysis/analyze';
import { parseDocument } from '../analysis/input';
import type { StageResults } from '../analysis/results';
import { MATERIALS, type MaterialId } from '../catalog/materials';
import { fittingKOfEntry } from '../fittings/fittingK';
import { FITTING_TYPES } from '../fittings/types';
import { UNIT_INLET, type SystemDocument } from '../model/schema';
import { frictionBudgetOfStages, type FrictionBudget } from './frictionBudget';
import { lossCurveAt } from '../devices/lossCurve';
import { toSI } from '../units';
import { combine, ParetoStore, prune } from './pareto';
import { placedId } from '../building/expand';
import { describeUnits, searchWithUnits, unitLeaves, unitPlan, unitTypeSegmentKey, withUnitSizes, type UnitSeg } from './unitSizing';

export { unitTypeSegmentKey } from './unitSizing';

/**
 * The sizes the document locks (`sizeLocked`): a main segment's by its id, a unit type segment's
 * (one lock for every placement) by unitTypeSegmentKey — the keys of the answer's rows.
 */
export function documentSizeLocks(doc: Pick<SystemDocument, 'segments' | 'unitTypes'>): Set<string> {
  return new Set([
    ...doc.segments.filter((s) => s.sizeLocked === true).map((s) => s.id),
    ...(doc.unitTypes ?? []).flatMap((t) => t.segments.filter((s) => s.sizeLocked === true).map((s) => unitTypeSegmentKey(t.id, s.id))),
  ]);
}

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
  /** Segments that keep their size, besides those the document marks `sizeLocked` (main segments and unit type segments). */
  lockedSegmentIds?: readonly string[];
  /** Only these segments may change (a selection, or a contractor's field change); default all. A unit type's segment is named by unitTypeSegmentKey. */
  segmentIds?: readonly string[];
  /** Size keys a segment may take (default: every size of its material's catalog). */
  candidateSizes?: Readonly<Record<string, readonly string[]>>;
}

/**
 * Why a segment has the size it has after sizing: its own velocity limit (the smallest size that
 * meets it), the smallest size allowed (nothing else holds it), the pressure at a checked fixture downstream (a larger size was needed for it), a
 * lock, or outside what may change (not selected, not a catalog pipe, inside a typical unit).
 */
export type Governing = 'velocity' | 'smallest' | { fixtureId: string; fixtureLabel: string } | 'locked' | 'unchanged';

export interface SegmentSizing {
  segmentId: string;
  label: string | null;
  material: string | null;
  before: string | null;
  after: string | null;
  governing: Governing;
  /** false when even the largest allowed size exceeds the velocity limit. */
  velocityMet: boolean;
  /** Velocity at design flow before and after (after: null when nothing was sized), m/s; its limit (null: none applies). */
  velocityBefore: number;
  velocityAfter: number | null;
  velocityLimit: number | null;
  /** The checked fixture downstream with the least margin after sizing (before, when nothing was sized), and its margins, Pa. */
  worstFixture: { fixtureId: string; label: string; marginBeforePa: number; marginAfterPa: number | null } | null;
  /**
   * A unit type's segment (one row for all its copies; segmentId is unitTypeSegmentKey): the unit
   * type, the segment's local id, and how many placements its size applies to. Absent on the main tree's rows.
   */
  unitType?: { id: string; name: string; segmentId: string; placements: number };
}

export interface FixtureMargin {
  fixtureId: string;
  label: string;
  /** Residual − minimum, Pa, before sizing. */
  beforePa: number;
  /** The same after sizing (null when no sizes pass and nothing was sized). */
  afterPa: number | null;
}

/** What the sizing measured against: the supply's minimum pressure at the design flow, Pa, and the velocity limit of each material class for the system's service, m/s. */
export interface SizingConditions {
  supplyPressurePa: number;
  velocityLimits: { material: string; maxVelocityMs: number }[];
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
  /**
   * The model codes' "pressure available for friction" for the critical fixture before sizing:
   * what the supply leaves after the devices, the elevation and the fixture's minimum (and the
   * margin), and its budget per 100 ft of equivalent length (frictionBudget.ts).
   */
  frictionBudget: FrictionBudget | null;
  /** The supply pressure and velocity limits used, recorded with an applied sizing (basis.ts). */
  conditions: SizingConditions;
  /**
   * The piping inside typical units (a unit type's segment is one size in every placement): how
   * many unit types are placed, their segments, how many placements; how many of those segments
   * the sizing decided, and the ones it left at their size with why (custom pipe, no catalog
   * size, a placement that changes its material, a device on it). `leastProven` is false when
   * the unit types' choices were too many to search one by one (coordinate descent) or a unit's
   * front was thinned: the answer passes, but is not proven the least. Null when the system has no placements.
   */
  unitPiping: {
    unitTypes: number;
    segments: number;
    placements: number;
    sized: number;
    left: { segmentId: string; label: string; reason: 'custom-pipe' | 'no-catalog-size' | 'material-override' | 'device' }[];
    leastProven: boolean;
  } | null;
  /** The sized document (null when not feasible: nothing changes). */
  document: SystemDocument | null;
  /** Analyses run: the base, the probes and the verifications (for the performance ratio). */
  analyses: number;
  /** Where the time went, ms: the analyses (base, probes, verifications), the search, and the whole call. */
  timings: { analysesMs: number; searchMs: number; totalMs: number };
}

export type SizingErrorCode =
  'nothing-to-size' | 'all-locked' | 'unknown-material' | 'analysis-incomplete' | 'unknown-segment' | 'unknown-size' | 'negative-margin';

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
  /** The least and the most of deltaPa. */
  minDeltaPa: number;
  maxDeltaPa: number;
  volume: number[];
  velocityMet: boolean;
  /** The velocity limit ruled out at least one smaller allowed size. */
  velocityRemoved: boolean;
}

/*
 * What the sizing reads of an analysis are its stage arrays (results.ts builds its result objects
 * from the same arrays), so that reading every segment of a large building many times builds no
 * object per segment. Pressures in Pa, flows in m³/s, lengths in m: the SI results' own numbers.
 */

/** A checked fixture as the search reads it (SI), with its path of segment indices from the source. */
export interface FixtureRow {
  id: string;
  label: string;
  residual: number;
  required: number;
  margin: number;
  /** Segment indices from the source down to the fixture's node. */
  path: number[];
  /** The segment feeding the fixture's node (−1 at the source). */
  feed: number;
}

/** A segment's answer row names the checked fixture downstream with the least margin (index w), before and after. */
export function worstFixtureOf(fixtures: readonly FixtureRow[], w: number | undefined, after: StageResults | null | undefined): SegmentSizing['worstFixture'] {
  if (w === undefined) return null;
  return {
    fixtureId: fixtures[w].id,
    label: fixtures[w].label,
    marginBeforePa: fixtures[w].margin,
    marginAfterPa: after ? after.checks.fixtures[w].marginPa : null,
  };
}

/** A segment as a probe copies it (a main segment, or a placement's copy of a unit type's segment). */
export type ProbeSegment = SystemDocument['segments'][number];

interface UnitCandidateInput {
  doc: SystemDocument;
  options: SizingOptions;
  segIndex: Map<string, number>;
  locked: Set<string>;
  selected: Set<string> | null;
  hasData: ReturnType<typeof fittingDataCache>;
  bySizeAscending: (m: MaterialId) => CatalogSize[];
  unitTypes: NonNullable<SystemDocument['unitTypes']>;
  placements: NonNullable<SystemDocument['placements']>;
  placed: Set<string>;
}

type LeftReason = NonNullable<SizingResult['unitPiping']>['left'][number]['reason'];

/**
 * The unit types' segments the sizing may decide, with their copies, and those it leaves at their
 * size and why. A unit type with a device on any copy of its piping is left whole: a device's
 * hold would cut its fixtures' paths differently per placement.
 */
function unitCandidates({ doc, options, segIndex, locked, selected, hasData, bySizeAscending, unitTypes, placements, placed }: UnitCandidateInput) {
  const segs: UnitSeg[] = [];
  const left: { segmentId: string; label: string; reason: LeftReason }[] = [];
  const deviceSegs = new Set(doc.devices.map((d) => d.segmentId));
  unitTypes.forEach((t, type) => {
    if (!placed.has(t.id)) return;
    const mine = placements.map((p, q) => ({ p, q })).filter(({ p }) => p.unitTypeId === t.id);
    const withDevice = t.segments.some((s) => mine.some(({ p }) => deviceSegs.has(placedId(p.id, s.id))));
    t.segments.forEach((s, local) => {
      const key = unitTypeSegmentKey(t.id, s.id);
      const label = `${t.name} · ${s.label ?? s.id}`;
      if (locked.has(key) || (selected && !selected.has(key))) return;
      const leave = (reason: LeftReason) => left.push({ segmentId: key, label, reason });
      if (withDevice) return leave('device');
      if (s.custom) return leave('custom-pipe');
      const material = s.material ? MATERIALS[s.material as MaterialId] : undefined;
      if (!material || !s.size) return leave('no-catalog-size');
      if (mine.some(({ p }) => (p.overrides?.segments?.[s.id]?.material ?? s.material) !== s.material)) return leave('material-override');
      const copies: UnitSeg['copies'] = [];
      for (const { p, q } of mine) {
        const o = p.overrides?.segments?.[s.id];
        if (o?.size !== undefined) continue;
        const index = segIndex.get(placedId(p.id, s.id));
        if (index === undefined) continue;
        const seg = {
          id: placedId(p.id, s.id),
          from: s.from === UNIT_INLET ? p.at : placedId(p.id, s.from),
          to: placedId(p.id, s.to),
          material: s.material,
          size: s.size,
          length: o?.length ?? s.length,
          fittings: o?.fittings ?? s.fittings,
          reducerAuto: true,
        } as ProbeSegment;
        copies.push({ placement: q, index, seg, deltaPa: [] });
      }
      if (copies.length === 0) return;
      const allowed = options.candidateSizes?.[key];
      for (const k of allowed ?? []) {
        if (!material.sizes.some((z) => z.key === k))
          throw new SizingError('unknown-size', `Size "${k}" is not a size of ${material.label} (segment "${label}").`, key);
      }
      const sizes = bySizeAscending(material.id)
        .filter((z) => (!allowed || allowed.includes(z.key)) && copies.every((c) => hasData(c.seg, z)))
        .map((z) => z.key);
      if (sizes.length === 0) return;
      segs.push({ key, type, local, material: material.id, sizes, volume: [], velocityMet: true, velocityRemoved: false, copies });
    });
  });
  return { segs, left };
}

/** Segment indices from the source down to node n (the path results.ts names by id, same order). */
function pathToNode(stages: StageResults, n: number): number[] {
  const { topo, model } = stages;
  const path: number[] = [];
  while (topo.feedSeg[n] !== -1) {
    const s = topo.feedSeg[n];
    path.push(s);
    n = model.seg.from[s];
  }
  return path.reverse();
}

function fixtureRows(stages: StageResults): FixtureRow[] {
  const { model, checks, topo } = stages;
  return model.fixtures.map((fx, k) => ({
    id: fx.id,
    label: fx.label,
    residual: checks.fixtures[k].residualPa,
    required: fx.requiredPa,
    margin: checks.fixtures[k].marginPa,
    path: pathToNode(stages, fx.nodeIdx),
    feed: topo.feedSeg[fx.nodeIdx],
  }));
}

export function sizeSystem(input: unknown, options: SizingOptions = {}): SizingResult {
  const doc = parseDocument(input);
  const marginPa = options.marginPa ?? 0;
  if (!(marginPa >= 0)) throw new SizingError('negative-margin', 'The margin must be zero or more.');
  const docIndexById = new Map(doc.segments.map((s, i) => [s.id, i]));
  const unitTypes = doc.unitTypes ?? [];
  const placements = doc.placements ?? [];
  const placed = new Set(placements.map((p) => p.unitTypeId));
  const unitKeys = new Set(unitTypes.filter((t) => placed.has(t.id)).flatMap((t) => t.segments.map((s) => unitTypeSegmentKey(t.id, s.id))));
  for (const id of [...(options.lockedSegmentIds ?? []), ...(options.segmentIds ?? []), ...Object.keys(options.candidateSizes ?? {})]) {
    if (!docIndexById.has(id) && !unitKeys.has(id)) throw new SizingError('unknown-segment', `No segment "${id}" in the system.`, id);
  }

  const startedAt = performance.now();
  let analyses = 0;
  let analysesMs = 0;
  let searchMs = 0;
  const timed = <T>(analyse: (d: SystemDocument) => T, d: SystemDocument): T => {
    analyses++;
    const t0 = performance.now();
    const r = analyse(d);
    analysesMs += performance.now() - t0;
    return r;
  };
  // The base analysis in full (its verdict, criteria and critical fixture); the probes and the
  // verifications need only the computed numbers (analyzeHydraulics: the same stages, no report).
  const run = (d: SystemDocument): StageResults => timed(analyzeHydraulics, d);
  const { analysis: base, stages: baseStages } = timed(analyzeWithStages, doc);
  if (base.verdict.status === 'incomplete') {
    const first = base.verdict.incomplete[0];
    throw new SizingError(
      'analysis-incomplete',
      `The system is not completely described, so it cannot be sized: ${first?.message ?? 'see the analysis'}`,
      first?.elementId ?? null,
    );
  }
  const { model, topo, hyd, checks, demand } = baseStages;
  const segCount = model.seg.count;
  const segIndex = new Map(model.seg.id.map((id, i) => [id, i]));
  const parentOf = topo.parentSeg;
  const budget = frictionBudgetOfStages(base, baseStages, marginPa);
  const conditions: SizingConditions = {
    supplyPressurePa: base.si.source.pressureAtDesignFlow,
    velocityLimits: base.criteria.velocityLimits
      .filter((v) => v.service === doc.service)
      .map((v) => ({ material: v.material, maxVelocityMs: toSI('velocity', v.maxVelocity, doc.unitSystem) })),
  };
  const locked = new Set([...(options.lockedSegmentIds ?? []), ...documentSizeLocks(doc)]);
  const selected = options.segmentIds ? new Set(options.segmentIds) : null;

  // Which segments may change, and their candidate sizes (ascending inside diameter).
  const hasData = fittingDataCache();
  const sortedSizes = new Map<MaterialId, CatalogSize[]>();
  const bySizeAscending = (m: MaterialId) => {
    let sizes = sortedSizes.get(m);
    if (!sizes) sortedSizes.set(m, (sizes = [...MATERIALS[m].sizes].sort((a, b) => a.innerDiameterM - b.innerDiameterM)));
    return sizes;
  };
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
    // The designer's smallest size (segment `minSize`): no candidate below its inside diameter.
    const floorSize = s.minSize === undefined ? undefined : material.sizes.find((z) => z.key === s.minSize);
    if (s.minSize !== undefined && !floorSize)
      throw new SizingError('unknown-size', `Smallest size "${s.minSize}" is not a size of ${material.label} (segment "${s.label ?? s.id}").`, s.id);
    const sizes: string[] = [];
    for (const z of bySizeAscending(material.id)) {
      if ((!allowed || allowed.includes(z.key)) && (!floorSize || z.innerDiameterM >= floorSize.innerDiameterM) && hasData(s, z)) sizes.push(z.key);
    }
    const index = segIndex.get(s.id);
    if (index !== undefined && sizes.length > 0) candidates.set(index, { docIndex, material: material.id, sizes });
  }

  // Typical units: a unit type's segment is one decision for all its copies (the placements' segments).
  const units = unitCandidates({ doc, options, segIndex, locked, selected, hasData, bySizeAscending, unitTypes, placements, placed });
  if (candidates.size === 0 && units.segs.length === 0) {
    // The catalog pipes in scope: the main tree's, then the placed unit types' (named as the answer's rows name them).
    const isPipe = (s: { material?: string; size?: string; custom?: unknown }) => Boolean(s.material && s.size && !s.custom);
    const inScope = [
      ...doc.segments.filter((s) => (!selected || selected.has(s.id)) && isPipe(s)).map((s) => ({ key: s.id, name: s.label ?? s.id })),
      ...unitTypes
        .filter((t) => placed.has(t.id))
        .flatMap((t) => t.segments.filter(isPipe).map((s) => ({ key: unitTypeSegmentKey(t.id, s.id), name: `${t.name} · ${s.label ?? s.id}` })))
        .filter((s) => !selected || selected.has(s.key)),
    ];
    if (inScope.length > 0 && inScope.every((s) => locked.has(s.key))) {
      const names =
        inScope
          .slice(0, 3)
          .map((s) => `"${s.name}"`)
          .join(', ') + (inScope.length > 3 ? ` and ${inScope.length - 3} more` : '');
      throw new SizingError(
        'all-locked',
        `Every segment ${selected ? 'selected' : 'of the system'} is locked (${names}): nothing can be sized and nothing was changed. Unlock a segment or select others.`,
        inScope[0].key,
      );
    }
    throw new SizingError('nothing-to-size', 'Every segment is locked, outside the selection or not a catalog pipe: nothing can be sized.');
  }

  // Step 2: probes. Loss at the current size, without the size-change part (the model leaves it out).
  const baseLoss = new Float64Array(segCount);
  for (let s = 0; s < segCount; s++) {
    const totalK = hyd.fittingsK[s] + hyd.sizeChangeK[s];
    baseLoss[s] = hyd.frictionLossPa[s] + (totalK > 0 ? (hyd.fittingLossPa[s] * hyd.fittingsK[s]) / totalK : 0);
  }
  // The design flow in the document's units, as the probe documents carry it (flowOverride).
  const flowUnit = toSI('flow', 1, doc.unitSystem);
  const flowOf = (s: number) => demand.designFlowM3s[s] / flowUnit;
  // Segments alike in everything a probe measures (material, allowed sizes, length, fittings,
  // design flow) lose alike: one probe serves them all (a building's typical floors repeat).
  // Keyed by the numbers and names; the fittings (a list of objects) are compared as values.
  // The main tree's candidates first, then the copies of the unit types' segments (same probes).
  const measuring = new Map<number, { seg: ProbeSegment; sizes: string[] }>();
  for (const [index, c] of candidates) measuring.set(index, { seg: doc.segments[c.docIndex], sizes: c.sizes });
  for (const u of units.segs) for (const c of u.copies) measuring.set(c.index, { seg: c.seg, sizes: u.sizes });
  const representatives = new Map<string, number[]>();
  const probeOf = new Map<number, number>();
  for (const [index, c] of measuring) {
    const s = c.seg;
    const key = `${s.material}|${c.sizes.join(',')}|${s.length}|${flowOf(index)}`;
    let reps = representatives.get(key);
    if (!reps) representatives.set(key, (reps = []));
    let rep = reps.find((r) => sameValue(measuring.get(r)!.seg.fittings, s.fittings));
    if (rep === undefined) reps.push((rep = index));
    probeOf.set(index, rep);
  }
  // Each representative's sizes are measured by one twin each: its loss and velocity per size.
  const measured = new Map<number, { loss: Float64Array; velocity: Float64Array }>();
  const jobs: { seg: ProbeSegment; size: string; flow: number; rep: number; k: number }[] = [];
  for (const rep of new Set(probeOf.values())) {
    const c = measuring.get(rep)!;
    measured.set(rep, { loss: new Float64Array(c.sizes.length), velocity: new Float64Array(c.sizes.length) });
    c.sizes.forEach((size, k) => jobs.push({ seg: c.seg, size, flow: flowOf(rep), rep, k }));
  }
  for (let from = 0; from < jobs.length; from += PROBE_SEGMENTS) {
    const batch = jobs.slice(from, from + PROBE_SEGMENTS);
    const probe = run(probeDocument(doc, batch));
    // The probe document holds no typical units: its segments are analysed in document order.
    batch.forEach((job, t) => {
      if (probe.model.seg.id[t] !== probeId(job.seg.id, job.k)) throw new Error('engine defect: a probe segment out of document order');
      const m = measured.get(job.rep)!;
      m.loss[job.k] = probe.hyd.frictionLossPa[t] + probe.hyd.fittingLossPa[t];
      m.velocity[job.k] = probe.hyd.velocity[t];
    });
  }

  const diameterMaps = new Map<MaterialId, Map<string, number>>();
  const diameters = (m: MaterialId) => {
    let d = diameterMaps.get(m);
    if (!d) diameterMaps.set(m, (d = innerDiameters(m)));
    return d;
  };
  const free = new Map<number, Free>();
  for (const [index, c] of candidates) {
    const limit = checks.velocityLimitMs[index];
    const m = measured.get(probeOf.get(index)!)!;
    const rows = c.sizes.map((key, k) => ({ key, loss: m.loss[k], velocity: m.velocity[k] }));
    let ok = rows.filter((r) => limit === null || r.velocity <= limit * (1 + VELOCITY_RTOL));
    const velocityMet = ok.length > 0;
    if (!velocityMet) ok = rows.slice(-1);
    const length = model.seg.lengthM[index];
    const diameter = diameters(c.material);
    const deltaPa = ok.map((r) => r.loss - baseLoss[index]);
    free.set(index, {
      index,
      docIndex: c.docIndex,
      material: c.material,
      sizes: ok.map((r) => r.key),
      deltaPa,
      minDeltaPa: Math.min(...deltaPa),
      maxDeltaPa: Math.max(...deltaPa),
      volume: ok.map((r) => {
        const d = diameter.get(r.key)!;
        return (length * Math.PI * d * d) / 4;
      }),
      velocityMet,
      velocityRemoved: ok.length < rows.length,
    });
  }
  // A unit type's segment: a size passes the velocity limit only if every copy's does.
  for (const u of units.segs) {
    const meets = u.sizes.map((_, k) =>
      u.copies.every((c) => {
        const limit = checks.velocityLimitMs[c.index];
        return limit === null || measured.get(probeOf.get(c.index)!)!.velocity[k] <= limit * (1 + VELOCITY_RTOL);
      }),
    );
    let ok = u.sizes.map((_, k) => k).filter((k) => meets[k]);
    u.velocityMet = ok.length > 0;
    if (!u.velocityMet) ok = [u.sizes.length - 1];
    u.velocityRemoved = ok.length < u.sizes.length;
    const diameter = diameters(u.material);
    for (const c of u.copies) {
      const m = measured.get(probeOf.get(c.index)!)!;
      c.deltaPa = ok.map((k) => m.loss[k] - baseLoss[c.index]);
    }
    u.volume = ok.map((k) => {
      const d = diameter.get(u.sizes[k])!;
      return u.copies.reduce((sum, c) => sum + (model.seg.lengthM[c.index] * Math.PI * d * d) / 4, 0);
    });
    u.sizes = ok.map((k) => u.sizes[k]);
  }

  // Step 3: one constraint per checked fixture (slack_f), attached to its node's feed segment.
  const fixtures = fixtureRows(baseStages);
  const children: number[][] = Array.from({ length: segCount }, () => []);
  const roots: number[] = [];
  for (let i = 0; i < segCount; i++) {
    if (parentOf[i] === -1) roots.push(i);
    else children[parentOf[i]].push(i);
  }
  const minDelta = (e: number) => free.get(e)!.minDeltaPa;
  const velocityDelta = (e: number) => free.get(e)!.deltaPa[0];
  /** Segment indices from the source down to e (inclusive). */
  const pathTo = (e: number): number[] => {
    const out: number[] = [];
    for (let k = e; k !== -1; k = parentOf[k]) out.push(k);
    return out.reverse();
  };

  // Devices that hold their outlet pressure cut a path: the sizes above them do not reach below.
  // A PRV holds only while its inlet stays above what it delivers: the sizes above it get a
  // constraint of their own (its holding slack, attached to the segment feeding it); a PRV that
  // does not hold now, or cannot at any size, is no cut. A variable-speed booster holds at least
  // its set pressure at any inlet; when it idles (inlet above the set pressure) the fixtures
  // below are counted from the set pressure, the least it delivers (a safe side).
  const holding = deviceHolds(doc, baseStages, segIndex);
  const cuts = new Set<number>();
  const belowCutCredit = new Map<number, number>();
  const holds: { cut: number; slack: number }[] = [];
  const constrained = (path: number[], cutSet: Set<number>): number[] => {
    let start = 0;
    path.forEach((e, k) => {
      if (cutSet.has(e)) start = k;
    });
    return path.slice(start).filter((e) => free.has(e));
  };
  // Top-down, so that a hold's path ends at the cut above it.
  const cutOrder = [...holding].sort((a, b) => pathTo(a[0]).length - pathTo(b[0]).length);
  for (const [e, h] of cutOrder) {
    if (h.kind === 'booster') {
      cuts.add(e);
      if (h.idleExcessPa > 0) belowCutCredit.set(e, h.idleExcessPa);
      continue;
    }
    if (h.holdSlackPa < 0) continue;
    const parent = parentOf[e] === -1 ? undefined : parentOf[e];
    const above = parent === undefined ? [] : constrained(pathTo(parent), cuts);
    if (above.reduce((sum, k) => sum + minDelta(k), 0) > h.holdSlackPa) continue;
    cuts.add(e);
    if (parent !== undefined && above.length) holds.push({ cut: parent, slack: h.holdSlackPa });
  }
  const paths = fixtures.map((f) => constrained(f.path, cuts));
  const slack = fixtures.map((f) => {
    let credit = 0;
    for (const e of f.path) if (belowCutCredit.has(e)) credit = belowCutCredit.get(e)!;
    return f.residual - f.required - marginPa - credit;
  });
  // Constraint k ≥ fixtures.length is a PRV's hold: same search, no fixture of its own.
  const holdPaths = holds.map((h) => constrained(pathTo(h.cut), cuts));
  const allPaths = [...paths, ...holdPaths];
  const allSlack = [...slack, ...holds.map((h) => h.slack)];
  const plan = unitPlan({ units: units.segs, unitTypes, placements, fixtures, slack, segIndex });
  const unitPiping: SizingResult['unitPiping'] =
    placed.size === 0
      ? null
      : {
          unitTypes: placed.size,
          segments: unitTypes.filter((t) => placed.has(t.id)).reduce((n, t) => n + t.segments.length, 0),
          placements: placements.length,
          sized: units.segs.length,
          left: units.left,
          leastProven: true,
        };
  /** The extra loss inside its unit on fixture i's path in its placement, each unit segment at size index pick(u) (0 for the main tree's fixtures). */
  const unitPathDelta = (i: number, pick: (u: UnitSeg, copy: UnitSeg['copies'][number]) => number) => {
    const uf = plan.fixtureOf.get(i);
    if (!uf) return 0;
    let sum = 0;
    for (const e of uf.localPath) {
      const copy = uf.copies[e];
      if (copy) sum += copy.deltaPa[pick(plan.types[uf.st].segs[e]!, copy)];
    }
    return sum;
  };

  const margins = (after: StageResults | null): FixtureMargin[] =>
    fixtures.map((f, i) => ({
      fixtureId: f.id,
      label: f.label,
      beforePa: f.margin,
      afterPa: after ? (after.checks.fixtures[i]?.marginPa ?? null) : null,
    }));
  const volumeBefore =
    [...free.values()].reduce((sum, fr) => {
      const d = diameters(fr.material).get(doc.segments[fr.docIndex].size!)!;
      return sum + (model.seg.lengthM[fr.index] * Math.PI * d * d) / 4;
    }, 0) +
    units.segs.reduce((sum, u) => {
      const d = diameters(u.material).get(unitTypes[u.type].segments[u.local].size!)!;
      return sum + u.copies.reduce((v, c) => v + (model.seg.lengthM[c.index] * Math.PI * d * d) / 4, 0);
    }, 0);
  const describeInput = { doc, base: baseStages, segIndex, free, locked, selected, fixtures };
  const describeAll = (
    chosenSizes: Map<number, number> | null,
    unitPick: Map<UnitSeg, number> | null,
    governing: Map<number, number>,
    unitGoverning: Map<UnitSeg, number>,
    after: StageResults | null,
  ) => {
    const rows = describe({ ...describeInput, chosen: chosenSizes, governing, after });
    if (placed.size === 0) return rows;
    return [
      ...rows,
      ...describeUnits({ base: baseStages, segIndex, locked, fixtures, units: units.segs, unitTypes, placements, unitPick, unitGoverning, after }),
    ];
  };

  // Infeasible before any search: a fixture stays short with every free segment at its largest size.
  const shortfall = Math.max(
    0,
    ...paths.map((p, i) => p.reduce((sum, e) => sum + minDelta(e), 0) + unitPathDelta(i, (_, c) => c.deltaPa.indexOf(Math.min(...c.deltaPa))) - slack[i]),
  );
  if (shortfall > 0) {
    const booster = Math.max(0, ...paths.map((p, i) => p.reduce((sum, e) => sum + velocityDelta(e), 0) + unitPathDelta(i, () => 0) - slack[i]));
    return {
      feasible: false,
      verified: false,
      segments: describeAll(null, null, new Map(), new Map(), null),
      changedSegments: 0,
      margins: margins(null),
      minMarginBeforePa: minOf(fixtures.map((f) => f.margin)),
      minMarginAfterPa: null,
      volumeBeforeM3: volumeBefore,
      volumeAfterM3: null,
      shortfallPa: shortfall,
      boosterPressurePa: booster,
      frictionBudget: budget,
      conditions,
      unitPiping,
      document: null,
      analyses,
      timings: { analysesMs, searchMs, totalMs: performance.now() - startedAt },
    };
  }

  const leafNeed: number[][] = Array.from({ length: segCount }, () => []);
  fixtures.forEach((f, i) => {
    if (f.feed !== -1) leafNeed[f.feed].push(i);
  });
  holds.forEach((h, k) => leafNeed[h.cut].push(fixtures.length + k));

  // Bounds for pruning: the least and the most the free segments above e (up to e's closing cut) can add.
  const minAbove = new Float64Array(segCount);
  const maxAbove = new Float64Array(segCount);
  const order: number[] = [];
  const stack = [...roots];
  while (stack.length) {
    const e = stack.pop()!;
    order.push(e);
    for (const c of children[e]) {
      const fr = free.get(e);
      const own = cuts.has(c) ? null : e;
      minAbove[c] = own === null ? 0 : minAbove[e] + (fr ? fr.minDeltaPa : 0);
      maxAbove[c] = own === null ? 0 : maxAbove[e] + (fr ? fr.maxDeltaPa : 0);
      stack.push(c);
    }
  }

  // With typical units: the main tree without the units' piping, each placement a leaf at the
  // segment feeding its connection node (constraint fixtures.length + holds.length + j).
  const mainTree = plan.types.length === 0 ? null : unitLeaves({ plan, children, roots, leafNeed, parentOf, firstConstraint: allSlack.length });

  let adjust = new Float64Array(allSlack.length);
  let chosen = new Map<number, number>();
  let unitPick = new Map<UnitSeg, number>();
  let after: StageResults | null = null;
  let sized: SystemDocument | null = null;
  for (let round = 0; round <= MAX_REPAIRS; round++) {
    const searchStart = performance.now();
    const adjusted = allSlack.map((s, i) => s - adjust[i]);
    let best: Map<number, number> | null;
    let bestUnits = new Map<UnitSeg, number>();
    if (!mainTree) {
      best = search(order, children, free, cuts, leafNeed, adjusted, minAbove, maxAbove, roots);
    } else {
      const found = searchWithUnits({
        plan,
        adjusted,
        atSource: mainTree.atSource,
        main: (placementSlack) =>
          search(mainTree.order, mainTree.children, free, cuts, mainTree.leafNeed, [...adjusted, ...placementSlack], minAbove, maxAbove, mainTree.roots),
        mainVolume: (c) => [...c].reduce((sum, [e, k]) => sum + free.get(e)!.volume[k], 0),
      });
      best = found?.chosen ?? null;
      if (found) {
        bestUnits = found.unitPick;
        if (!found.proven) unitPiping!.leastProven = false;
      }
    }
    searchMs += performance.now() - searchStart;
    if (!best) break;
    chosen = best;
    unitPick = bestUnits;
    sized = withUnitSizes(withSizes(doc, free, chosen), unitPick);
    after = run(sized);
    const nextAdjust = Float64Array.from(adjust);
    let repaired = false;
    // Predicted extra loss on each constraint's path (what the search counted) against the drop
    // the analysis finds: the difference is the size-change loss the model leaves out.
    const predicted = (i: number) =>
      allPaths[i].reduce((sum, e) => sum + free.get(e)!.deltaPa[chosen.get(e) ?? 0], 0) + unitPathDelta(i, (u) => unitPick.get(u) ?? 0);
    const shortOf = (i: number, short: number, drop: number) => {
      if (short > 0 && (allPaths[i].length > 0 || plan.fixtureOf.has(i))) {
        // Overshoot so that the sizes the repair moves do not need another round for their own size changes.
        const unmodelled = Math.max(0, drop - predicted(i));
        nextAdjust[i] = Math.max(adjust[i] + REPAIR_FACTOR * short, REPAIR_FACTOR * unmodelled) + REPAIR_ALLOWANCE_PA;
        repaired = true;
      }
    };
    const checked = after;
    checked.checks.fixtures.forEach((c, i) => shortOf(i, fixtures[i].required + marginPa - c.residualPa, fixtures[i].residual - c.residualPa));
    const heldAfter = deviceHolds(doc, checked, segIndex);
    holds.forEach((h, k) => {
      const cut = [...heldAfter].find(([e]) => parentOf[e] === h.cut && cuts.has(e));
      if (cut && cut[1].kind === 'prv') shortOf(fixtures.length + k, -cut[1].holdSlackPa, h.slack - cut[1].holdSlackPa);
    });
    if (!repaired) break;
    adjust = nextAdjust;
  }

  const passes = (a: StageResults | null) =>
    a !== null &&
    a.checks.fixtures.every((c, i) => c.residualPa - fixtures[i].required >= marginPa * (1 - 1e-9) - 1e-6) &&
    [...free.keys()].every((e) => a.checks.velocityPass[e] !== false) &&
    units.segs.every((u) => u.copies.every((c) => a.checks.velocityPass[c.index] !== false));
  const verified = passes(after);
  const allVelocity = [...free.values()].every((f) => f.velocityMet) && units.segs.every((u) => u.velocityMet);
  // The fixture that holds a segment at its size: the one with the least slack left among the fixtures its loss counts for.
  const governingFixture = new Map<number, number>();
  const unitGoverning = new Map<UnitSeg, number>();
  if (after) {
    const finalSlack = after.checks.fixtures.map((c, i) => c.residualPa - fixtures[i].required - marginPa);
    paths.forEach((p, i) => {
      for (const e of p) {
        const j = governingFixture.get(e);
        if (j === undefined || finalSlack[i] < finalSlack[j]) governingFixture.set(e, i);
      }
    });
    for (const [i, uf] of plan.fixtureOf) {
      for (const e of uf.localPath) {
        const u = plan.types[uf.st].segs[e];
        if (!u || !uf.copies[e]) continue;
        const j = unitGoverning.get(u);
        if (j === undefined || finalSlack[i] < finalSlack[j]) unitGoverning.set(u, i);
      }
    }
  }
  const segments = describeAll(chosen, unitPick, governingFixture, unitGoverning, after);
  const volumeAfter = [...chosen].reduce((sum, [e, k]) => sum + free.get(e)!.volume[k], 0) + [...unitPick].reduce((sum, [u, k]) => sum + u.volume[k], 0);
  const afterMargins = after ? after.checks.fixtures.map((c) => c.marginPa) : null;
  return {
    feasible: verified && allVelocity,
    verified,
    segments,
    changedSegments: segments.filter((s) => s.before !== s.after).length,
    margins: margins(after),
    minMarginBeforePa: minOf(fixtures.map((f) => f.margin)),
    minMarginAfterPa: afterMargins ? minOf(afterMargins) : null,
    volumeBeforeM3: volumeBefore,
    volumeAfterM3: chosen.size || unitPick.size ? volumeAfter : null,
    shortfallPa: verified ? 0 : Math.max(0, ...(after?.checks.fixtures.map((c, i) => fixtures[i].required + marginPa - c.residualPa) ?? [0])),
    boosterPressurePa: null,
    frictionBudget: budget,
    conditions,
    unitPiping,
    document: verified && allVelocity ? sized : null,
    analyses,
    timings: { analysesMs, searchMs, totalMs: performance.now() - startedAt },
  };
}

/** Whether two plain data values (a segment's fittings) are equal as JSON would write them. */
function sameValue(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (typeof a !== 'object' || typeof b !== 'object' || a === null || b === null) return JSON.stringify(a) === JSON.stringify(b);
  if (Array.isArray(a) || Array.isArray(b)) {
    if (!Array.isArray(a) || !Array.isArray(b) || a.length !== b.length) return false;
    return a.every((x, i) => sameValue(x, b[i]));
  }
  const ka = Object.keys(a).filter((k) => (a as Record<string, unknown>)[k] !== undefined);
  const kb = Object.keys(b).filter((k) => (b as Record<string, unknown>)[k] !== undefined);
  return ka.length === kb.length && ka.every((k, i) => k === kb[i] && sameValue((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k]));
}

/** Inside diameter of each catalog size of a material, by size key, m. */
function innerDiameters(material: MaterialId): Map<string, number> {
  return new Map(MATERIALS[material].sizes.map((z) => [z.key, z.innerDiameterM]));
}

type CatalogSize = { key: string; nominalIn: number; innerDiameterM: number };

/**
 * Whether every catalog fitting of the segment has loss data at this size: a fitting published only
 * by size (the manufacturers' PEX equivalent lengths, 1/2–1 in for some lines) rules out the sizes
 * its table does not cover, which the sizing then never offers (rather than fail the analysis).
 * The answer depends only on the fitting type and the size, so one call asks each pair once.
 */
function fittingDataCache(): (s: Pick<SystemDocument['segments'][number], 'fittings'>, z: CatalogSize) => boolean {
  const known = new Map<CatalogSize, Map<string, boolean>>();
  return (s, z) => {
    let bySize = known.get(z);
    if (!bySize) known.set(z, (bySize = new Map()));
    return (s.fittings ?? []).every((f) => {
      if (f.custom) return true;
      let has = bySize.get(f.typeId);
      if (has === undefined) bySize.set(f.typeId, (has = fittingHasData(f.typeId, z)));
      return has;
    });
  };
}

function fittingHasData(typeId: string, z: CatalogSize): boolean {
  const entry = Object.prototype.hasOwnProperty.call(FITTING_TYPES, typeId) ? FITTING_TYPES[typeId] : undefined;
  if (!entry) return true;
  try {
    // a nominal flow state (Re 1e5, f 0.02: turbulent, common practice) only to ask whether data exist
    fittingKOfEntry(entry, {
      method: 'crane',
      innerDiameterM: z.innerDiameterM,
      nominalSizeIn: z.nominalIn,
      nominalSizeKey: z.key,
      Re: 1e5,
      frictionFactor: 0.02,
    });
    return true;
  } catch {
    return false;
  }
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
  const store = new ParetoStore(4 * children.length);
  const sets: number[][] = new Array(children.length);
  const none: number[] = [];
  for (let k = order.length - 1; k >= 0; k--) {
    const e = order[k];
    let need = -Infinity;
    for (const f of leafNeed[e]) need = Math.max(need, -slack[f]);
    let acc: number[] = [store.add(0, need, -1, -1, -1, -1)];
    for (const c of children[e]) {
      acc = combine(store, acc, sets[c]);
      sets[c] = none;
    }
    const fr = free.get(e);
    let own: number[];
    if (!fr) own = acc;
    else {
      own = [];
      for (let s = 0; s < fr.sizes.length; s++) {
        for (const p of acc) own.push(store.add(store.cost[p] + fr.volume[s], store.need[p] + fr.deltaPa[s], e, s, p, -1));
      }
      own = prune(store, own);
    }
    // Closing at a cut (PRV or variable-speed booster): every fixture below must be met here.
    // Points that no choice above can rescue are dropped; those every choice above keeps
    // feasible become one point, the cheapest of them.
    const lo = cuts.has(e) ? 0 : minAbove[e];
    const hi = cuts.has(e) ? 0 : maxAbove[e];
    const out: number[] = [];
    let cheapestSafe = -1;
    for (const p of own) {
      if (!(store.need[p] + lo <= 0)) continue;
      if (store.need[p] + hi > 0) out.push(p);
      else if (cheapestSafe === -1 || store.cost[p] < store.cost[cheapestSafe]) cheapestSafe = p;
    }
    if (cheapestSafe !== -1) out.push(store.add(store.cost[cheapestSafe], -Infinity, -1, -1, cheapestSafe, -1));
    if (out.length === 0) return null;
    sets[e] = prune(store, out);
  }
  let top: number[] = [store.add(0, -Infinity, -1, -1, -1, -1)];
  for (const r of roots) top = combine(store, top, sets[r]);
  let best = -1;
  for (const p of top) if (store.need[p] <= 0 && (best === -1 || store.cost[p] < store.cost[best])) best = p;
  if (best === -1) return null;
  const chosen = new Map<number, number>();
  const walk = [best];
  while (walk.length) {
    const p = walk.pop()!;
    if (store.seg[p] >= 0) chosen.set(store.seg[p], store.choice[p]);
    if (store.left[p] >= 0) walk.push(store.left[p]);
    if (store.right[p] >= 0) walk.push(store.right[p]);
  }
  return chosen;
}

type Hold = { kind: 'prv'; holdSlackPa: number } | { kind: 'booster'; idleExcessPa: number };

/**
 * Segments (analysis index) at whose inlet a PRV or a variable-speed booster sits, with what the
 * analysis says of it: for a PRV, how far its inlet (less its own loss) stays above the pressure
 * it delivers (negative: it does not hold); for a booster, how far an idling pump's outlet is
 * above its set pressure (0 when it is boosting). Read from the analysis's per-device losses.
 */
function deviceHolds(doc: SystemDocument, stages: StageResults, segIndex: Map<string, number>): Map<number, Hold> {
  const out = new Map<number, Hold>();
  for (const d of doc.devices) {
    const isPrv = d.kind === 'prv' && d.prv !== undefined;
    const isVsBooster = d.kind === 'booster-pump' && d.boost !== undefined && 'control' in d.boost && d.boost.control === 'variable-speed';
    const e = segIndex.get(d.segmentId);
    if ((!isPrv && !isVsBooster) || e === undefined) continue;
    const devices = stages.hyd.devices[e];
    let p = stages.hyd.inletPa[e];
    for (const r of devices) {
      if (r.deviceId === d.id) break;
      p -= r.lossPa;
    }
    const result = devices.find((r) => r.deviceId === d.id);
    if (!result) continue;
    const outlet = p - result.lossPa;
    // The device's own loss at this flow, in SI (the document's units at the edge).
    const flow = stages.demand.designFlowM3s[e];
    const own = d.loss.kind === 'fixed' ? (flow > 0 ? toSI('pressure', d.loss.loss, doc.unitSystem) : 0) : ownCurveLossPa(d.loss.points, flow, doc.unitSystem);
    if (isPrv) {
      const target =
        toSI('pressure', d.prv!.setPressure, doc.unitSystem) -
        (toSI('pressure', d.prv!.falloffPerFlow, doc.unitSystem) / toSI('flow', 1, doc.unitSystem)) * flow;
      out.set(e, { kind: 'prv', holdSlackPa: p - own - target });
    } else {
      const set = toSI('pressure', (d.boost as { setPressure: number }).setPressure, doc.unitSystem);
      out.set(e, { kind: 'booster', idleExcessPa: Math.max(0, outlet - set) });
    }
  }
  return out;
}

/** A device's own loss from its curve at a flow (m³/s), Pa: the analysis's own curve reading (devices/lossCurve.ts). */
function ownCurveLossPa(points: readonly { flow: number; loss: number }[], flowSI: number, system: SystemDocument['unitSystem']): number {
  return lossCurveAt(
    points.map((q) => ({ flowM3s: toSI('flow', q.flow, system), lossPa: toSI('pressure', q.loss, system) })),
    flowSI,
  ).lossPa;
}

/**
 * The probes: one copy of a segment per size to measure, each a dead-end twin hung from the
 * source node, level, carrying the segment's design flow (fixed by `flowOverride`), fittings and
 * material at the size measured, without size-change loss. A segment's friction and fitting loss
 * depend only on these (the analysis adds nothing for where a segment hangs except the size
 * change, which is left out here), so one small analysis measures every size of every segment;
 * the rest of the tree, its devices and typical units are left out.
 */
function probeDocument(doc: SystemDocument, jobs: readonly { seg: ProbeSegment; size: string; flow: number; k: number }[]): SystemDocument {
  const sourceNode = doc.nodes.find((n) => n.id === doc.source.nodeId)!;
  const twins = jobs.map(({ seg: s, size, flow, k }) => {
    return {
      ...s,
      id: probeId(s.id, k),
      label: undefined,
      from: sourceNode.id,
      to: probeId(s.to, k),
      size,
      rise: 0,
      flowOverride: flow,
      reducerAuto: false,
      sizeLocked: undefined,
    };
  });
  const twinNodes = twins.map((t) => ({ id: t.to, fixtureGroups: [], checkedFixtures: [] }));
  return {
    ...doc,
    placements: undefined,
    unitTypes: undefined,
    devices: [],
    nodes: [{ ...sourceNode, fixtureGroups: [], checkedFixtures: [], continuousDemand: undefined }, ...twinNodes],
    segments: twins,
  };
}

function probeId(id: string, k: number): string {
  return `${id}#size-${k}`;
}

function withSizes(doc: SystemDocument, free: Map<number, Free>, chosen: Map<number, number>): SystemDocument {
  const segments = doc.segments.slice();
  for (const [e, k] of chosen) {
    const fr = free.get(e)!;
    if (segments[fr.docIndex].size !== fr.sizes[k]) segments[fr.docIndex] = { ...segments[fr.docIndex], size: fr.sizes[k] };
  }
  return { ...doc, segments };
}

interface DescribeInput {
  doc: SystemDocument;
  base: StageResults;
  segIndex: Map<string, number>;
  free: Map<number, Free>;
  locked: Set<string>;
  selected: Set<string> | null;
  chosen: Map<number, number> | null;
  /** free segment → index of its governing fixture */
  governing: Map<number, number>;
  fixtures: FixtureRow[];
  after: StageResults | null;
}

/** The per-segment answer: sizes before and after, why, velocities, and the worst fixture downstream. */
function describe({ doc, base, segIndex, free, locked, selected, chosen, governing, fixtures, after }: DescribeInput): SegmentSizing[] {
  // The worst fixture downstream of each segment (least margin after; before when nothing was sized).
  const worst = new Map<number, number>();
  const marginOf = (i: number) => (after ? after.checks.fixtures[i].marginPa : fixtures[i].margin);
  fixtures.forEach((f, i) => {
    for (const e of f.path) {
      const j = worst.get(e);
      if (j === undefined || marginOf(i) < marginOf(j)) worst.set(e, i);
    }
  });
  return doc.segments.map((s) => {
    const e = segIndex.get(s.id);
    const fr = e === undefined ? undefined : free.get(e);
    const before = s.size ?? null;
    const w = e === undefined ? undefined : worst.get(e);
    const velocityPass = e === undefined ? undefined : base.checks.velocityPass[e];
    const isFree = fr !== undefined && !locked.has(s.id) && !(selected && !selected.has(s.id));
    const k = isFree ? (chosen?.get(e!) ?? 0) : 0;
    const g = isFree && k > 0 ? governing.get(e!) : undefined;
    return {
      segmentId: s.id,
      label: s.label ?? null,
      material: s.material ?? null,
      before,
      velocityBefore: e === undefined ? 0 : base.hyd.velocity[e],
      velocityAfter: after && e !== undefined ? after.hyd.velocity[e] : null,
      velocityLimit: e === undefined ? null : base.checks.velocityLimitMs[e],
      worstFixture: worstFixtureOf(fixtures, w, after),
      after: isFree && chosen ? fr.sizes[k] : before,
      governing: locked.has(s.id)
        ? 'locked'
        : !isFree
          ? 'unchanged'
          : g !== undefined
            ? { fixtureId: fixtures[g].id, fixtureLabel: fixtures[g].label }
            : fr.velocityRemoved
              ? 'velocity'
              : 'smallest',
      velocityMet: isFree ? fr.velocityMet : velocityPass !== false,
    };
  });
}

function minOf(values: number[]): number | null {
  return values.length ? Math.min(...values) : null;
}
