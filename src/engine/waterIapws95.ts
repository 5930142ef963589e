/**
 * IAPWS-95 residual Helmholtz energy, only what a liquid density at given (T, p) needs:
 * p(ρ, T) = ρ·R·T·(1 + δ·φʳ_δ), with δ = ρ/ρc and τ = Tc/T.
 *
 * Reference: IAPWS R6-95(2018), Revised Release on the IAPWS Formulation 1995 for the Thermodynamic
 * Properties of Ordinary Water Substance for General and Scientific Use, Table 1 (constants),
 * Table 2 (coefficients nᵢ, cᵢ, dᵢ, tᵢ, αᵢ, βᵢ, γᵢ, εᵢ, aᵢ, bᵢ, Aᵢ, Bᵢ, Cᵢ, Dᵢ), Table 5 (φʳ_δ);
 * Wagner & Pruß, J. Phys. Chem. Ref. Data 31, 387–535 (2002). Check values: release Table 7.
 */
import { requirePositive } from './guards';

/** IAPWS R6-95 eqs. (1)–(3): Tc = 647.096 K, ρc = 322 kg/m³, R = 0.46151805 kJ/(kg·K). */
const TC = 647.096;
const RHOC = 322;
const R = 461.51805; // J/(kg·K)

/** Terms 1–7: nᵢ δ^dᵢ τ^tᵢ. */
const POLY: readonly [n: number, d: number, t: number][] = [
  [0.12533547935523e-1, 1, -0.5],
  [0.78957634722828e1, 1, 0.875],
  [-0.87803203303561e1, 1, 1],
  [0.31802509345418, 2, 0.5],
  [-0.26145533859358, 2, 0.75],
  [-0.78199751687981e-2, 3, 0.375],
  [0.88089493102134e-2, 4, 1],
];

/** Terms 8–51: nᵢ δ^dᵢ τ^tᵢ exp(−δ^cᵢ). Tuples are [n, c, d, t]. */
const EXPO: readonly [n: number, c: number, d: number, t: number][] = [
  [-0.66856572307965, 1, 1, 4],
  [0.20433810950965, 1, 1, 6],
  [-0.66212605039687e-4, 1, 1, 12],
  [-0.19232721156002, 1, 2, 1],
  [-0.25709043003438, 1, 2, 5],
  [0.16074868486251, 1, 3, 4],
  [-0.40092828925807e-1, 1, 4, 2],
  [0.39343422603254e-6, 1, 4, 13],
  [-0.75941377088144e-5, 1, 5, 9],
  [0.56250979351888e-3, 1, 7, 3],
  [-0.15608652257135e-4, 1, 9, 4],
  [0.11537996422951e-8, 1, 10, 11],
  [0.36582165144204e-6, 1, 11, 4],
  [-0.13251180074668e-11, 1, 13, 13],
  [-0.62639586912454e-9, 1, 15, 1],
  [-0.10793600908932, 2, 1, 7],
  [0.17611491008752e-1, 2, 2, 1],
  [0.22132295167546, 2, 2, 9],
  [-0.40247669763528, 2, 2, 10],
  [0.58083399985759, 2, 3, 10],
  [0.49969146990806e-2, 2, 4, 3],
  [-0.31358700712549e-1, 2, 4, 7],
  [-0.74315929710341, 2, 4, 10],
  [0.4780732991548, 2, 5, 10],
  [0.20527940895948e-1, 2, 6, 6],
  [-0.13636435110343, 2, 6, 10],
  [0.14180634400617e-1, 2, 7, 10],
  [0.83326504880713e-2, 2, 9, 1],
  [-0.29052336009585e-1, 2, 9, 2],
  [0.38615085574206e-1, 2, 9, 3],
  [-0.20393486513704e-1, 2, 9, 4],
  [-0.16554050063734e-2, 2, 9, 8],
  [0.19955571979541e-2, 2, 10, 6],
  [0.15870308324157e-3, 2, 10, 9],
  [-0.1638856834253e-4, 2, 12, 8],
  [0.43613615723811e-1, 3, 3, 16],
  [0.34994005463765e-1, 3, 4, 22],
  [-0.76788197844621e-1, 3, 4, 23],
  [0.22446277332006e-1, 3, 5, 23],
  [-0.62689710414685e-4, 4, 14, 10],
  [-0.55711118565645e-9, 6, 3, 50],
  [-0.19905718354408, 6, 6, 44],
  [0.31777497330738, 6, 6, 46],
  [-0.11841182425981, 6, 6, 50],
];

/** Terms 52–54: nᵢ δ^dᵢ τ^tᵢ exp(−αᵢ(δ−εᵢ)² − βᵢ(τ−γᵢ)²). Tuples are [n, d, t, α, β, γ, ε]. */
const GAUSS: readonly [number, number, number, number, number, number, number][] = [
  [-0.31306260323435e2, 3, 0, 20, 150, 1.21, 1],
  [0.31546140237781e2, 3, 1, 20, 150, 1.21, 1],
  [-0.25213154341695e4, 3, 4, 20, 250, 1.25, 1],
];

/** Terms 55–56 (non-analytic): nᵢ Δ^bᵢ δ ψ. Tuples are [n, a, b, B, C, D, A, β]. */
const NONANALYTIC: readonly [number, number, number, number, number, number, number, number][] = [
  [-0.14874640856724, 3.5, 0.85, 0.2, 28, 700, 0.32, 0.3],
  [0.31806110878444, 3.5, 0.95, 0.2, 32, 800, 0.32, 0.3],
];

function nonAnalyticPhi(delta: number, tau: number): number {
  let sum = 0;
  const dd = (delta - 1) ** 2;
  for (const [n, a, b, B, C, D, A, beta] of NONANALYTIC) {
    const theta = 1 - tau + A * dd ** (1 / (2 * beta));
    const Delta = theta * theta + B * dd ** a;
    const psi = Math.exp(-C * dd - D * (tau - 1) ** 2);
    sum += n * Delta ** b * delta * psi;
  }
  return sum;
}

/** ∂φʳ/∂δ at (δ, τ), IAPWS R6-95 Table 5. */
function phiRDelta(delta: number, tau: number): number {
  let s = 0;
  for (const [n, d, t] of POLY) s += n * d * delta ** (d - 1) * tau ** t;
  for (const [n, c, d, t] of EXPO) {
    const dc = delta ** c;
    s += n * Math.exp(-dc) * delta ** (d - 1) * tau ** t * (d - c * dc);
  }
  for (const [n, d, t, al, be, ga, ep] of GAUSS) {
    const g = Math.exp(-al * (delta - ep) ** 2 - be * (tau - ga) ** 2);
    s += n * delta ** d * tau ** t * g * (d / delta - 2 * al * (delta - ep));
  }
  // The non-analytic terms matter only near the critical point (ψ ≈ e^(−28·(δ−1)²) ≈ 1e-50 for the
  // liquid at 0–100 °C); a central difference of them is ample there and avoids their long derivative.
  const h = 1e-6;
  s += (nonAnalyticPhi(delta + h, tau) - nonAnalyticPhi(delta - h, tau)) / (2 * h);
  return s;
}

/**
 * IAPWS-95 pressure p(ρ, T) = ρRT(1 + δ·φʳ_δ).
 * @param densityKgM3 ρ in kg/m³ (> 0)
 * @param temperatureK T in K (> 0); the formulation covers 273.16–1273 K up to 1000 MPa
 * @returns pressure in Pa
 */
export function iapws95Pressure(densityKgM3: number, temperatureK: number): number {
  requirePositive('iapws95Pressure', 'densityKgM3', densityKgM3);
  requirePositive('iapws95Pressure', 'temperatureK', temperatureK);
  const delta = densityKgM3 / RHOC;
  const tau = TC / temperatureK;
  return densityKgM3 * R * temperatureK * (1 + delta * phiRDelta(delta, tau));
}

/**
 * Liquid density at (T, p) from IAPWS-95, by Newton iteration on p(ρ, T) = p from a liquid start
 * (1000 kg/m³), to a relative change below 1e-12. Meant for compressed or saturated liquid below
 * about 100 °C; it throws if the iteration leaves the liquid region or does not converge.
 */
export function iapws95LiquidDensity(temperatureK: number, pressurePa: number): number {
  requirePositive('iapws95LiquidDensity', 'temperatureK', temperatureK);
  requirePositive('iapws95LiquidDensity', 'pressurePa', pressurePa);
  let rho = 1000;
  for (let i = 0; i < 50; i++) {
    const p = iapws95Pressure(rho, temperatureK);
    const dr = rho * 1e-7;
    const dpdr = (iapws95Pressure(rho + dr, temperatureK) - iapws95Pressure(rho - dr, temperatureK)) / (2 * dr);
    if (!(dpdr > 0)) break;
    const next = rho - (p - pressurePa) / dpdr;
    if (!(next > RHOC)) break;
    if (Math.abs(next - rho) <= 1e-12 * rho) return next;
    rho = next;
  }
  throw new RangeError(`iapws95LiquidDensity: no liquid density found at T = ${temperatureK} K, p = ${pressurePa} Pa`);
}
