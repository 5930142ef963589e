/**
 * Thermal expansion tank for a closed domestic hot-water system (a check valve, a backflow
 * preventer or a PRV stops the heated water from pushing back into the main).
 *
 * Diaphragm (bladder) tank, Boyle's law on the air charge at constant temperature:
 *   V_t = V_heater · (ρ_cold/ρ_hot − 1) / (1 − P_supply,abs / P_relief,abs)
 * where ρ_cold/ρ_hot − 1 = v_hot/v_cold − 1 is the net expansion of the water heated from the
 * cold to the hot temperature (specific volume v = 1/ρ), the tank is precharged to the supply
 * pressure and the water may rise to the relief setting. The form is the diaphragm-tank form
 * V_et = k·V_w·[(v1/v0) − 1] / [1 − (p0/p1)] of the Engineering ToolBox page "Expansion tanks"
 * (engineeringtoolbox.com/expansion-tanks-d_885.html, with k = 1: the heater's volume is the whole
 * heated volume). Pressures are absolute; densities come from IAPWS-95 at 1 atm (water.ts).
 * Makers size for a maximum somewhat below the relief setting (10 % below a 150 psi relief, Roger
 * W. Griffith, P.E., "Thermal expansion tanks, part 2"), so pass the pressure you size for as
 * `reliefPa`. The expansion of the piping and heater shell is not credited (conservative).
 *
 * Units: volumes m³, temperatures °C, pressures Pa gauge (atmosphere added here).
 */
import { STANDARD_ATMOSPHERE_PA, waterProperties } from '../water';
import { HotWaterInputError } from './errors';

export interface ExpansionTankInput {
  heaterVolumeM3: number;
  coldC: number;
  hotC: number;
  /** Supply (precharge) pressure at the tank, Pa gauge. */
  supplyPa: number;
  /** Maximum pressure the tank is sized for (the relief setting, or somewhat below it), Pa gauge. */
  reliefPa: number;
  /** Atmospheric pressure, Pa (default: the standard atmosphere, 101 325 Pa, ISO 2533). */
  atmosphericPa?: number;
}

export interface ExpansionTankResult {
  /** Tank volume needed, m³. */
  tankVolumeM3: number;
  /** Volume the heated water gains, m³. */
  expansionVolumeM3: number;
  /** ρ_cold/ρ_hot − 1. */
  netExpansion: number;
  /** 1 − P_supply,abs / P_relief,abs: the share of the tank that can take water. */
  acceptanceFactor: number;
  densityColdKgM3: number;
  densityHotKgM3: number;
  source: string;
}

export const EXPANSION_TANK_SOURCE =
  "Diaphragm-tank form V = V_w·(v_hot/v_cold − 1)/(1 − p0/p1), absolute pressures (Engineering ToolBox, 'Expansion tanks'); Boyle's law; water densities IAPWS-95 at 1 atm";

/** Water properties of the engine are valid 0.01–100 °C at 1 atm (water.ts). */
const T_MIN_C = 0.01;
const T_MAX_C = 100;

export function thermalExpansionTank(input: ExpansionTankInput): ExpansionTankResult {
  const { heaterVolumeM3, coldC, hotC, supplyPa, reliefPa } = input;
  const atm = input.atmosphericPa ?? STANDARD_ATMOSPHERE_PA;
  if (!(heaterVolumeM3 > 0) || !Number.isFinite(heaterVolumeM3)) {
    throw new HotWaterInputError('heater-volume-not-positive', 'heaterVolume', 'The water heater volume must be greater than zero.');
  }
  for (const [field, t] of [
    ['coldTemperature', coldC],
    ['hotTemperature', hotC],
  ] as const) {
    if (!(t >= T_MIN_C && t <= T_MAX_C)) {
      throw new HotWaterInputError('temperature-out-of-range', field, `Temperatures must be between ${T_MIN_C} and ${T_MAX_C} °C (liquid water at 1 atm).`);
    }
  }
  if (!(hotC > coldC)) throw new HotWaterInputError('hot-not-above-cold', 'hotTemperature', 'The hot temperature must be above the cold temperature.');
  if (!(supplyPa + atm > 0) || !Number.isFinite(supplyPa) || !(atm > 0)) {
    throw new HotWaterInputError('pressure-out-of-range', 'supplyPressure', 'The supply pressure must be above a vacuum.');
  }
  if (!(reliefPa > supplyPa) || !Number.isFinite(reliefPa)) {
    throw new HotWaterInputError(
      'relief-not-above-supply',
      'reliefPressure',
      'The relief (maximum) pressure must be above the supply pressure: the tank could take no water.',
    );
  }
  const densityColdKgM3 = waterProperties(coldC).density;
  const densityHotKgM3 = waterProperties(hotC).density;
  const netExpansion = densityColdKgM3 / densityHotKgM3 - 1;
  const acceptanceFactor = 1 - (supplyPa + atm) / (reliefPa + atm);
  const expansionVolumeM3 = heaterVolumeM3 * netExpansion;
  return {
    tankVolumeM3: expansionVolumeM3 / acceptanceFactor,
    expansionVolumeM3,
    netExpansion,
    acceptanceFactor,
    densityColdKgM3,
    densityHotKgM3,
    source: EXPANSION_TANK_SOURCE,
  };
}
