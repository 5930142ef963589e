/**
 * Stage 6b: worst-case static pressure (no flow). The hydraulics stage carries the high static
 * pressure along the tree with every device at its no-flow state (a PRV at its set pressure, a
 * constant-speed booster at its shutoff gain, a variable-speed booster at its set discharge
 * pressure); this stage reports the cases a signed design must consider:
 *
 * - Boosters: the gains counted (design and shutoff), and whether the shutoff was assumed.
 * - A PRV that fails open: per PRV, the high static pressure downstream with that valve passing
 *   its inlet pressure, compared with the maximum static pressure (80 psi, IPC 604.8 / UPC 608.2 /
 *   IRC P2903.3.1 by default). A PRV that fails open is a known failure mode; codes require the
 *   valve but do not assume it never fails, so this is a caution, not a failed check.
 * - Pipe ratings: the highest static pressure each catalog pipe (material and size) sees, against
 *   its published working-pressure rating at the water temperature (catalog/pressureRatings.ts
 *   names each table). Above the rating is a failed check.
 * - Minimum static pressure at the highest checked fixture, where the criteria set a minimum
 *   (the designer's adopted value; none by default): the low static pressure there, the lowest the
 *   supply gives, after the climb. Below it is a failed check.
 */
import { pressureRating } from '../catalog/pressureRatings';
import { MATERIALS, type MaterialId } from '../catalog/materials';
import { fromSI, G } from '../units';
import { makeWarning, type EngineWarning } from '../warnings';
import type { SiModel } from './input';
import type { Topology } from './topology';
import type { HydraulicsResult } from './hydraulics';
import type { ElevationResult } from './elevations';
import type { StaticChecks } from './types';
import { formatPressure, nodeName, segmentLabel } from './names';

export interface StaticChecksResult {
  /** In the document's units (the Analysis field). */
  display: StaticChecks;
  /** Failed checks added by this stage (pipe ratings, minimum static at the highest fixture). */
  failures: number;
  pipeRatingsPass: boolean;
  minStaticPass: boolean;
}

export function runStaticChecks(model: SiModel, topo: Topology, hyd: HydraulicsResult, elev: ElevationResult, warnings: EngineWarning[]): StaticChecksResult {
  const sys = model.unitSystem;
  const toDoc = (pa: number) => fromSI('pressure', pa, sys);
  let failures = 0;

  // Which nodes serve fixtures (the static maximum applies there, as in checks.ts).
  const serves = new Uint8Array(model.nodeIds.length);
  for (let i = 0; i < model.nodeIds.length; i++) {
    serves[i] = model.servesFixtures[i];
  }

  // Boosters
  const boosters: StaticChecks['boosters'] = [];
  {
    for (const d of model.devicesInSegmentOrder) {
      if (!d.boost) continue;
      const g = hyd.boosterGains.get(d.id) ?? { designPa: 0, shutoffPa: 0 };
      boosters.push({
        deviceId: d.id,
        label: d.label,
        control: d.boost.control,
        designGain: toDoc(g.designPa),
        shutoffGain: toDoc(g.shutoffPa),
        assumed: d.boost.control === 'constant-speed' && d.boost.assumed,
      });
    }
  }

  // PRV fails open
  const max = model.criteria.maxStaticPressurePa;
  const prvFailOpen: StaticChecks['prvFailOpen'] = [];
  let scratch: FailedOpenScratch | null = null;
  {
    for (const d of model.devicesInSegmentOrder) {
      if (!d.prv) continue;
      const segIdx = d.segIdx;
      scratch ??= { high: new Float64Array(model.nodeIds.length), nodes: new Int32Array(model.nodeIds.length), stack: new Int32Array(model.seg.count) };
      const below = failedOpenBelow(model, topo, hyd, elev, d.id, segIdx, scratch);
      const high = below.high;
      let over = 0;
      let worst = -1;
      for (let k = 0; k < below.count; k++) {
        const n = below.nodes[k];
        if (!serves[n]) continue;
        if (worst === -1 || high[n] > high[worst]) worst = n;
        if (high[n] > max) over++;
      }
      const worstStatic = worst === -1 ? high[model.seg.to[segIdx]] : high[worst];
      const excess = Math.max(0, worstStatic - max);
      prvFailOpen.push({
        deviceId: d.id,
        label: d.label,
        nodesOverMax: over,
        worstNodeId: worst === -1 ? null : model.nodeIds[worst],
        worstNodeLabel: worst === -1 ? null : (model.nodeLabels[worst] ?? nodeName(model, worst)),
        worstStatic: toDoc(worstStatic),
        maxStaticPressure: toDoc(max),
        excess: toDoc(excess),
      });
      if (over > 0) {
        const w = makeWarning(
          'prv-fail-open-over-max',
          'device',
          d.id,
          `If "${d.label}" fails open, ${over} ${over === 1 ? 'node that serves fixtures' : 'nodes that serve fixtures'} would see up to ${formatPressure(worstStatic, sys)} static, ${formatPressure(excess, sys)} over the ${formatPressure(max, sys)} maximum (highest at ${nodeName(model, worst)}).`,
        );
        w.elementLabel = d.label;
        warnings.push(w);
      }
    }
  }

  // Pipe ratings: per catalog material and size, the segment with the highest static pressure.
  // By material, then size (the ids' own strings, no key built per segment); `worstBySize` keeps
  // the pairs in the order first met, which is the order of the list.
  const worstByMaterial = new Map<string, Map<string, { s: number; pa: number }>>();
  const worstBySize: { s: number; pa: number }[] = [];
  const seg = model.seg;
  for (let s = 0; s < seg.count; s++) {
    const materialId = seg.materialId[s];
    if (materialId === null) continue;
    const pa = Math.max(hyd.segStaticHighInletPa[s], hyd.nodeStaticHighPa[seg.to[s]]);
    let bySize = worstByMaterial.get(materialId);
    if (bySize === undefined) {
      bySize = new Map();
      worstByMaterial.set(materialId, bySize);
    }
    const prev = bySize.get(seg.nominalSizeKey[s]);
    if (prev === undefined) {
      const worst = { s, pa };
      bySize.set(seg.nominalSizeKey[s], worst);
      worstBySize.push(worst);
    } else if (pa > prev.pa) {
      prev.s = s;
      prev.pa = pa;
    }
  }
  const pipeRatings: StaticChecks['pipeRatings'] = [];
  const unrated = new Set<string>();
  let pipeRatingsPass = true;
  for (const { s, pa } of worstBySize) {
    const materialId = seg.materialId[s]!;
    const sizeKey = seg.nominalSizeKey[s];
    const material = MATERIALS[materialId as MaterialId];
    const materialLabel = `${material?.label ?? materialId} ${sizeKey}`;
    const rating = pressureRating(materialId, sizeKey, model.water.temperatureC);
    if (rating === null) {
      unrated.add(material?.label ?? materialId);
      continue;
    }
    const pass = pa <= rating.ratingPa;
    pipeRatings.push({
      segmentId: seg.id[s],
      label: segmentLabel(model, s),
      materialLabel,
      ratingPressure: toDoc(rating.ratingPa),
      highestStatic: toDoc(pa),
      pass,
      source: rating.source,
      verified: rating.verified,
    });
    if (!pass) {
      failures++;
      pipeRatingsPass = false;
      const w = makeWarning(
        'static-over-pipe-rating',
        'segment',
        seg.id[s],
        `${materialLabel}: up to ${formatPressure(pa, sys)} static, rated ${formatPressure(rating.ratingPa, sys)} at the water temperature (${rating.source}).`,
      );
      warnings.push(w);
    }
  }
  if (unrated.size > 0) {
    warnings.push(makeWarning('pipe-rating-unknown', 'system', model.doc.id, `No published rating in the catalog for: ${[...unrated].join(', ')}.`));
  }

  // Minimum static at the highest checked fixture.
  let minStaticAtHighestFixture: StaticChecks['minStaticAtHighestFixture'] = null;
  let minStaticPass = true;
  const min = model.criteria.minStaticPressurePa;
  if (min !== undefined && model.fixtures.length > 0) {
    let highest = 0;
    for (let k = 1; k < model.fixtures.length; k++) {
      if (model.elevationM[model.fixtures[k].nodeIdx] > model.elevationM[model.fixtures[highest].nodeIdx]) highest = k;
    }
    const fx = model.fixtures[highest];
    const low = hyd.nodeStaticLowPa[fx.nodeIdx];
    const pass = low >= min;
    minStaticAtHighestFixture = { fixtureId: fx.id, label: fx.label, staticLow: toDoc(low), minimum: toDoc(min), pass };
    if (!pass) {
      failures++;
      minStaticPass = false;
      const w = makeWarning(
        'static-below-min-at-fixture',
        'checked-fixture',
        fx.id,
        `${fx.label}: ${formatPressure(low, sys)} low static, the criteria ask for at least ${formatPressure(min, sys)}.`,
      );
      w.elementLabel = fx.label;
      warnings.push(w);
    }
  }

  return {
    display: { boosters, prvFailOpen, pipeRatings, minStaticAtHighestFixture },
    failures,
    pipeRatingsPass,
    minStaticPass,
  };
}

/** Work arrays of failedOpenBelow, allocated once per analysis. `stack`: segments still to walk (each once: a tree). */
interface FailedOpenScratch {
  high: Float64Array;
  nodes: Int32Array;
  stack: Int32Array;
}

/**
 * High static pressure below one PRV passing its inlet pressure (failed open), the other devices
 * as in the hydraulics stage (hydraulics.ts, same operations in the same order). Above the valve's
 * segment nothing changes, so the walk starts from the hydraulics stage's high static at the
 * segment's upstream node and covers only the subtree below it: `nodes[0 … count − 1]` are the
 * segment's downstream node and every node below it, `high` holds their pressures (the other
 * entries are left from an earlier valve's walk and are not read).
 */
function failedOpenBelow(
  model: SiModel,
  topo: Topology,
  hyd: HydraulicsResult,
  elev: ElevationResult,
  failedId: string,
  segIdx: number,
  scratch: FailedOpenScratch,
): { high: Float64Array; nodes: Int32Array; count: number } {
  const rhoG = model.water.density * G;
  const { high, nodes, stack } = scratch;
  let top = 0;
  let count = 0;
  stack[top++] = segIdx;
  const { from, to } = model.seg;
  high[from[segIdx]] = hyd.nodeStaticHighPa[from[segIdx]];
  while (top > 0) {
    const s = stack[--top];
    const below = to[s];
    let h = high[from[s]];
    const devs = model.devicesBySeg[s];
    for (let j = 0; j < devs.length; j++) {
      const d = devs[j];
      if (d.prv && d.id !== failedId) h = Math.min(h, d.prv.setPa);
      const b = d.boost;
      if (b && b.control === 'constant-speed') h += b.shutoffPa;
      else if (b) h = Math.max(h, b.setPa);
    }
    high[below] = h - rhoG * elev.riseM[s];
    nodes[count++] = below;
    for (let c = topo.childStart[below]; c < topo.childStart[below + 1]; c++) stack[top++] = topo.childSegs[c];
  }
  return { high, nodes, count };
}
