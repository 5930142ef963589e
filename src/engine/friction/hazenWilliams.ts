import { requireNonNegative, requirePositive } from '../guards';
import { M3S_PER_GPM, M_PER_FT, M_PER_IN, PA_PER_PSI } from '../units';

/**
 * The constant of the US pressure form, 4.52 psi/ft for Q in gpm and d in inches (NFPA 13's
 * hydraulic-calculation form; also printed on plumbing sizing references), with the exponents 1.852
 * and 4.8704 (the common rounding is 1.85 and 4.87).
 */
export const HAZEN_WILLIAMS_US_CONSTANT = 4.52;

/**
 * The same formula in SI base units: p [Pa/m] = k·Q^1.852/(C^1.852·D^4.8704), Q in m³/s, D in m.
 * k is the exact unit conversion of 4.52 psi/ft (≈ 1.0448e5); it is not a second, independently
 * rounded constant. For comparison, NFPA 13's SI form 6.05e5 bar/m (Q in L/min, d in mm, exponents
 * 1.85 and 4.87; from memory) agrees with it to about 0.1 % at plumbing sizes.
 */
export const HAZEN_WILLIAMS_SI_CONSTANT = (HAZEN_WILLIAMS_US_CONSTANT * (PA_PER_PSI / M_PER_FT) * M_PER_IN ** 4.8704) / M3S_PER_GPM ** 1.852;

/**
 * Hazen–Williams pressure loss in the form the codes print (US pressure form):
 *
 *   p = 4.52·Q^1.852 / (C^1.852·d^4.8704)   psi per foot, Q in gpm, d inside diameter in inches
 *
 * and its SI equivalent p = 1.0448e5·Q^1.852/(C^1.852·D^4.8704) Pa/m (Q in m³/s, D in m; the constant
 * is HAZEN_WILLIAMS_SI_CONSTANT, the exact conversion of 4.52).
 *
 * Convention: the result is a PRESSURE loss, independent of the water's temperature. The formula has
 * no viscosity and no density: the C tables were fitted to cold water, and the codes apply the
 * pressure form as printed to hot and cold water alike. (Converting a head loss with the density of
 * hot water would make the loss about 1.6 % lower at 140 °F; the printed form does not do that.)
 *
 * @param flowM3s Q, volumetric flow in m³/s (≥ 0)
 * @param innerDiameterM D, inside diameter in m (> 0)
 * @param lengthM L, pipe length in m (≥ 0)
 * @param C Hazen–Williams coefficient, dimensionless (> 0; tabulated 60–150)
 * @returns pressure loss over the length, Pa
 * Validity: water in full, turbulent flow, at velocities usual in building piping; it ignores
 * viscosity, so it is least reliable in small tubes at low flow.
 * Reference: G. S. Williams and A. Hazen, *Hydraulic Tables*, 2nd ed., Wiley (1909); US pressure form
 * as printed by NFPA 13 (hydraulic calculations) and restated by piping-designer.com "Hazen-Williams
 * equation" (which mislabels Q as ft³/s; with gpm and inches the 4.52 constant is right).
 */
export function hazenWilliamsPressureLoss(flowM3s: number, innerDiameterM: number, lengthM: number, C: number): number {
  requireNonNegative('hazenWilliamsPressureLoss', 'flowM3s', flowM3s);
  requirePositive('hazenWilliamsPressureLoss', 'innerDiameterM', innerDiameterM);
  requireNonNegative('hazenWilliamsPressureLoss', 'lengthM', lengthM);
  requirePositive('hazenWilliamsPressureLoss', 'C', C);
  return (HAZEN_WILLIAMS_SI_CONSTANT * lengthM * flowM3s ** 1.852) / (C ** 1.852 * innerDiameterM ** 4.8704);
}

/**
 * Hazen–Williams head loss, SI head form:
 *
 *   h_f = 10.67·L·Q^1.852 / (C^1.852·D^4.8704)
 *
 * Kept for comparisons with programs that work in head (EPANET's head-loss form); the analysis uses
 * the pressure form, hazenWilliamsPressureLoss, which is what the codes print.
 *
 * @param flowM3s Q, volumetric flow in m³/s (≥ 0)
 * @param innerDiameterM D, inside diameter in m (> 0)
 * @param lengthM L, pipe length in m (≥ 0)
 * @param C Hazen–Williams coefficient, dimensionless (> 0; tabulated 60–150)
 * @returns head loss in m of water
 * Validity: as hazenWilliamsPressureLoss.
 * Reference: Williams & Hazen (1909); SI constant 10.67 as commonly published (e.g. piping-designer.com
 * "Hazen-Williams equation"); with ρ = 1000 kg/m³ it is the pressure form's constant to 0.2 %.
 */
export function hazenWilliamsHeadLoss(flowM3s: number, innerDiameterM: number, lengthM: number, C: number): number {
  requireNonNegative('hazenWilliamsHeadLoss', 'flowM3s', flowM3s);
  requirePositive('hazenWilliamsHeadLoss', 'innerDiameterM', innerDiameterM);
  requireNonNegative('hazenWilliamsHeadLoss', 'lengthM', lengthM);
  requirePositive('hazenWilliamsHeadLoss', 'C', C);
  return (10.67 * lengthM * flowM3s ** 1.852) / (C ** 1.852 * innerDiameterM ** 4.8704);
}
