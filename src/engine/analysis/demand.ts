/**
 * Stage 4: demand. One backward pass over the breadth-first order accumulates, for every
 * segment, the fixture units, continuous demand and flush-valve presence downstream; the
 * design flow follows from Hunter's curve (IPC Table E103.3(3), via src/engine/demand) or
 * Hunter's binomial method, plus the continuous demand; a segment's flow override replaces
 * the whole figure for that segment only.
 */
import { hunterDesignFlow, hunterBinomialDemand, type DemandCurve } from '../demand';
import { makeGroupedWarning, type EngineWarning } from '../warnings';
import type { SiModel } from './input';
import type { Topology } from './topology';

export interface DemandResult {
  wsfu: Float64Array;
  continuousM3s: Float64Array;
  designFlowM3s: Float64Array;
  curve: (DemandCurve | null)[];
  basis: ('fixture-units' | 'binomial' | 'override' | 'continuous-only' | 'none')[];
  source: { designFlowM3s: number; wsfu: number; curve: DemandCurve | null };
}

interface BinomialKey {
  count: number;
  flowM3s: number;
  durationS: number;
  recurrenceS: number;
}

export function computeDemand(model: SiModel, topo: Topology, warnings: EngineWarning[]): DemandResult {
  const nNodes = model.nodeIds.length;
  const seg = model.seg;
  const nSegs = seg.count;
  const criteria = model.criteria;
  const binomial = criteria.demandMethod === 'hunter-binomial';

  // Per node: own load, then (after the backward pass) the load of everything downstream of it.
  const nodeWsfu = new Float64Array(nNodes);
  const nodeCont = new Float64Array(nNodes);
  const nodeValves = new Float64Array(nNodes);
  const nodeBinomial: Map<string, BinomialKey>[] | null = binomial ? new Array(nNodes) : null;
  // Each node's own load (its groups summed in order when the model was read, input.ts).
  nodeWsfu.set(model.nodeWsfu);
  nodeCont.set(model.continuousM3s);
  nodeValves.set(model.nodeFlushValves);
  if (nodeBinomial) {
    for (let i = 0; i < nNodes; i++) {
      const m = new Map<string, BinomialKey>();
      for (const g of model.groupsByNode[i]) addBinomial(m, g.count, g.usage!);
      nodeBinomial[i] = m;
    }
  }
  for (let k = topo.order.length - 1; k >= 0; k--) {
    const s = topo.order[k];
    const from = seg.from[s];
    const to = seg.to[s];
    nodeWsfu[from] += nodeWsfu[to];
    nodeCont[from] += nodeCont[to];
    nodeValves[from] += nodeValves[to];
    if (nodeBinomial) for (const v of nodeBinomial[to].values()) addBinomial(nodeBinomial[from], v.count, v);
  }

  const wsfu = new Float64Array(nSegs);
  const continuousM3s = new Float64Array(nSegs);
  const designFlowM3s = new Float64Array(nSegs);
  const curve: (DemandCurve | null)[] = new Array(nSegs);
  const basis: DemandResult['basis'] = new Array(nSegs);

  // Many segments carry the same load (repeated floors): read the table once per load and curve.
  const extrapolatedIds: string[] = [];
  const overrideIds: string[] = [];
  const noDemandIds: string[] = [];
  const tableCache: Record<DemandCurve, Map<number, { flowM3s: number; extrapolated: boolean }>> = {
    'flush-tank': new Map(),
    'flush-valve': new Map(),
  };
  const flowFor = (
    elementId: string,
    units: number,
    cont: number,
    valves: number,
    groups: Map<string, BinomialKey> | null,
  ): { q: number; curve: DemandCurve | null; basis: DemandResult['basis'][number] } => {
    if (!(units > 0)) return { q: cont, curve: null, basis: cont > 0 ? 'continuous-only' : 'none' };
    if (groups) {
      const q = hunterBinomialDemand([...groups.values()]);
      return { q: q + cont, curve: null, basis: 'binomial' };
    }
    const c: DemandCurve = criteria.demandCurve === 'auto' ? (valves > 0 ? 'flush-valve' : 'flush-tank') : criteria.demandCurve;
    const byUnits = tableCache[c];
    let h = byUnits === undefined ? undefined : byUnits.get(units);
    if (h === undefined) {
      h = hunterDesignFlow(units, c);
      byUnits?.set(units, h);
    }
    if (h.extrapolated) extrapolatedIds.push(elementId);
    return { q: h.flowM3s + cont, curve: c, basis: 'fixture-units' };
  };

  for (let s = 0; s < nSegs; s++) {
    const to = seg.to[s];
    wsfu[s] = nodeWsfu[to];
    continuousM3s[s] = nodeCont[to];
    const r = flowFor(seg.id[s], nodeWsfu[to], nodeCont[to], nodeValves[to], nodeBinomial ? nodeBinomial[to] : null);
    curve[s] = r.curve;
    const override = seg.flowOverrideM3s[s];
    if (!Number.isNaN(override)) {
      designFlowM3s[s] = override;
      basis[s] = 'override';
      overrideIds.push(seg.id[s]);
    } else {
      designFlowM3s[s] = r.q;
      basis[s] = r.basis;
    }
    if (!(designFlowM3s[s] > 0)) noDemandIds.push(seg.id[s]);
  }

  // The source delivers the demand of the whole tree: one segment leaving it carries the
  // source's flow (its override included); several are combined through the curve again.
  const src = model.source.nodeIdx;
  const roots: number[] = [];
  for (let s = 0; s < nSegs; s++) if (seg.from[s] === src) roots.push(s);
  let source: DemandResult['source'];
  if (roots.length === 1) {
    source = { designFlowM3s: designFlowM3s[roots[0]], wsfu: wsfu[roots[0]], curve: curve[roots[0]] };
  } else {
    const r = flowFor(model.nodeIds[src], nodeWsfu[src], nodeCont[src], nodeValves[src], nodeBinomial ? nodeBinomial[src] : null);
    source = { designFlowM3s: r.q, wsfu: nodeWsfu[src], curve: r.curve };
  }
  if (extrapolatedIds.length > 0) {
    warnings.push(
      makeGroupedWarning(
        'demand-table-extrapolated',
        'segment',
        extrapolatedIds,
        `${extrapolatedIds.length} ${extrapolatedIds.length === 1 ? 'segment' : 'segments'} below the first row of the table (its flow held) or beyond its last row`,
      ),
    );
  }
  if (overrideIds.length > 0) warnings.push(makeGroupedWarning('flow-override-used', 'segment', overrideIds));
  if (noDemandIds.length > 0) warnings.push(makeGroupedWarning('segment-no-demand', 'segment', noDemandIds));
  return { wsfu, continuousM3s, designFlowM3s, curve, basis, source };
}

function addBinomial(m: Map<string, BinomialKey>, count: number, u: Omit<BinomialKey, 'count'>): void {
  const key = `${u.flowM3s}|${u.durationS}|${u.recurrenceS}`;
  const e = m.get(key);
  if (e) e.count += count;
  else m.set(key, { count, flowM3s: u.flowM3s, durationS: u.durationS, recurrenceS: u.recurrenceS });
}
