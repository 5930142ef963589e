/**
 * The one units module of the engine. Inside the engine every quantity is SI base units
 * (Pa, m, m³/s, m/s, kg/m³, Pa/m); temperature is carried in °C. The user's unit system
 * is applied only at the edges, through toSI / fromSI.
 */
import { requireFinite } from './guards';

export type UnitSystem = 'US' | 'SI';
export type Quantity = 'pressure' | 'length' | 'elevation' | 'diameter' | 'flow' | 'velocity' | 'temperature' | 'density' | 'pressurePerLength';

/** Standard acceleration of gravity, m/s². CGPM 1901 (3rd CGPM); NIST SP 811 (2008) §B.8. */
export const G = 9.80665;
/** Metres per international foot, exact. International Yard and Pound Agreement (1959); NIST SP 811 (2008) App. B. */
export const M_PER_FT = 0.3048;
/** Metres per inch, exact. International Yard and Pound Agreement (1959); NIST SP 811 (2008) App. B. */
export const M_PER_IN = 0.0254;
/** Kilograms per avoirdupois pound, exact. International Yard and Pound Agreement (1959); NIST SP 811 (2008) App. B. */
export const KG_PER_LB = 0.45359237;
/**
 * Pascals per psi (lbf/in²): 0.45359237 kg × 9.80665 m/s² / 0.0254² m² = 6894.757293168361.
 * NIST SP 811 (2008) App. B.8 lists 6.894757 E+03.
 */
export const PA_PER_PSI = (KG_PER_LB * G) / (M_PER_IN * M_PER_IN);
/** Cubic metres per US gallon: 231 in³ = 3.785411784 L, exact. NIST SP 811 (2008) App. B; NIST Handbook 44. */
export const M3_PER_GAL = 3.785411784e-3;
/** Cubic metres per second per US gallon per minute. */
export const M3S_PER_GPM = M3_PER_GAL / 60;
/** kg/m³ per lb/ft³ = 0.45359237 / 0.3048³ (from the exact definitions above). */
export const KGM3_PER_LBFT3 = KG_PER_LB / (M_PER_FT * M_PER_FT * M_PER_FT);
/** Pa/m per psi per 100 ft. */
export const PAM_PER_PSI_PER_100FT = PA_PER_PSI / (100 * M_PER_FT);

export const UNIT_LABELS: Record<UnitSystem, Record<Quantity, string>> = {
  US: {
    pressure: 'psi',
    length: 'ft',
    elevation: 'ft',
    diameter: 'in',
    flow: 'gpm',
    velocity: 'ft/s',
    temperature: '°F',
    density: 'lb/ft³',
    pressurePerLength: 'psi/100 ft',
  },
  SI: {
    pressure: 'kPa',
    length: 'm',
    elevation: 'm',
    diameter: 'mm',
    flow: 'L/s',
    velocity: 'm/s',
    temperature: '°C',
    density: 'kg/m³',
    pressurePerLength: 'kPa/100 m',
  },
};

/** Multiplier from the display unit to SI base units, for the quantities that are pure scalings. */
const FACTORS: Record<UnitSystem, Record<Exclude<Quantity, 'temperature'>, number>> = {
  US: {
    pressure: PA_PER_PSI,
    length: M_PER_FT,
    elevation: M_PER_FT,
    diameter: M_PER_IN,
    flow: M3S_PER_GPM,
    velocity: M_PER_FT,
    density: KGM3_PER_LBFT3,
    pressurePerLength: PAM_PER_PSI_PER_100FT,
  },
  SI: {
    pressure: 1000, // kPa → Pa
    length: 1,
    elevation: 1,
    diameter: 1e-3, // mm → m
    flow: 1e-3, // L/s → m³/s
    velocity: 1,
    density: 1,
    pressurePerLength: 1000 / 100, // kPa/100 m → Pa/m
  },
};

/** °F → °C: t_C = (t_F − 32)/1.8, by the definition of the Fahrenheit scale (NIST SP 811 (2008) §B.9). */
export function fahrenheitToCelsius(tF: number): number {
  return (requireFinite('fahrenheitToCelsius', 'tF', tF) - 32) / 1.8;
}

/** °C → °F: t_F = 1.8·t_C + 32 (NIST SP 811 (2008) §B.9). */
export function celsiusToFahrenheit(tC: number): number {
  return requireFinite('celsiusToFahrenheit', 'tC', tC) * 1.8 + 32;
}

/** Converts a value in the user's unit system to SI base units (temperature → °C). */
export function toSI(q: Quantity, value: number, system: UnitSystem): number {
  requireFinite('toSI', 'value', value);
  if (q === 'temperature') return system === 'US' ? fahrenheitToCelsius(value) : value;
  return value * factorFor(q, system);
}

/** Converts an SI base value (temperature in °C) to the user's unit system. */
export function fromSI(q: Quantity, valueSI: number, system: UnitSystem): number {
  requireFinite('fromSI', 'valueSI', valueSI);
  if (q === 'temperature') return system === 'US' ? celsiusToFahrenheit(valueSI) : valueSI;
  return valueSI / factorFor(q, system);
}

function factorFor(q: Exclude<Quantity, 'temperature'>, system: UnitSystem): number {
  const bySystem = FACTORS[system];
  if (bySystem === undefined) throw new RangeError(`units: unknown unit system ${String(system)}`);
  const factor = bySystem[q];
  if (factor === undefined) throw new RangeError(`units: unknown quantity ${String(q)}`);
  return factor;
}
