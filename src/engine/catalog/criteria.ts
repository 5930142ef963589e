/**
 * Default design criteria of a project. These are common model-code values, each with its source;
 * the adopted local code and the authority having jurisdiction override them.
 */
import type { FittingMethod } from '../fittings/fittingK';
import type { FrictionMethod } from '../friction/registry';
import type { DemandCurve } from '../demand/hunterDesignFlow';
import { M_PER_FT, PA_PER_PSI } from '../units';

export interface VelocityLimit {
  material: 'copper' | 'plastic' | 'steel';
  service: 'cold' | 'hot';
  maxVelocityMs: number;
  source: string;
}

export interface Criteria {
  maxStaticPressurePa: number;
  minStaticPressurePa?: number;
  velocityLimits: VelocityLimit[];
  minFlowPressureOverridesPa: Record<string, number>;
  demandCurve: 'auto' | DemandCurve;
  demandMethod: 'hunter-table' | 'hunter-binomial';
  frictionMethod: FrictionMethod;
  fittingMethod: FittingMethod;
}

const NSPC_8 = 'NSPC 10.14.1: 8 ft/s maximum at design flow (default; the local code governs)';
const NSPC_5_HOT_COPPER = 'NSPC 10.14.1: 5 ft/s for hot water in copper (default; the local code governs)';

export const CRITERIA_SOURCES: Record<keyof Criteria, string> = {
  maxStaticPressurePa:
    '80 psi maximum static pressure, a pressure-reducing valve required above it: IPC 604.8, UPC 608.2, IRC P2903.3.1 (default; the local code governs)',
  minStaticPressurePa: 'not set by default: the designer enters the value of the adopted code (no published minimum static pressure was verified)',
  velocityLimits: `${NSPC_8}; ${NSPC_5_HOT_COPPER}`,
  minFlowPressureOverridesPa: 'none by default: fixture minimums come from IPC 2018 Table 604.3 (fixture catalog)',
  demandCurve: "'auto': flush-valve curve when any flushometer-valve fixture is served, else flush-tank (IPC E103.3 practice)",
  demandMethod: 'IPC Table E103.3(3) estimated demand (Hunter curves), the model-code method',
  frictionMethod: 'Darcy–Weisbach with Colebrook (1939), solved',
  fittingMethod: 'Crane TP-410 (2009) K = N·f_T',
};

const ftps = (v: number): number => v * M_PER_FT;

export const DEFAULT_CRITERIA: Criteria = Object.freeze({
  maxStaticPressurePa: 80 * PA_PER_PSI,
  velocityLimits: Object.freeze([
    { material: 'copper', service: 'cold', maxVelocityMs: ftps(8), source: NSPC_8 },
    { material: 'copper', service: 'hot', maxVelocityMs: ftps(5), source: NSPC_5_HOT_COPPER },
    { material: 'plastic', service: 'cold', maxVelocityMs: ftps(8), source: NSPC_8 },
    { material: 'plastic', service: 'hot', maxVelocityMs: ftps(8), source: NSPC_8 },
    { material: 'steel', service: 'cold', maxVelocityMs: ftps(8), source: NSPC_8 },
    { material: 'steel', service: 'hot', maxVelocityMs: ftps(8), source: NSPC_8 },
  ]) as VelocityLimit[],
  minFlowPressureOverridesPa: Object.freeze({}) as Record<string, number>,
  demandCurve: 'auto',
  demandMethod: 'hunter-table',
  frictionMethod: 'colebrook',
  fittingMethod: 'crane',
});
