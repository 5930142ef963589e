/**
 * Hot-water recirculation: the flow that holds the loop's temperature drop, the return pipe's
 * size, and the pump's flow and head.
 *
 * Flow (an energy balance on the loop at no draw): Q = H / (ρ·c·ΔT), H the heat lost by the loop
 * (W), ρ the density of the hot water (IAPWS-95 at 1 atm, water.ts), c the specific heat and ΔT the
 * allowed temperature drop (K). c = 4186.8 J/(kg·K) = 1 Btu_IT/(lb·°F) exactly (the definition of
 * the International Table Btu, NIST SP 811 (2008) App. B.8); water's own specific heat at 40–60 °C
 * is within about 0.2 % of it (from memory). In US units this is the manufacturer's form
 * gpm = Btu/h / (500·ΔT°F) (Rinnai design manual R-TRWH-E-02 Rev D, p. 8: 500 ≈ 8.33 lb/gal ×
 * 60 min/h × 1 Btu/(lb·°F)), given below as `recirculationFlowGpm500` for the check.
 * When a loop is required at all: IPC 607.2, developed length of hot-water piping from the source
 * to the farthest fixture over 100 ft (quoted, not read in the code's own text; the adopted code governs).
 *
 * Return size: the smallest catalog size of the return's material whose velocity and friction
 * gradient at the loop flow are within the limits: default 5 ft/s (hot water in copper, NSPC
 * 10.14.1, the engine's criteria) and 3 psi per 100 ft (rule of thumb, mepanet.com "Estimate
 * capacity and head, domestic water circulating pump"). Friction: Darcy–Weisbach with the
 * Swamee–Jain factor (friction/), the pipe's roughness from the materials catalog.
 *
 * Pump: flow = loop flow; head = Σ friction of every loop segment at that flow × (1 + fitting
 * allowance) + the heater's loss at that flow. The default allowance 0.25 is the same rule of
 * thumb's "(2L × 1.25)" (fittings as 25 % of the pipe); pass 0 and count fittings in the lengths
 * to do without it.
 */
import { darcyFrictionFactor } from '../friction';
import { MATERIALS, type MaterialId } from '../catalog/materials';
import { DEFAULT_CRITERIA } from '../catalog/criteria';
import { waterProperties } from '../water';
import { M_PER_FT, PA_PER_PSI } from '../units';
import { HotWaterInputError } from './errors';

/** 1 Btu_IT/(lb·°F) in J/(kg·K): 1055.05585262 J / (0.45359237 kg × 5/9 K), exactly 4186.8 (NIST SP 811 App. B.8). */
export const SPECIFIC_HEAT_BTU_IT_J_PER_KG_K = 4186.8;
/** 3 psi per 100 ft, in Pa/m (mepanet rule of thumb for the return). */
export const RETURN_FRICTION_LIMIT_PA_PER_M = (3 * PA_PER_PSI) / (100 * M_PER_FT);
export const DEFAULT_FITTING_ALLOWANCE = 0.25;

/** The manufacturer's US form: gpm = Btu/h / (500 × ΔT °F). */
export function recirculationFlowGpm500(heatLossBtuH: number, temperatureDropF: number): number {
  if (!(temperatureDropF > 0))
    throw new HotWaterInputError('temperature-drop-not-positive', 'temperatureDrop', 'The allowed temperature drop must be greater than zero.');
  return heatLossBtuH / (500 * temperatureDropF);
}

/** Q = H/(ρ·c·ΔT), m³/s, with ρ of water at temperatureC (IAPWS-95). */
export function recirculationFlow(heatLossW: number, temperatureDropK: number, temperatureC: number): number {
  if (!(temperatureDropK > 0))
    throw new HotWaterInputError('temperature-drop-not-positive', 'temperatureDrop', 'The allowed temperature drop must be greater than zero.');
  if (!(heatLossW >= 0)) throw new HotWaterInputError('heat-loss-missing', 'heatLoss', 'The heat loss must be zero or more.');
  return heatLossW / (waterProperties(temperatureC).density * SPECIFIC_HEAT_BTU_IT_J_PER_KG_K * temperatureDropK);
}

export interface LoopSegment {
  id: string;
  label?: string;
  from: string;
  to: string;
  lengthM: number;
  material: MaterialId;
  /** Required on supply segments; on the return, the size is chosen (a given size is replaced). */
  size?: string;
  /** Heat lost by this segment, W; or per metre with heatLossWPerM. */
  heatLossW?: number;
  heatLossWPerM?: number;
  /** Part of the return (sized here). */
  isReturn?: boolean;
  /** This pipe's velocity limit, m/s (default: the input's). */
  maxVelocityMs?: number;
}

export interface RecirculationInput {
  /** The heater's node: the loop leaves and comes back here. */
  heaterNodeId: string;
  segments: LoopSegment[];
  /** Temperature leaving the heater, °C. */
  temperatureC: number;
  /** Temperature drop allowed around the loop, K. */
  temperatureDropK: number;
  maxVelocityMs?: number;
  maxFrictionPaPerM?: number;
  /** Heater loss at the loop flow, Pa (default 0). */
  heaterLossPa?: number;
  fittingAllowance?: number;
}

export interface LoopSegmentResult {
  segmentId: string;
  size: string;
  innerDiameterM: number;
  velocityMs: number;
  frictionPaPerM: number;
  frictionLossPa: number;
  heatLossW: number;
  /** The size was chosen here (the return), not given. */
  sizeChosen: boolean;
  maxVelocityMs: number;
  /** Velocity and friction gradient within the limits (always true for a chosen size). */
  withinLimits: boolean;
}

export interface RecirculationResult {
  heatLossW: number;
  flowM3s: number;
  segments: LoopSegmentResult[];
  pumpFlowM3s: number;
  pumpHeadPa: number;
  sources: string[];
}

/** Segments in loop order from the heater, or a named error where the chain breaks. */
export function loopOrder(heaterNodeId: string, segments: readonly LoopSegment[]): LoopSegment[] {
  if (segments.length === 0) throw new HotWaterInputError('loop-empty', 'segments', 'The recirculation loop has no segments.');
  const out = new Map<string, LoopSegment[]>();
  for (const s of segments) out.set(s.from, [...(out.get(s.from) ?? []), s]);
  const order: LoopSegment[] = [];
  let node = heaterNodeId;
  do {
    const next = out.get(node) ?? [];
    if (next.length !== 1) {
      throw new HotWaterInputError(
        'loop-not-closed',
        'segments',
        next.length === 0
          ? `The recirculation loop is not closed: nothing leaves node "${node}" on the way back to the heater.`
          : `The recirculation loop branches at node "${node}": a loop is one path from the heater back to it.`,
        node,
      );
    }
    order.push(next[0]);
    node = next[0].to;
    if (order.length > segments.length) break;
  } while (node !== heaterNodeId);
  if (node !== heaterNodeId || order.length !== segments.length) {
    const stray = segments.find((s) => !order.includes(s));
    throw new HotWaterInputError(
      'loop-not-closed',
      'segments',
      `The recirculation loop is not closed: segment "${stray?.label ?? stray?.id ?? node}" is not on the path from the heater back to it.`,
      stray?.id ?? node,
    );
  }
  return order;
}

function frictionGradient(q: number, d: number, roughnessM: number, rho: number, nu: number): { v: number; dpdx: number } {
  const v = q / ((Math.PI * d * d) / 4);
  const re = (v * d) / nu;
  const f = darcyFrictionFactor('swamee-jain', re, roughnessM / d).f;
  return { v, dpdx: (f / d) * ((rho * v * v) / 2) };
}

export function sizeRecirculation(input: RecirculationInput): RecirculationResult {
  const order = loopOrder(input.heaterNodeId, input.segments);
  const water = waterProperties(input.temperatureC);
  const maxV = input.maxVelocityMs ?? DEFAULT_CRITERIA.velocityLimits.find((l) => l.material === 'copper' && l.service === 'hot')!.maxVelocityMs;
  const maxG = input.maxFrictionPaPerM ?? RETURN_FRICTION_LIMIT_PA_PER_M;
  const heat = order.map((s) => {
    const h = s.heatLossW ?? (s.heatLossWPerM !== undefined ? s.heatLossWPerM * s.lengthM : undefined);
    if (h === undefined || !(h >= 0))
      throw new HotWaterInputError('heat-loss-missing', 'heatLoss', `Segment "${s.label ?? s.id}" has no heat loss (give W or W per metre).`, s.id);
    return h;
  });
  const heatLossW = heat.reduce((a, b) => a + b, 0);
  const flowM3s = recirculationFlow(heatLossW, input.temperatureDropK, input.temperatureC);
  const segments = order.map((s, i): LoopSegmentResult => {
    const material = Object.hasOwn(MATERIALS, s.material) ? MATERIALS[s.material] : undefined;
    if (!material) throw new HotWaterInputError('unknown-catalog-entry', 'material', `Material "${s.material}" is not in the catalog.`, s.id);
    const sizes = [...material.sizes].sort((a, b) => a.innerDiameterM - b.innerDiameterM);
    let size = s.isReturn ? undefined : sizes.find((z) => z.key === s.size);
    if (!s.isReturn && !size)
      throw new HotWaterInputError(
        'size-missing',
        'size',
        `Size "${s.size ?? ''}" of loop pipe "${s.label ?? s.id}" is not in the catalog of ${material.label}.`,
        s.id,
      );
    const maxVs = s.maxVelocityMs ?? maxV;
    if (s.isReturn) {
      size = sizes.find((z) => {
        const g = frictionGradient(flowM3s, z.innerDiameterM, material.roughnessM, water.density, water.kinematicViscosity);
        return g.v <= maxVs && g.dpdx <= maxG;
      });
      if (!size)
        throw new HotWaterInputError(
          'no-size-passes',
          'size',
          `No size of ${material.label} keeps the return "${s.label ?? s.id}" within the velocity and friction limits.`,
          s.id,
        );
    }
    const g = frictionGradient(flowM3s, size!.innerDiameterM, material.roughnessM, water.density, water.kinematicViscosity);
    return {
      segmentId: s.id,
      size: size!.key,
      innerDiameterM: size!.innerDiameterM,
      velocityMs: g.v,
      frictionPaPerM: g.dpdx,
      frictionLossPa: g.dpdx * s.lengthM,
      heatLossW: heat[i],
      sizeChosen: s.isReturn === true,
      maxVelocityMs: maxVs,
      withinLimits: g.v <= maxVs && g.dpdx <= maxG,
    };
  });
  const friction = segments.reduce((a, s) => a + s.frictionLossPa, 0);
  const allowance = input.fittingAllowance ?? DEFAULT_FITTING_ALLOWANCE;
  return {
    heatLossW,
    flowM3s,
    segments,
    pumpFlowM3s: flowM3s,
    pumpHeadPa: friction * (1 + allowance) + (input.heaterLossPa ?? 0),
    sources: [
      'Flow: energy balance Q = H/(ρ·c·ΔT); c = 1 Btu_IT/(lb·°F) = 4186.8 J/(kg·K) (NIST SP 811 App. B.8); ρ IAPWS-95',
      'US check form gpm = Btu/h / (500·ΔT): Rinnai design manual R-TRWH-E-02 Rev D, p. 8 (manufacturer)',
      `Return limits: ${maxV.toFixed(3)} m/s (NSPC 10.14.1 hot water in copper unless overridden), ${maxG.toFixed(1)} Pa/m (3 psi/100 ft, mepanet rule of thumb, unless overridden)`,
      `Pump head: loop friction × ${1 + allowance} (fitting allowance, mepanet rule of thumb) + heater loss`,
    ],
  };
}
