/**
 * Properties of liquid water at about 1 atm, from the IAPWS formulations:
 *
 * - Density: IAPWS-95 (IAPWS R6-95(2018), "Revised Release on the IAPWS Formulation 1995 for the
 *   Thermodynamic Properties of Ordinary Water Substance for General and Scientific Use";
 *   Wagner & Pruß, J. Phys. Chem. Ref. Data 31, 387–535 (2002)). The pressure equation
 *   p = ρRT(1 + δ·∂φʳ/∂δ) is solved for ρ at p = 101 325 Pa.
 * - Viscosity: IAPWS R12-08, "Release on the IAPWS Formulation 2008 for the Viscosity of Ordinary
 *   Water Substance", industrial form (critical enhancement μ̄₂ = 1, which the release allows outside
 *   the near-critical region).
 *
 * Valid here for 0.01–100 °C at 1 atm (liquid); the analysis layer validates the range.
 */
import { iapws95Pressure, iapws95LiquidDensity } from './waterIapws95';
import { requireFinite, requireNonNegative, requirePositive } from './guards';

export interface WaterProperties {
  temperatureC: number;
  /** kg/m³ */
  density: number;
  /** Pa·s */
  dynamicViscosity: number;
  /** m²/s */
  kinematicViscosity: number;
}

/** Standard atmosphere, Pa (ISO 2533; NIST SP 811 (2008) App. B: 1 atm = 101 325 Pa exactly). */
export const STANDARD_ATMOSPHERE_PA = 101_325;
/** Offset between the Celsius and kelvin scales, K (SI Brochure, 9th ed. (2019) §2.3.1). */
export const KELVIN_OFFSET = 273.15;

export { iapws95Pressure };

/** Reference constants of IAPWS R12-08 §2: T* = 647.096 K, ρ* = 322 kg/m³, μ* = 1e-6 Pa·s. */
const T_STAR = 647.096;
const RHO_STAR = 322;
const MU_STAR = 1e-6;
/** IAPWS R12-08 Table 1, coefficients Hᵢ of μ̄₀. */
const H0 = [1.67752, 2.20462, 0.6366564, -0.241605] as const;
/** IAPWS R12-08 Table 2, coefficients Hᵢⱼ of μ̄₁ (row i = 0…5, column j = 0…6). */
const H1: readonly (readonly number[])[] = [
  [5.20094e-1, 2.22531e-1, -2.81378e-1, 1.61913e-1, -3.25372e-2, 0, 0],
  [8.50895e-2, 9.99115e-1, -9.06851e-1, 2.57399e-1, 0, 0, 0],
  [-1.08374, 1.88797, -7.72479e-1, 0, 0, 0, 0],
  [-2.89555e-1, 1.26613, -4.89837e-1, 0, 6.98452e-2, 0, -4.35673e-3],
  [0, 0, -2.5704e-1, 0, 0, 8.72102e-3, 0],
  [0, 1.20573e-1, 0, 0, 0, 0, -5.93264e-4],
];

/**
 * IAPWS 2008 viscosity, industrial formulation: μ = μ*·μ̄₀(T̄)·μ̄₁(T̄, ρ̄), where
 * μ̄₀ = 100·√T̄ / Σᵢ₌₀³ Hᵢ/T̄ⁱ and μ̄₁ = exp[ρ̄·Σᵢ₌₀⁵ (1/T̄ − 1)ⁱ·Σⱼ₌₀⁶ Hᵢⱼ(ρ̄ − 1)ʲ].
 *
 * @param temperatureK T in K (the release covers 253.15–1173.15 K for the stable fluid)
 * @param densityKgM3 ρ in kg/m³
 * @returns dynamic viscosity μ in Pa·s
 * Reference: IAPWS R12-08 (2008), eqs. (10)–(12), Tables 1–2; check values Table 4.
 */
export function iapws2008Viscosity(temperatureK: number, densityKgM3: number): number {
  requirePositive('iapws2008Viscosity', 'temperatureK', temperatureK);
  requireNonNegative('iapws2008Viscosity', 'densityKgM3', densityKgM3);
  const Tr = temperatureK / T_STAR;
  const rr = densityKgM3 / RHO_STAR;
  let denom = 0;
  for (let i = 0; i < H0.length; i++) denom += H0[i] / Tr ** i;
  const mu0 = (100 * Math.sqrt(Tr)) / denom;
  let sum = 0;
  const a = 1 / Tr - 1;
  const b = rr - 1;
  for (let i = 0; i < H1.length; i++) {
    let inner = 0;
    for (let j = 0; j < H1[i].length; j++) inner += H1[i][j] * b ** j;
    sum += a ** i * inner;
  }
  const mu1 = Math.exp(rr * sum);
  return MU_STAR * mu0 * mu1;
}

/**
 * Density, dynamic and kinematic viscosity of liquid water at 1 atm and temperatureC (°C).
 * Density from IAPWS-95 at 101 325 Pa; viscosity from IAPWS 2008 at that density; ν = μ/ρ.
 */
export function waterProperties(temperatureC: number): WaterProperties {
  requireFinite('waterProperties', 'temperatureC', temperatureC);
  const T = temperatureC + KELVIN_OFFSET;
  if (!(T > 0)) throw new RangeError(`waterProperties: temperature ${temperatureC} °C is below absolute zero`);
  const density = iapws95LiquidDensity(T, STANDARD_ATMOSPHERE_PA);
  const dynamicViscosity = iapws2008Viscosity(T, density);
  return { temperatureC, density, dynamicViscosity, kinematicViscosity: dynamicViscosity / density };
}
