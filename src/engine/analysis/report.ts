/**
 * Stage 8: report. Gathers the stage results into the SI result objects, then converts a copy
 * to the document's unit system. No computation happens here beyond unit conversion.
 */
import { fromSI, toSI, UNIT_LABELS, type UnitSystem } from '../units';
import { FRICTION_METHODS } from '../friction';
import type { EngineWarning } from '../warnings';
import type { SiModel } from './input';
import type { Topology } from './topology';
import type { DemandResult } from './demand';
import type { HydraulicsResult } from './hydraulics';
import type { ChecksResult } from './checks';
import { assertFiniteDeep } from './finite';
import type { ElevationResult } from './elevations';
import type { StaticChecksResult } from './staticChecks';
import { formatPressure, nodeName, plural, segmentName } from './names';
import type {
  Analysis,
  IncompleteReason,
  AnalysisResults,
  DeviceLossResult,
  FixtureResult,
  MethodUsed,
  NodeResult,
  SegmentResult,
  SourceResult,
} from './types';

/** 0.2.0: document version 2 (positions, boosters by curve), incomplete reasons, worst-case static checks. */
export const ENGINE_VERSION = '0.2.0';

const FITTING_METHOD_LABELS: Record<string, MethodUsed> = {
  crane: {
    id: 'crane',
    label: 'K = N·f_T, with f_T by nominal size',
    source: 'Crane Co., Technical Paper No. 410, Flow of Fluids (2009); each fitting type names its own source',
  },
  'hooper-2k': {
    id: 'hooper-2k',
    label: 'Two-constant K = K1/Re + K∞·(1 + 1/D[in])',
    source: 'W. B. Hooper, Chemical Engineering 88(17), 96–100 (1981)',
  },
  'darby-3k': {
    id: 'darby-3k',
    label: 'Three-constant K = K1/Re + Ki·(1 + Kd/D[in]^0.3)',
    source: 'R. Darby, Chemical Engineering 106(7) (1999); Darby, Chemical Engineering Fluid Mechanics, 2nd ed. (2001)',
  },
  'equivalent-length': {
    id: 'equivalent-length',
    label: 'Equivalent length of pipe, K = f·Le/D',
    source: 'IPC (2018) Table E103.3(5) (via the fittings catalog)',
  },
};

/**
 * The verdict rule: green only when every checked fixture was computed from a complete
 * description and every check is met. Incomplete wins over fail: a failing number computed from
 * an incomplete description is not yet a finding.
 */
function verdictOfChecks(model: SiModel, topo: Topology, checks: ChecksResult, elev: ElevationResult, stat: StaticChecksResult): Analysis['verdict'] {
  const incomplete = incompleteReasons(model, topo, checks, elev);
  const allFixturesPass = checks.fixtures.every((c) => c.pass);
  const allVelocitiesPass = checks.velocityPass.every((v) => v !== false);
  const allStaticPass = checks.nodeStaticPass.every((v) => v !== false) && stat.pipeRatingsPass && stat.minStaticPass;
  const failures = checks.failures + stat.failures;
  const status = incomplete.length > 0 ? 'incomplete' : failures > 0 ? 'fail' : 'pass';
  return { status, incomplete, allFixturesPass, allVelocitiesPass, allStaticPass, failures };
}

/** At most this many reasons of one code are listed one by one; the rest are counted in one more. */
const MAX_REASONS_PER_CODE = 50;

/**
 * Why the verdict cannot be pass or fail yet. Each reason names the element by the label the user
 * typed (or a plain description) and says what to enter. The codes:
 *   no-checked-fixtures      — nothing is compared with a minimum flow pressure;
 *   source-pressure-missing  — the supply static pressure (low or high) is zero or not entered;
 *   source-basis-missing     — where the supply pressure comes from is not stated;
 *   fixture-unreachable      — a checked fixture's node is not connected to the source;
 *   part-unreachable         — other nodes or segments are not connected to the source;
 *   source-elevation-missing — the source node has neither an elevation nor a floor;
 *   node-elevation-missing   — a node has no elevation, no floor and no rise on its feed segment;
 *   segment-pipe-missing     — a segment has neither material and size nor custom pipe data;
 *   cold-system-missing, cold-system-not-cold, cold-node-missing, cold-analysis-missing,
 *   not-yet-resolved         — a hot system fed from a cold one whose supply could not be read
 *                              from it (hotWater/fedFrom.ts says why).
 * Values the engine had to assume (each also a reason, so the verdict is never green on them):
 *   - a node without a position is computed at its upstream node's elevation (a level run);
 *   - a source without a position is computed at elevation 0;
 *   - a segment without a pipe is computed with the pipe feeding it (3/4 in type L copper at the source);
 *   - booster-shutoff-missing: a booster given by one gain (version 1) is computed with a flat
 *     curve, shutoff gain = design gain, which may understate the static pressure at no flow.
 */
function incompleteReasons(model: SiModel, topo: Topology, checks: ChecksResult, elev: ElevationResult): IncompleteReason[] {
  const reasons: IncompleteReason[] = [];
  const src = model.doc.source;
  const sys = model.unitSystem;
  const counted = new Map<string, number>();
  const add = (r: IncompleteReason): void => {
    const n = (counted.get(r.code) ?? 0) + 1;
    counted.set(r.code, n);
    if (n <= MAX_REASONS_PER_CODE) reasons.push(r);
  };
  if (checks.fixtures.length === 0) {
    add({
      code: 'no-checked-fixtures',
      elementType: 'system',
      elementId: null,
      elementLabel: model.doc.name,
      message: 'No checked fixture: add at least the fixture you expect to be the most hydraulically remote.',
    });
  }
  if (!(src.staticPressureLow > 0) || !(src.staticPressureHigh > 0)) {
    add({
      code: 'source-pressure-missing',
      elementType: 'source',
      elementId: src.nodeId,
      elementLabel: 'the source',
      message: `The supply static pressure is not entered (low ${formatPressure(model.source.staticLowPa, sys)}, high ${formatPressure(model.source.staticHighPa, sys)}): enter both from the utility or a gauge reading.`,
    });
  }
  if (src.pressureBasis.trim() === '' || /^not entered/i.test(src.pressureBasis.trim())) {
    add({
      code: 'source-basis-missing',
      elementType: 'source',
      elementId: src.nodeId,
      elementLabel: 'the source',
      message: 'Where the supply pressure comes from (utility letter, flow test, gauge reading) is not stated.',
    });
  }
  const fedFrom = src.fedFrom;
  if (fedFrom && fedFrom.resolution?.status !== 'resolved') {
    add({
      code: fedFrom.resolution?.code ?? 'not-yet-resolved',
      elementType: 'source',
      elementId: src.nodeId,
      elementLabel: 'the hot-water supply',
      message: fedFrom.resolution?.message ?? 'The cold system feeding this hot system has not been read yet: its pressure at the heater feed is unknown.',
    });
  }
  if (elev.sourceMissing) {
    add({
      code: 'source-elevation-missing',
      elementType: 'node',
      elementId: src.nodeId,
      elementLabel: nodeName(model, model.source.nodeIdx),
      message: 'The source connection has no elevation or floor: enter its elevation (the datum of the building). It was computed at elevation 0.',
    });
  }
  if (topo.unreachedNodes.length > 0) {
    const unreached = new Uint8Array(model.nodeIds.length);
    for (const n of topo.unreachedNodes) unreached[n] = 1;
    for (const fx of model.fixtures) {
      if (!unreached[fx.nodeIdx]) continue;
      add({
        code: 'fixture-unreachable',
        elementType: 'checked-fixture',
        elementId: fx.id,
        elementLabel: fx.label,
        message: `The checked fixture "${fx.label}" is not connected to the source: connect ${nodeName(model, fx.nodeIdx)} with a segment.`,
      });
    }
  }
  if (topo.unreachedNodes.length > 0 || topo.unreachedSegments.length > 0) {
    const first = topo.unreachedNodes[0];
    add({
      code: 'part-unreachable',
      elementType: first !== undefined ? 'node' : 'segment',
      elementId: first !== undefined ? model.nodeIds[first] : model.segments[topo.unreachedSegments[0]].id,
      elementLabel: first !== undefined ? nodeName(model, first) : segmentName(model, topo.unreachedSegments[0]),
      message: `${plural(topo.unreachedNodes.length, 'node')} and ${plural(topo.unreachedSegments.length, 'segment')} are not connected to the source${first !== undefined ? `, starting with ${nodeName(model, first)}` : ''}: connect them or remove them.`,
    });
  }
  for (const { nodeIdx, segIdx } of elev.missing) {
    add({
      code: 'node-elevation-missing',
      elementType: 'node',
      elementId: model.nodeIds[nodeIdx],
      elementLabel: nodeName(model, nodeIdx),
      message: `${capitalise(nodeName(model, nodeIdx))} has no elevation: enter the rise of ${segmentName(model, segIdx)} (0 for a level run), or the node's elevation or floor. It was computed level with ${nodeName(model, model.segments[segIdx].from)}.`,
    });
  }
  for (const s of model.pipeMissing) {
    add({
      code: 'segment-pipe-missing',
      elementType: 'segment',
      elementId: model.segments[s].id,
      elementLabel: segmentName(model, s),
      message: `${capitalise(segmentName(model, s))} has no material and size: choose them (or enter custom pipe data). It was computed with the pipe feeding it.`,
    });
  }
  for (const devs of model.devicesBySeg) {
    for (const d of devs) {
      if (d.boost?.control !== 'constant-speed' || !d.boost.assumed) continue;
      add({
        code: 'booster-shutoff-missing',
        elementType: 'device',
        elementId: d.id,
        elementLabel: d.label,
        message: `The booster "${d.label}" is described by one gain (${formatPressure(d.boost.designPa, sys)}): enter its control and, for a constant-speed pump, its shutoff gain from the pump curve. The static check assumed no rise at shutoff.`,
      });
    }
  }
  for (const [code, n] of counted) {
    if (n > MAX_REASONS_PER_CODE) {
      reasons.push({ code, elementType: 'system', elementId: null, message: `…and ${n - MAX_REASONS_PER_CODE} more of the same kind.` });
    }
  }
  return reasons;
}

function capitalise(text: string): string {
  return text.length > 0 && text[0] !== '"' ? text[0].toUpperCase() + text.slice(1) : text;
}

export function assembleReport(
  model: SiModel,
  topo: Topology,
  demand: DemandResult,
  hyd: HydraulicsResult,
  checks: ChecksResult,
  elev: ElevationResult,
  stat: StaticChecksResult,
  warnings: EngineWarning[],
): Analysis {
  const { si, display } = buildResults(model, topo, demand, hyd, checks);
  const sys = model.unitSystem;
  const labels = UNIT_LABELS[sys];
  const criteria = model.criteria;
  const friction = FRICTION_METHODS[criteria.frictionMethod];
  return {
    engineVersion: ENGINE_VERSION,
    schemaVersion: model.doc.schemaVersion,
    systemId: model.doc.id,
    name: model.doc.name,
    service: model.service,
    unitSystem: sys,
    units: {
      pressure: labels.pressure,
      length: labels.length,
      elevation: labels.elevation,
      diameter: labels.diameter,
      flow: labels.flow,
      velocity: labels.velocity,
      temperature: labels.temperature,
      density: labels.density,
    },
    water: {
      temperature: fromSI('temperature', model.water.temperatureC, sys),
      densityKgM3: model.water.density,
      kinematicViscosityM2s: model.water.kinematicViscosity,
      dynamicViscosityPaS: model.water.dynamicViscosity,
    },
    ...display,
    criticalFixtureId: checks.criticalIndex === -1 ? null : model.fixtures[checks.criticalIndex].id,
    verdict: verdictOfChecks(model, topo, checks, elev, stat),
    methods: {
      friction: { id: friction.id, label: friction.label, source: friction.source },
      fittings: FITTING_METHOD_LABELS[criteria.fittingMethod],
      demand:
        criteria.demandMethod === 'hunter-binomial'
          ? {
              id: 'hunter-binomial',
              label: "Hunter's binomial method, 99th percentile",
              source: 'R. B. Hunter, NBS Report BMS65, Methods of Estimating Loads in Plumbing Systems (1940)',
            }
          : {
              id: 'hunter-table',
              label: `Fixture units to design flow, ${criteria.demandCurve === 'auto' ? 'flush-valve curve where a flush valve is downstream, else flush-tank' : `${criteria.demandCurve} curve`}, linear interpolation`,
              source: 'IPC (2018) Table E103.3(3)',
            },
      water: {
        id: 'iapws',
        label: 'Density IAPWS-95 at 1 atm; viscosity IAPWS 2008 (industrial)',
        source: 'IAPWS R6-95(2018); IAPWS R12-08',
      },
      elevation: {
        id: 'rho-g-dz',
        label: 'Δp = ρ(T)·g·Δz; each node at its elevation, its floor plus height, or its feed segment’s typed rise',
        source: 'hydrostatics; g = 9.80665 m/s² (CGPM 1901)',
      },
      supply:
        hyd.source.basis === 'flow-test'
          ? { id: 'nfpa-291', label: 'P(Q) = Ps − (Ps − Pr)·(Q/Qf)^1.85', source: 'NFPA 291, Recommended Practice for Water Flow Testing' }
          : { id: 'low-static', label: 'Source low static pressure at design flow', source: 'entered pressure basis: ' + model.doc.source.pressureBasis },
      devices: {
        id: 'loss-curve',
        label: 'Monotone cubic (Fritsch–Carlson) through the loss points; beyond the last point loss ∝ Q²',
        source: 'F. N. Fritsch and R. E. Carlson, SIAM J. Numer. Anal. 17(2), 238–246 (1980)',
      },
    },
    criteria: {
      maxStaticPressure: fromSI('pressure', criteria.maxStaticPressurePa, sys),
      minStaticPressure: criteria.minStaticPressurePa !== undefined ? fromSI('pressure', criteria.minStaticPressurePa, sys) : null,
      velocityLimits: criteria.velocityLimits.map((v) => ({
        material: v.material,
        service: v.service,
        maxVelocity: fromSI('velocity', v.maxVelocityMs, sys),
        source: v.source,
      })),
      demandCurve: criteria.demandCurve,
      demandMethod: criteria.demandMethod,
      frictionMethod: criteria.frictionMethod,
      fittingMethod: criteria.fittingMethod,
    },
    staticChecks: stat.display,
    warnings,
    si,
  };
}

/**
 * The SI result objects and their display copies, built side by side in one pass over the stage
 * arrays; each display value is the SI value divided by its unit's factor, exactly as toDisplay
 * does it. Ends with the last guard of the pipeline (no NaN or Infinity in a result, see finite.ts).
 */
function buildResults(
  model: SiModel,
  topo: Topology,
  demand: DemandResult,
  hyd: HydraulicsResult,
  checks: ChecksResult,
): { si: AnalysisResults; display: AnalysisResults } {
  const sys = model.unitSystem;
  // Pure scalings (units.ts): one factor per quantity; fromSI(q, v) = v / factor.
  const pF = toSI('pressure', 1, sys);
  const lF = toSI('length', 1, sys);
  const dF = toSI('diameter', 1, sys);
  const qF = toSI('flow', 1, sys);
  const vF = toSI('velocity', 1, sys);
  const z = (v: number) => fromSI('elevation', v, sys);
  // Σ x·0 over every SI number: 0 when all are finite, NaN as soon as one is not.
  let nonFinite = 0;

  const srcIdx = model.source.nodeIdx;
  const siSource: SourceResult = {
    nodeId: model.nodeIds[srcIdx],
    kind: model.source.kind,
    elevation: model.elevationM[srcIdx],
    designFlow: demand.source.designFlowM3s,
    pressureAtDesignFlow: hyd.source.pressurePa,
    pressureBasis: hyd.source.basis,
    staticPressureLow: model.source.staticLowPa,
    staticPressureHigh: model.source.staticHighPa,
  };
  nonFinite +=
    (siSource.elevation + siSource.designFlow + siSource.pressureAtDesignFlow + siSource.staticPressureLow + siSource.staticPressureHigh) * 0;
  const source: SourceResult = {
    ...siSource,
    elevation: z(siSource.elevation),
    designFlow: siSource.designFlow / qF,
    pressureAtDesignFlow: siSource.pressureAtDesignFlow / pF,
    staticPressureLow: siSource.staticPressureLow / pF,
    staticPressureHigh: siSource.staticPressureHigh / pF,
  };

  const segsIn = model.segments;
  const nSegs = segsIn.length;
  const siSegments: SegmentResult[] = new Array(nSegs);
  const segments: SegmentResult[] = new Array(nSegs);
  for (let s = 0; s < nSegs; s++) {
    const seg = segsIn[s];
    const parent = topo.parentSeg[s];
    const id = seg.id;
    const from = model.nodeIds[seg.from];
    const to = model.nodeIds[seg.to];
    const parentSegmentId = parent === -1 ? null : segsIn[parent].id;
    const wsfu = demand.wsfu[s];
    const designFlow = demand.designFlowM3s[s];
    const rise = hyd.riseM[s];
    const velocity = hyd.velocity[s];
    const reynolds = hyd.reynolds[s];
    const frictionFactor = hyd.frictionFactor[s];
    const fittingsK = hyd.fittingsK[s];
    const sizeChangeK = hyd.sizeChangeK[s];
    const totalK = fittingsK + sizeChangeK;
    const frictionLoss = hyd.frictionLossPa[s];
    const fittingLoss = hyd.fittingLossPa[s];
    const riseLoss = hyd.riseLossPa[s];
    const deviceLoss = hyd.deviceLossPa[s];
    const inletPressure = hyd.inletPa[s];
    const outletPressure = hyd.outletPa[s];
    const velocityLimit = checks.velocityLimitMs[s];
    const developedLength = hyd.nodeDevelopedLengthM[seg.to];
    const devs = hyd.devices[s];
    const siDevices: DeviceLossResult[] = new Array(devs.length);
    const devices: DeviceLossResult[] = new Array(devs.length);
    for (let k = 0; k < devs.length; k++) {
      const d = devs[k];
      nonFinite += d.lossPa * 0;
      siDevices[k] = { deviceId: d.deviceId, kind: d.kind, label: d.label, loss: d.lossPa, extrapolated: d.extrapolated };
      devices[k] = { deviceId: d.deviceId, kind: d.kind, label: d.label, loss: d.lossPa / pF, extrapolated: d.extrapolated };
    }
    nonFinite +=
      (wsfu + designFlow + seg.innerDiameterM + seg.lengthM + rise + velocity + reynolds + frictionFactor + fittingsK + sizeChangeK +
        totalK + frictionLoss + fittingLoss + riseLoss + deviceLoss + inletPressure + outletPressure + developedLength +
        (velocityLimit ?? 0)) *
      0;
    siSegments[s] = {
      id,
      label: seg.label,
      from,
      to,
      parentSegmentId,
      wsfu,
      demandCurve: demand.curve[s],
      flowBasis: demand.basis[s],
      designFlow,
      innerDiameter: seg.innerDiameterM,
      length: seg.lengthM,
      rise,
      velocity,
      reynolds,
      frictionFactor,
      regime: hyd.regime[s],
      fittingsK,
      sizeChangeK,
      totalK,
      frictionLoss,
      fittingLoss,
      riseLoss,
      deviceLoss,
      devices: siDevices,
      inletPressure,
      outletPressure,
      velocityLimit,
      velocityPass: checks.velocityPass[s],
      developedLength,
    };
    segments[s] = {
      id,
      label: seg.label,
      from,
      to,
      parentSegmentId,
      wsfu,
      demandCurve: demand.curve[s],
      flowBasis: demand.basis[s],
      designFlow: designFlow / qF,
      innerDiameter: seg.innerDiameterM / dF,
      length: seg.lengthM / lF,
      rise: rise / lF,
      velocity: velocity / vF,
      reynolds,
      frictionFactor,
      regime: hyd.regime[s],
      fittingsK,
      sizeChangeK,
      totalK,
      frictionLoss: frictionLoss / pF,
      fittingLoss: fittingLoss / pF,
      riseLoss: riseLoss / pF,
      deviceLoss: deviceLoss / pF,
      devices,
      inletPressure: inletPressure / pF,
      outletPressure: outletPressure / pF,
      velocityLimit: velocityLimit === null ? null : velocityLimit / vF,
      velocityPass: checks.velocityPass[s],
      developedLength: developedLength / lF,
    };
  }

  const nNodes = model.nodeIds.length;
  const siNodes: NodeResult[] = new Array(nNodes);
  const nodes: NodeResult[] = new Array(nNodes);
  for (let i = 0; i < nNodes; i++) {
    const id = model.nodeIds[i];
    const label = model.nodeLabels[i];
    const elevation = model.elevationM[i];
    const pressure = hyd.nodePressurePa[i];
    const staticPressureHigh = hyd.nodeStaticHighPa[i];
    const staticPressureLow = hyd.nodeStaticLowPa[i];
    const staticPass = checks.nodeStaticPass[i];
    const developedLength = hyd.nodeDevelopedLengthM[i];
    const feed = topo.feedSeg[i];
    const feedSegmentId = feed === -1 ? null : segsIn[feed].id;
    nonFinite += (elevation + pressure + staticPressureHigh + staticPressureLow + developedLength) * 0;
    siNodes[i] = { id, label, elevation, pressure, staticPressureHigh, staticPressureLow, staticPass, developedLength, feedSegmentId };
    nodes[i] = {
      id,
      label,
      elevation: z(elevation),
      pressure: pressure / pF,
      staticPressureHigh: staticPressureHigh / pF,
      staticPressureLow: staticPressureLow / pF,
      staticPass,
      developedLength: developedLength / lF,
      feedSegmentId,
    };
  }

  const nFix = model.fixtures.length;
  const siFixtures: FixtureResult[] = new Array(nFix);
  const fixtures: FixtureResult[] = new Array(nFix);
  for (let k = 0; k < nFix; k++) {
    const fx = model.fixtures[k];
    const c = checks.fixtures[k];
    const elevation = model.elevationM[fx.nodeIdx];
    const developedLength = hyd.nodeDevelopedLengthM[fx.nodeIdx];
    const nodeId = model.nodeIds[fx.nodeIdx];
    // One path array, shared by the SI and the display result (as the spread in toDisplay shares it).
    const path = pathTo(fx.nodeIdx, topo, model);
    nonFinite += (c.residualPa + fx.requiredPa + c.marginPa + fx.flowRateM3s + elevation + developedLength) * 0;
    siFixtures[k] = {
      id: fx.id,
      nodeId,
      fixtureTypeId: fx.fixtureTypeId,
      label: fx.label,
      residual: c.residualPa,
      required: fx.requiredPa,
      margin: c.marginPa,
      pass: c.pass,
      flowRate: fx.flowRateM3s,
      elevation,
      developedLength,
      path,
    };
    fixtures[k] = {
      id: fx.id,
      nodeId,
      fixtureTypeId: fx.fixtureTypeId,
      label: fx.label,
      residual: c.residualPa / pF,
      required: fx.requiredPa / pF,
      margin: c.marginPa / pF,
      pass: c.pass,
      flowRate: fx.flowRateM3s / qF,
      elevation: z(elevation),
      developedLength: developedLength / lF,
      path,
    };
  }

  const si: AnalysisResults = { source: siSource, segments: siSegments, nodes: siNodes, fixtures: siFixtures };
  // A non-finite number is an engine defect: the full walk names the first one (and throws).
  if (nonFinite !== 0) assertFiniteDeep(si);
  return { si, display: { source, segments, nodes, fixtures } };
}

function pathTo(nodeIdx: number, topo: Topology, model: SiModel): string[] {
  const path: string[] = [];
  let n = nodeIdx;
  while (topo.feedSeg[n] !== -1) {
    const s = topo.feedSeg[n];
    path.push(model.segments[s].id);
    n = model.segments[s].from;
  }
  return path.reverse();
}

/** Converts SI results to the display units of `sys` (a new object; `si` is untouched). */
export function toDisplay(si: AnalysisResults, sys: UnitSystem): AnalysisResults {
  // Pure scalings (units.ts): one factor per quantity; fromSI(q, v) = v / factor.
  const pF = toSI('pressure', 1, sys);
  const lF = toSI('length', 1, sys);
  const dF = toSI('diameter', 1, sys);
  const qF = toSI('flow', 1, sys);
  const vF = toSI('velocity', 1, sys);
  const p = (v: number) => v / pF;
  const len = (v: number) => v / lF;
  const z = (v: number) => fromSI('elevation', v, sys);
  const q = (v: number) => v / qF;
  const source: SourceResult = {
    ...si.source,
    elevation: z(si.source.elevation),
    designFlow: q(si.source.designFlow),
    pressureAtDesignFlow: p(si.source.pressureAtDesignFlow),
    staticPressureLow: p(si.source.staticPressureLow),
    staticPressureHigh: p(si.source.staticPressureHigh),
  };
  return {
    source,
    segments: si.segments.map(
      (s): SegmentResult => ({
        id: s.id,
        label: s.label,
        from: s.from,
        to: s.to,
        parentSegmentId: s.parentSegmentId,
        wsfu: s.wsfu,
        demandCurve: s.demandCurve,
        flowBasis: s.flowBasis,
        designFlow: s.designFlow / qF,
        innerDiameter: s.innerDiameter / dF,
        length: s.length / lF,
        rise: s.rise / lF,
        velocity: s.velocity / vF,
        reynolds: s.reynolds,
        frictionFactor: s.frictionFactor,
        regime: s.regime,
        fittingsK: s.fittingsK,
        sizeChangeK: s.sizeChangeK,
        totalK: s.totalK,
        frictionLoss: s.frictionLoss / pF,
        fittingLoss: s.fittingLoss / pF,
        riseLoss: s.riseLoss / pF,
        deviceLoss: s.deviceLoss / pF,
        devices:
          s.devices.length === 0
            ? []
            : s.devices.map((dv) => ({ deviceId: dv.deviceId, kind: dv.kind, label: dv.label, loss: dv.loss / pF, extrapolated: dv.extrapolated })),
        inletPressure: s.inletPressure / pF,
        outletPressure: s.outletPressure / pF,
        velocityLimit: s.velocityLimit === null ? null : s.velocityLimit / vF,
        velocityPass: s.velocityPass,
        developedLength: s.developedLength / lF,
      }),
    ),
    nodes: si.nodes.map((n) => ({
      ...n,
      elevation: z(n.elevation),
      pressure: p(n.pressure),
      staticPressureHigh: p(n.staticPressureHigh),
      staticPressureLow: p(n.staticPressureLow),
      developedLength: len(n.developedLength),
    })),
    fixtures: si.fixtures.map((f) => ({
      ...f,
      residual: p(f.residual),
      required: p(f.required),
      margin: p(f.margin),
      flowRate: q(f.flowRate),
      elevation: z(f.elevation),
      developedLength: len(f.developedLength),
    })),
  };
}
