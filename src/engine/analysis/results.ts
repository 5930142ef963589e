/**
 * The per-element result objects (segments, nodes, fixtures), in SI and in the document's units,
 * built from the stage arrays when a consumer first reads them. An analysis of a 5,000-segment
 * building holds about 20,000 such objects; the live client reads a few fixtures and one ledger,
 * the server serialises everything once. Building them on first read (and only the copy that is
 * read) keeps the analysis itself to the computation, and nothing changes for a consumer: each is
 * an ordinary enumerable property (JSON, spread, structured clone and equality all read it),
 * built once and then the same array on every read, and assignable like any other field.
 *
 * The numbers are exactly those the analysis computed: an SI value is the stage array's value; a
 * display value is that value divided by its unit's factor (units.ts: pure scalings), as toDisplay
 * does it. The guard that no NaN or Infinity reaches a result runs at once over the stage arrays
 * (checkFinite), so a defect still throws inside the analysis, not at a later read.
 */
import { fromSI, toSI, type UnitSystem } from '../units';
import type { SiModel } from './input';
import type { Topology } from './topology';
import type { DemandResult } from './demand';
import type { HydraulicsResult } from './hydraulics';
import type { ChecksResult } from './checks';
import { assertFiniteDeep } from './finite';
import { defineLazy } from './lazy';
import type { AnalysisResults, DeviceLossResult, FixtureResult, NodeResult, SegmentResult, SourceResult } from './types';

/** The stage results the result objects are read from. */
export interface StageResults {
  model: SiModel;
  topo: Topology;
  demand: DemandResult;
  hyd: HydraulicsResult;
  checks: ChecksResult;
}

/** Divisors from SI to the values shown (1 for SI itself: v / 1 is v exactly). */
interface Scale {
  pressure: number;
  length: number;
  diameter: number;
  flow: number;
  velocity: number;
  elevation: (m: number) => number;
}

const SI_SCALE: Scale = { pressure: 1, length: 1, diameter: 1, flow: 1, velocity: 1, elevation: (m) => m };

function displayScale(sys: UnitSystem): Scale {
  // Pure scalings (units.ts): one factor per quantity; fromSI(q, v) = v / factor.
  return {
    pressure: toSI('pressure', 1, sys),
    length: toSI('length', 1, sys),
    diameter: toSI('diameter', 1, sys),
    flow: toSI('flow', 1, sys),
    velocity: toSI('velocity', 1, sys),
    elevation: (m) => fromSI('elevation', m, sys),
  };
}

/**
 * The SI results and their display copies. `source` is built at once (one object); segments,
 * nodes and fixtures of each are built on their first read. Throws (checkFinite) when a stage
 * produced a non-finite number.
 */
export function buildResults(stages: StageResults): { si: AnalysisResults; display: AnalysisResults } {
  // One path array per fixture, shared by the SI and the display result.
  let paths: string[][] | null = null;
  const fixturePaths = (): string[][] => (paths ??= stages.model.fixtures.map((fx) => pathTo(fx.nodeIdx, stages.topo, stages.model)));
  const si = resultSet(stages, SI_SCALE, fixturePaths);
  // A non-finite number is an engine defect: the full walk of the SI results names the first one (and throws).
  if (!allFinite(stages)) assertFiniteDeep(si);
  return { si, display: resultSet(stages, displayScale(stages.model.unitSystem), fixturePaths) };
}

function resultSet(stages: StageResults, scale: Scale, paths: () => string[][]): AnalysisResults {
  const out = { source: sourceResult(stages, scale) } as AnalysisResults;
  defineLazy(out, 'segments', () => segmentResults(stages, scale));
  defineLazy(out, 'nodes', () => nodeResults(stages, scale));
  defineLazy(out, 'fixtures', () => fixtureResults(stages, scale, paths()));
  return out;
}

function sourceResult({ model, demand, hyd }: StageResults, scale: Scale): SourceResult {
  const srcIdx = model.source.nodeIdx;
  return {
    nodeId: model.nodeIds[srcIdx],
    kind: model.source.kind,
    elevation: scale.elevation(model.elevationM[srcIdx]),
    designFlow: demand.source.designFlowM3s / scale.flow,
    pressureAtDesignFlow: hyd.source.pressurePa / scale.pressure,
    pressureBasis: hyd.source.basis,
    staticPressureLow: model.source.staticLowPa / scale.pressure,
    staticPressureHigh: model.source.staticHighPa / scale.pressure,
  };
}

function segmentResults({ model, topo, demand, hyd, checks }: StageResults, scale: Scale): SegmentResult[] {
  const seg = model.seg;
  const nSegs = seg.count;
  const { pressure: pF, length: lF, diameter: dF, flow: qF, velocity: vF } = scale;
  const out: SegmentResult[] = new Array(nSegs);
  for (let s = 0; s < nSegs; s++) {
    const parent = topo.parentSeg[s];
    const fittingsK = hyd.fittingsK[s];
    const sizeChangeK = hyd.sizeChangeK[s];
    const velocityLimit = checks.velocityLimitMs[s];
    const devs = hyd.devices[s];
    let devices: DeviceLossResult[];
    if (devs.length === 0) devices = [];
    else {
      devices = new Array(devs.length);
      for (let k = 0; k < devs.length; k++) {
        const d = devs[k];
        devices[k] = { deviceId: d.deviceId, kind: d.kind, label: d.label, loss: d.lossPa / pF, extrapolated: d.extrapolated };
      }
    }
    out[s] = {
      id: seg.id[s],
      label: seg.label[s],
      from: model.nodeIds[seg.from[s]],
      to: model.nodeIds[seg.to[s]],
      parentSegmentId: parent === -1 ? null : seg.id[parent],
      wsfu: demand.wsfu[s],
      demandCurve: demand.curve[s],
      flowBasis: demand.basis[s],
      designFlow: demand.designFlowM3s[s] / qF,
      innerDiameter: seg.innerDiameterM[s] / dF,
      length: seg.lengthM[s] / lF,
      rise: hyd.riseM[s] / lF,
      velocity: hyd.velocity[s] / vF,
      reynolds: hyd.reynolds[s],
      frictionFactor: hyd.frictionFactor[s],
      regime: hyd.regime[s],
      fittingsK,
      sizeChangeK,
      totalK: fittingsK + sizeChangeK,
      frictionLoss: hyd.frictionLossPa[s] / pF,
      fittingLoss: hyd.fittingLossPa[s] / pF,
      riseLoss: hyd.riseLossPa[s] / pF,
      deviceLoss: hyd.deviceLossPa[s] / pF,
      devices,
      inletPressure: hyd.inletPa[s] / pF,
      outletPressure: hyd.outletPa[s] / pF,
      velocityLimit: velocityLimit === null ? null : velocityLimit / vF,
      velocityPass: checks.velocityPass[s],
      developedLength: hyd.nodeDevelopedLengthM[seg.to[s]] / lF,
    };
  }
  return out;
}

function nodeResults({ model, topo, hyd, checks }: StageResults, scale: Scale): NodeResult[] {
  const nNodes = model.nodeIds.length;
  const { pressure: pF, length: lF } = scale;
  const out: NodeResult[] = new Array(nNodes);
  for (let i = 0; i < nNodes; i++) {
    const feed = topo.feedSeg[i];
    out[i] = {
      id: model.nodeIds[i],
      label: model.nodeLabels[i],
      elevation: scale.elevation(model.elevationM[i]),
      pressure: hyd.nodePressurePa[i] / pF,
      staticPressureHigh: hyd.nodeStaticHighPa[i] / pF,
      staticPressureLow: hyd.nodeStaticLowPa[i] / pF,
      staticPass: checks.nodeStaticPass[i],
      developedLength: hyd.nodeDevelopedLengthM[i] / lF,
      feedSegmentId: feed === -1 ? null : model.seg.id[feed],
    };
  }
  return out;
}

function fixtureResults({ model, hyd, checks }: StageResults, scale: Scale, paths: string[][]): FixtureResult[] {
  const nFix = model.fixtures.length;
  const { pressure: pF, length: lF, flow: qF } = scale;
  const out: FixtureResult[] = new Array(nFix);
  for (let k = 0; k < nFix; k++) {
    const fx = model.fixtures[k];
    const c = checks.fixtures[k];
    out[k] = {
      id: fx.id,
      nodeId: model.nodeIds[fx.nodeIdx],
      fixtureTypeId: fx.fixtureTypeId,
      label: fx.label,
      residual: c.residualPa / pF,
      required: fx.requiredPa / pF,
      margin: c.marginPa / pF,
      pass: c.pass,
      flowRate: fx.flowRateM3s / qF,
      elevation: scale.elevation(model.elevationM[fx.nodeIdx]),
      developedLength: hyd.nodeDevelopedLengthM[fx.nodeIdx] / lF,
      path: paths[k],
    };
  }
  return out;
}

function pathTo(nodeIdx: number, topo: Topology, model: SiModel): string[] {
  const path: string[] = [];
  let n = nodeIdx;
  while (topo.feedSeg[n] !== -1) {
    const s = topo.feedSeg[n];
    path.push(model.seg.id[s]);
    n = model.seg.from[s];
  }
  return path.reverse();
}

/**
 * The last guard of the pipeline, over the stage arrays: Σ x·0 over every number a result
 * carries is 0 when all are finite and NaN as soon as one is not (the caller then walks the SI
 * results, finite.ts, which names the first one). A non-finite elevation throws here, from the
 * unit conversion, as it did when the display copies were built at once.
 */
function allFinite(stages: StageResults): boolean {
  const { model, demand, hyd, checks } = stages;
  let nonFinite = 0;
  const srcIdx = model.source.nodeIdx;
  nonFinite += (model.elevationM[srcIdx] + demand.source.designFlowM3s + hyd.source.pressurePa + model.source.staticLowPa + model.source.staticHighPa) * 0;
  const seg = model.seg;
  for (let s = 0; s < seg.count; s++) {
    const devs = hyd.devices[s];
    for (let k = 0; k < devs.length; k++) nonFinite += devs[k].lossPa * 0;
    nonFinite +=
      (demand.wsfu[s] +
        demand.designFlowM3s[s] +
        seg.innerDiameterM[s] +
        seg.lengthM[s] +
        hyd.riseM[s] +
        hyd.velocity[s] +
        hyd.reynolds[s] +
        hyd.frictionFactor[s] +
        hyd.fittingsK[s] +
        hyd.sizeChangeK[s] +
        hyd.frictionLossPa[s] +
        hyd.fittingLossPa[s] +
        hyd.riseLossPa[s] +
        hyd.deviceLossPa[s] +
        hyd.inletPa[s] +
        hyd.outletPa[s] +
        hyd.nodeDevelopedLengthM[seg.to[s]] +
        (checks.velocityLimitMs[s] ?? 0)) *
      0;
  }
  const sys = model.unitSystem;
  for (let i = 0; i < model.nodeIds.length; i++) {
    const elevation = model.elevationM[i];
    if (!Number.isFinite(elevation)) fromSI('elevation', elevation, sys);
    nonFinite += (hyd.nodePressurePa[i] + hyd.nodeStaticHighPa[i] + hyd.nodeStaticLowPa[i] + hyd.nodeDevelopedLengthM[i]) * 0;
  }
  for (let k = 0; k < model.fixtures.length; k++) {
    const fx = model.fixtures[k];
    const c = checks.fixtures[k];
    nonFinite += (c.residualPa + fx.requiredPa + c.marginPa + fx.flowRateM3s) * 0;
  }
  return nonFinite === 0;
}
