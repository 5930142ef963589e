/**
 * Post-pass: the recirculation loop of a hot-water document (`recirculation`), in the document's
 * units. The pipes, heat losses and the allowed drop are read from the document and converted to
 * SI; sizeRecirculation (recirculation.ts, where every formula and limit is sourced) computes the
 * loop flow, the return sizes and the pump's flow and head; the answer is converted back.
 *
 * The loop leaves the heater and comes back to it: the heater is the hot system's source node
 * (where the heater's outlet feeds the hot tree). A loop that cannot be computed (not closed, a drop
 * of zero or less, an unknown material or size, no heat loss) is an error naming the pipe and field;
 * the rest of the analysis stands, and the verdict becomes Incomplete with the reason — a described
 * loop that cannot be computed is never shown green.
 *
 * Velocity limit of each pipe: the criteria's limit for its material class in hot service (the
 * analysis' own limits, NSPC 10.14.1 by default); friction limit 3 psi per 100 ft (recirculation.ts).
 * Pump head as a height of water: h = Δp / (ρ·g), ρ of the loop's hot water (IAPWS-95, water.ts),
 * g standard gravity (units.ts).
 */
import type { Criteria } from '../catalog/criteria';
import { MATERIALS } from '../catalog/materials';
import type { SystemDocument } from '../model/schema';
import { fromSI, G, M_PER_FT, toSI, UNIT_LABELS } from '../units';
import { waterProperties } from '../water';
import type { Analysis, IncompleteReason } from '../analysis/types';
import { HotWaterInputError, type HotWaterErrorCode } from './errors';
import { DEFAULT_FITTING_ALLOWANCE, sizeRecirculation, type LoopSegment, type RecirculationResult } from './recirculation';

/** W per Btu_IT/h: 1 Btu_IT = 1055.05585262 J (NIST SP 811 (2008) App. B.8), 1 h = 3600 s. */
export const W_PER_BTU_PER_H = 1055.05585262 / 3600;
/** K per °F of temperature difference: 1 °F = 5/9 K (NIST SP 811 (2008) §B.9). */
const K_PER_DEGF = 1 / 1.8;

export interface RecirculationPipeResult {
  segmentId: string;
  label: string;
  from: string;
  to: string;
  material: string;
  size: string;
  /** Chosen here (the return) or given. */
  sizeChosen: boolean;
  /** Document units: ft/s or m/s. */
  velocity: number;
  velocityLimit: number;
  /** Friction loss of the pipe at the loop flow, pressure unit. */
  frictionLoss: number;
  /** Btu/h or W. */
  heatLoss: number;
  withinLimits: boolean;
}

export type RecirculationAnalysis =
  | {
      ok: true;
      units: { flow: string; pressure: string; length: string; velocity: string; heat: 'Btu/h' | 'W'; temperature: string };
      /** Total heat lost by the loop, Btu/h or W. */
      heatLoss: number;
      hotTemperature: number;
      /** °F or K. */
      temperatureDrop: number;
      /** Loop flow = pump flow, flow unit. */
      flow: number;
      pumpFlow: number;
      /** Pump head as a pressure, pressure unit, and as a height of hot water, length unit. */
      pumpHead: number;
      pumpHeadLength: number;
      fittingAllowance: number;
      heaterLoss: number;
      pipes: RecirculationPipeResult[];
      sources: string[];
      si: RecirculationResult;
    }
  | { ok: false; error: { code: HotWaterErrorCode; field: string | null; elementId: string | null; message: string } };

/** The recirculation loop of a document, computed; undefined when the document describes none. */
export function analyseRecirculation(doc: SystemDocument, criteria: Pick<Criteria, 'velocityLimits'>): RecirculationAnalysis | undefined {
  const r = doc.recirculation;
  if (!r) return undefined;
  const sys = doc.unitSystem;
  const us = sys === 'US';
  const heatToW = us ? W_PER_BTU_PER_H : 1;
  const perLengthToWPerM = us ? W_PER_BTU_PER_H / M_PER_FT : 1;
  const hotTemperature = r.hotTemperature ?? doc.waterTemperature;
  const heaterNodeId = doc.source.nodeId;
  const limitFor = (material: string): number | undefined => {
    const m = Object.hasOwn(MATERIALS, material) ? MATERIALS[material as keyof typeof MATERIALS] : undefined;
    return m ? criteria.velocityLimits.find((l) => l.material === m.velocityClass && l.service === 'hot')?.maxVelocityMs : undefined;
  };
  try {
    if (!(r.temperatureDrop > 0)) {
      throw new HotWaterInputError(
        'temperature-drop-not-positive',
        'temperatureDrop',
        `The allowed temperature drop around the loop must be greater than zero (it is ${r.temperatureDrop} ${us ? '°F' : 'K'}).`,
      );
    }
    for (const s of r.segments) {
      if (s.heatLoss === undefined && r.heatLossPerLength === undefined) {
        throw new HotWaterInputError(
          'heat-loss-missing',
          'heatLoss',
          `Loop pipe "${s.label || s.id}" has no heat loss: give its own (${us ? 'Btu/h' : 'W'}) or the loop's heat loss per length (${us ? 'Btu/h per ft' : 'W/m'}).`,
          s.id,
        );
      }
    }
    const segments = r.segments.map((s): LoopSegment => {
      const lengthM = toSI('length', s.length, sys);
      return {
        id: s.id,
        label: s.label || undefined,
        from: s.from,
        to: s.to,
        lengthM,
        material: s.material as LoopSegment['material'],
        size: s.size,
        heatLossW: s.heatLoss !== undefined ? s.heatLoss * heatToW : undefined,
        heatLossWPerM: s.heatLoss === undefined && r.heatLossPerLength !== undefined ? r.heatLossPerLength * perLengthToWPerM : undefined,
        isReturn: s.size === undefined,
        maxVelocityMs: limitFor(s.material),
      };
    });
    const si = sizeRecirculation({
      heaterNodeId,
      segments,
      temperatureC: toSI('temperature', hotTemperature, sys),
      temperatureDropK: us ? r.temperatureDrop * K_PER_DEGF : r.temperatureDrop,
      heaterLossPa: r.heaterLoss !== undefined ? toSI('pressure', r.heaterLoss, sys) : 0,
      fittingAllowance: r.fittingAllowance,
    });
    const rho = waterProperties(toSI('temperature', hotTemperature, sys)).density;
    const byId = new Map(r.segments.map((s) => [s.id, s]));
    const labels = UNIT_LABELS[sys];
    return {
      ok: true,
      units: {
        flow: labels.flow,
        pressure: labels.pressure,
        length: labels.length,
        velocity: labels.velocity,
        heat: us ? 'Btu/h' : 'W',
        temperature: labels.temperature,
      },
      heatLoss: si.heatLossW / heatToW,
      hotTemperature,
      temperatureDrop: r.temperatureDrop,
      flow: fromSI('flow', si.flowM3s, sys),
      pumpFlow: fromSI('flow', si.pumpFlowM3s, sys),
      pumpHead: fromSI('pressure', si.pumpHeadPa, sys),
      pumpHeadLength: fromSI('length', si.pumpHeadPa / (rho * G), sys),
      fittingAllowance: r.fittingAllowance ?? DEFAULT_FITTING_ALLOWANCE,
      heaterLoss: r.heaterLoss ?? 0,
      pipes: si.segments.map((p) => {
        const s = byId.get(p.segmentId)!;
        return {
          segmentId: p.segmentId,
          label: s.label || `${s.from} → ${s.to}`,
          from: s.from,
          to: s.to,
          material: s.material,
          size: p.size,
          sizeChosen: p.sizeChosen,
          velocity: fromSI('velocity', p.velocityMs, sys),
          velocityLimit: fromSI('velocity', p.maxVelocityMs, sys),
          frictionLoss: fromSI('pressure', p.frictionLossPa, sys),
          heatLoss: p.heatLossW / heatToW,
          withinLimits: p.withinLimits,
        };
      }),
      sources: [...si.sources, 'Pump head as a height of hot water: h = Δp/(ρ·g), ρ IAPWS-95, g = 9.80665 m/s² (NIST SP 811)'],
      si,
    };
  } catch (e) {
    if (e instanceof HotWaterInputError) {
      const pipe = e.elementId !== null ? r.segments.findIndex((s) => s.id === e.elementId) : -1;
      const field = e.field === null ? null : pipe >= 0 && e.field !== 'segments' ? `recirculation.segments[${pipe}].${e.field}` : `recirculation.${e.field}`;
      return { ok: false, error: { code: e.code, field, elementId: e.elementId, message: e.message } };
    }
    throw e;
  }
}

/** The Incomplete reason of a loop that cannot be computed; null when it was computed or none is described. */
export function recirculationIncompleteReason(result: RecirculationAnalysis | undefined): IncompleteReason | null {
  if (!result || result.ok) return null;
  const where = result.error.field ? ` (${result.error.field})` : '';
  return {
    code: 'recirculation-not-computed',
    elementType: 'system',
    elementId: result.error.elementId,
    elementLabel: 'Recirculation loop',
    message: `Recirculation loop${where}: ${result.error.message}`,
  };
}

/**
 * The post-pass of the analysis: the loop's result on the analysis, and the verdict Incomplete when
 * a described loop cannot be computed.
 */
export function addRecirculation(analysis: Analysis, doc: SystemDocument, criteria: Pick<Criteria, 'velocityLimits'>): void {
  const result = analyseRecirculation(doc, criteria);
  if (!result) return;
  analysis.recirculation = result;
  const reason = recirculationIncompleteReason(result);
  if (reason) {
    analysis.verdict.incomplete.push(reason);
    analysis.verdict.status = 'incomplete';
  }
}
