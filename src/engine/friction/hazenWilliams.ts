import { requireNonNegative, requirePositive } from '../guards';

/**
 * Hazen–Williams head loss, SI head form:
 *
 *   h_f = 10.67·L·Q^1.852 / (C^1.852·D^4.8704)
 *
 * @param flowM3s Q, volumetric flow in m³/s (≥ 0)
 * @param innerDiameterM D, inside diameter in m (> 0)
 * @param lengthM L, pipe length in m (≥ 0)
 * @param C Hazen–Williams coefficient, dimensionless (> 0; tabulated 60–150)
 * @returns head loss in m of water
 * Validity: water at ordinary temperatures (about 4–25 °C, the basis of the C tables) in full,
 * turbulent flow; it ignores viscosity, so it is less reliable for hot water and small tubes.
 * Reference: G. S. Williams and A. Hazen, *Hydraulic Tables*, 2nd ed., Wiley (1909); SI constant 10.67
 * as commonly published (e.g. piping-designer.com "Hazen-Williams equation"), consistent with the
 * NFPA 13 US form p = 4.52·Q^1.852/(C^1.852·d^4.87) psi/ft.
 */
export function hazenWilliamsHeadLoss(flowM3s: number, innerDiameterM: number, lengthM: number, C: number): number {
  requireNonNegative('hazenWilliamsHeadLoss', 'flowM3s', flowM3s);
  requirePositive('hazenWilliamsHeadLoss', 'innerDiameterM', innerDiameterM);
  requireNonNegative('hazenWilliamsHeadLoss', 'lengthM', lengthM);
  requirePositive('hazenWilliamsHeadLoss', 'C', C);
  return (10.67 * lengthM * flowM3s ** 1.852) / (C ** 1.852 * innerDiameterM ** 4.8704);
}
