/**
 * Stage 8: report. Gathers the stage results into the analysis: the verdict, methods and criteria
 * here; the per-element results in SI and in the document's units from results.ts (built when
 * first read). No computation happens here beyond unit conversion.
 */
import { fromSI, toSI, UNIT_LABELS, type UnitSystem } from '../units';
import { FRICTION_METHODS } from '../friction';
import type { EngineWarning } from '../warnings';
import type { SiModel } from './input';
import type { Topology } from './topology';
import type { DemandResult } from './demand';
import type { HydraulicsResult } from './hydraulics';
import type { ChecksResult } from './checks';
import { buildResults } from './results';
import { defineLazy } from './lazy';
import type { ElevationResult } from './elevations';
import type { StaticChecksResult } from './staticChecks';
import { formatPressure, nodeName, plural, segmentName } from './names';
import type { Analysis, IncompleteReason, AnalysisResults, MethodUsed, SegmentResult, SourceResult } from './types';

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
      elementId: first !== undefined ? model.nodeIds[first] : model.seg.id[topo.unreachedSegments[0]],
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
      message: `${capitalise(nodeName(model, nodeIdx))} has no elevation: enter the rise of ${segmentName(model, segIdx)} (0 for a level run), or the node's elevation or floor. It was computed level with ${nodeName(model, model.seg.from[segIdx])}.`,
    });
  }
  for (const s of model.pipeMissing) {
    add({
      code: 'segment-pipe-missing',
      elementType: 'segment',
      elementId: model.seg.id[s],
      elementLabel: segmentName(model, s),
      message: `${capitalise(segmentName(model, s))} has no material and size: choose them (or enter custom pipe data). It was computed with the pipe feeding it.`,
    });
  }
  {
    for (const d of model.devicesInSegmentOrder) {
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
  // The per-element results are built when first read (results.ts); the finite guard runs here.
  const { si, display } = buildResults({ model, topo, demand, hyd, checks });
  const sys = model.unitSystem;
  const labels = UNIT_LABELS[sys];
  const criteria = model.criteria;
  const friction = FRICTION_METHODS[criteria.frictionMethod];
  const analysis: Analysis = {
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
    // placeholders keeping the fields' order; defined below, built on first read
    source: display.source,
    segments: [],
    nodes: [],
    fixtures: [],
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
  defineLazy(analysis, 'segments', () => display.segments);
  defineLazy(analysis, 'nodes', () => display.nodes);
  defineLazy(analysis, 'fixtures', () => display.fixtures);
  return analysis;
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
    segments: si.segments.map((s): SegmentResult => ({
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
    })),
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
