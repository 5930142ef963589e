/**
 * The "pressure available for friction" and its budget per 100 ft of equivalent length — the
 * hand procedure the model codes give for sizing a building's water distribution (IPC Appendix E,
 * sections E102–E103; UPC Appendix A, A 104; common practice):
 *
 *   available = minimum static supply pressure
 *             − the minimum flow pressure of the highest or most remote fixture
 *             − the elevation (ρ·g·Δz; 0.433 psi per foot of cold water)
 *             − the meter's loss at the design flow
 *             − the losses of the other devices (backflow preventer, PRV, softener, filter)
 *   budget per 100 ft = available / (developed length + equivalent length of the fittings) × 100 ft
 *
 * Each section is then sized so that its friction per 100 ft stays within the budget. Headroom's
 * sizing (sizeSystem.ts) does not size by this budget: it computes every fixture's residual with
 * the full friction model and keeps each at or above its minimum, which is the same condition
 * written exactly (the budget spreads the available pressure evenly over the path, the exact
 * method lets a short, fast section spend more where a long one spends less). The budget is shown
 * with the answer so a designer can compare it with the hand method, and the test in
 * tests/engine/sizing works one small system by hand both ways.
 *
 * SI inside: pressures Pa, lengths m, density kg/m³. A budget per 100 ft is returned in Pa per
 * 30.48 m (100 ft, exact by the definition of the foot).
 */
import type { StageResults } from '../analysis/results';
import type { Analysis } from '../analysis/types';
import { G, M_PER_FT } from '../units';

/** 100 ft in metres (the international foot, 0.3048 m exactly). */
export const HUNDRED_FT_M = 100 * M_PER_FT;

export interface AvailableForFrictionInput {
  /** Minimum static pressure at the source (the main or the flow test at design flow), Pa. */
  supplyPressurePa: number;
  /** Minimum flow pressure of the fixture the path ends at, Pa. */
  fixtureMinimumPa: number;
  /** Rise from the source to the fixture outlet, m (negative when it lies lower). */
  riseM: number;
  /** Water density at the system temperature, kg/m³. */
  densityKgM3: number;
  /** Losses of the meter and the other devices on the path at the design flow, Pa. */
  deviceLossesPa: readonly number[];
  /** Extra pressure the designer keeps above the minimum, Pa (default 0). */
  marginPa?: number;
}

/** What the supply leaves for pipe friction and fittings on the path, Pa (negative: nothing is left). */
export function pressureAvailableForFriction(input: AvailableForFrictionInput): number {
  const elevation = input.densityKgM3 * G * input.riseM;
  const devices = input.deviceLossesPa.reduce((sum, loss) => sum + loss, 0);
  return input.supplyPressurePa - input.fixtureMinimumPa - (input.marginPa ?? 0) - elevation - devices;
}

/** Budget of friction per 100 ft of equivalent length, Pa per 30.48 m; null when the length is not positive. */
export function frictionBudgetPer100Ft(availablePa: number, equivalentLengthM: number): number | null {
  if (!(equivalentLengthM > 0)) return null;
  return (availablePa / equivalentLengthM) * HUNDRED_FT_M;
}

export interface FrictionBudget {
  fixtureId: string;
  label: string;
  /** Pressure at the source at the design flow, Pa. */
  supplyPa: number;
  /** Net change through devices on the path (losses positive; a booster's gain negative), Pa. */
  devicesPa: number;
  /** ρ·g·rise from the source to the fixture, Pa. */
  elevationPa: number;
  requiredPa: number;
  marginPa: number;
  /** What is left for friction and fittings, Pa. */
  availablePa: number;
  /** What friction and fittings take now, Pa. */
  frictionUsedPa: number;
  developedLengthM: number;
  /** Equivalent length of the fittings on the path (K·D/f per segment), m. */
  fittingsEquivalentLengthM: number;
  /** availablePa per 100 ft of developed plus equivalent length; null when the path has no length. */
  perHundredFtPa: number | null;
}

/** One segment's terms on the path, SI (a segment result, or the same numbers read from the stage arrays). */
interface PathSegment {
  frictionLoss: number;
  fittingLoss: number;
  riseLoss: number;
  length: number;
  frictionFactor: number;
  totalK: number;
  innerDiameter: number;
}

/**
 * The budget for the critical fixture of an analysis, from its SI results: the supply at the
 * design flow, the device and elevation terms on the fixture's path, and the lengths. Every term
 * is read from the analysis, so supply − devices − elevation − friction = residual holds exactly.
 */
export function frictionBudgetOf(analysis: Analysis, marginPa = 0): FrictionBudget | null {
  const si = analysis.si;
  const fixture = si.fixtures.find((f) => f.id === analysis.criticalFixtureId);
  if (!fixture) return null;
  const byId = new Map(si.segments.map((s) => [s.id, s]));
  const path: PathSegment[] = [];
  for (const id of fixture.path) {
    const s = byId.get(id);
    if (s) path.push(s);
  }
  return budgetOnPath(si.source.pressureAtDesignFlow, fixture, path, marginPa);
}

/**
 * The same budget read from the stage arrays of the same analysis (the sizing reads these, so
 * that no result object is built for a large building): the same numbers in the same order.
 */
export function frictionBudgetOfStages(analysis: Analysis, stages: StageResults, marginPa = 0): FrictionBudget | null {
  const { model, topo, hyd, checks } = stages;
  const k = model.fixtures.findIndex((f) => f.id === analysis.criticalFixtureId);
  if (k === -1) return null;
  const fx = model.fixtures[k];
  const path: PathSegment[] = [];
  for (let n = fx.nodeIdx; topo.feedSeg[n] !== -1; n = model.seg.from[topo.feedSeg[n]]) {
    const s = topo.feedSeg[n];
    path.push({
      frictionLoss: hyd.frictionLossPa[s],
      fittingLoss: hyd.fittingLossPa[s],
      riseLoss: hyd.riseLossPa[s],
      length: model.seg.lengthM[s],
      frictionFactor: hyd.frictionFactor[s],
      totalK: hyd.fittingsK[s] + hyd.sizeChangeK[s],
      innerDiameter: model.seg.innerDiameterM[s],
    });
  }
  path.reverse();
  const fixture = { id: fx.id, label: fx.label, residual: checks.fixtures[k].residualPa, required: fx.requiredPa };
  return budgetOnPath(hyd.source.pressurePa, fixture, path, marginPa);
}

/** The budget's terms summed from the source down the fixture's path. */
function budgetOnPath(
  supply: number,
  fixture: { id: string; label: string; residual: number; required: number },
  path: readonly PathSegment[],
  marginPa: number,
): FrictionBudget {
  let friction = 0;
  let elevation = 0;
  let developed = 0;
  let equivalent = 0;
  for (const s of path) {
    friction += s.frictionLoss + s.fittingLoss;
    elevation += s.riseLoss;
    developed += s.length;
    if (s.frictionFactor > 0) equivalent += (s.totalK * s.innerDiameter) / s.frictionFactor;
  }
  const devices = supply - elevation - friction - fixture.residual;
  const available = supply - devices - elevation - fixture.required - marginPa;
  return {
    fixtureId: fixture.id,
    label: fixture.label,
    supplyPa: supply,
    devicesPa: devices,
    elevationPa: elevation,
    requiredPa: fixture.required,
    marginPa,
    availablePa: available,
    frictionUsedPa: friction,
    developedLengthM: developed,
    fittingsEquivalentLengthM: equivalent,
    perHundredFtPa: frictionBudgetPer100Ft(available, developed + equivalent),
  };
}
