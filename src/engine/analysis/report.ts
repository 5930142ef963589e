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
import type {
  Analysis,
  AnalysisResults,
  FixtureResult,
  MethodUsed,
  NodeResult,
  SegmentResult,
  SourceResult,
} from './types';

export const ENGINE_VERSION = '0.1.0';

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

export function assembleReport(
  model: SiModel,
  topo: Topology,
  demand: DemandResult,
  hyd: HydraulicsResult,
  checks: ChecksResult,
  warnings: EngineWarning[],
): Analysis {
  const segsIn = model.segments;
  const si: AnalysisResults = {
    source: {
      nodeId: model.nodeIds[model.source.nodeIdx],
      kind: model.source.kind,
      elevation: model.elevationM[model.source.nodeIdx],
      designFlow: demand.source.designFlowM3s,
      pressureAtDesignFlow: hyd.source.pressurePa,
      pressureBasis: hyd.source.basis,
      staticPressureLow: model.source.staticLowPa,
      staticPressureHigh: model.source.staticHighPa,
    },
    segments: segsIn.map((seg, s): SegmentResult => {
      const parent = topo.parentSeg[s];
      return {
        id: seg.id,
        label: seg.label,
        from: model.nodeIds[seg.from],
        to: model.nodeIds[seg.to],
        parentSegmentId: parent === -1 ? null : segsIn[parent].id,
        wsfu: demand.wsfu[s],
        demandCurve: demand.curve[s],
        flowBasis: demand.basis[s],
        designFlow: demand.designFlowM3s[s],
        innerDiameter: seg.innerDiameterM,
        length: seg.lengthM,
        rise: hyd.riseM[s],
        velocity: hyd.velocity[s],
        reynolds: hyd.reynolds[s],
        frictionFactor: hyd.frictionFactor[s],
        regime: hyd.regime[s],
        fittingsK: hyd.fittingsK[s],
        sizeChangeK: hyd.sizeChangeK[s],
        totalK: hyd.fittingsK[s] + hyd.sizeChangeK[s],
        frictionLoss: hyd.frictionLossPa[s],
        fittingLoss: hyd.fittingLossPa[s],
        riseLoss: hyd.riseLossPa[s],
        deviceLoss: hyd.deviceLossPa[s],
        devices: hyd.devices[s].map((d) => ({
          deviceId: d.deviceId,
          kind: d.kind,
          label: d.label,
          loss: d.lossPa,
          extrapolated: d.extrapolated,
        })),
        inletPressure: hyd.inletPa[s],
        outletPressure: hyd.outletPa[s],
        velocityLimit: checks.velocityLimitMs[s],
        velocityPass: checks.velocityPass[s],
        developedLength: hyd.nodeDevelopedLengthM[seg.to],
      };
    }),
    nodes: model.nodeIds.map(
      (id, i): NodeResult => ({
        id,
        label: model.nodeLabels[i],
        elevation: model.elevationM[i],
        pressure: hyd.nodePressurePa[i],
        staticPressureHigh: hyd.nodeStaticHighPa[i],
        staticPressureLow: hyd.nodeStaticLowPa[i],
        staticPass: checks.nodeStaticPass[i],
        developedLength: hyd.nodeDevelopedLengthM[i],
        feedSegmentId: topo.feedSeg[i] === -1 ? null : segsIn[topo.feedSeg[i]].id,
      }),
    ),
    fixtures: model.fixtures.map((fx, k): FixtureResult => {
      const c = checks.fixtures[k];
      return {
        id: fx.id,
        nodeId: model.nodeIds[fx.nodeIdx],
        fixtureTypeId: fx.fixtureTypeId,
        label: fx.label,
        residual: c.residualPa,
        required: fx.requiredPa,
        margin: c.marginPa,
        pass: c.pass,
        flowRate: fx.flowRateM3s,
        elevation: model.elevationM[fx.nodeIdx],
        developedLength: hyd.nodeDevelopedLengthM[fx.nodeIdx],
        path: pathTo(fx.nodeIdx, topo, model),
      };
    }),
  };

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
    ...toDisplay(si, sys),
    criticalFixtureId: checks.criticalIndex === -1 ? null : model.fixtures[checks.criticalIndex].id,
    verdict: {
      allFixturesPass: checks.fixtures.every((c) => c.pass),
      allVelocitiesPass: checks.velocityPass.every((v) => v !== false),
      allStaticPass: checks.nodeStaticPass.every((v) => v !== false),
      failures: checks.failures,
    },
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
      elevation: { id: 'rho-g-dz', label: 'Δp = ρ(T)·g·Δz, node elevations', source: 'hydrostatics; g = 9.80665 m/s² (CGPM 1901)' },
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
      riseTolerance: fromSI('length', model.riseToleranceM, sys),
    },
    warnings,
    si,
  };
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
