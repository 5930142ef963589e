import { requireNonNegative, requirePositive } from '../guards';

/**
 * Hooper (1981) two-K method: K = K1/Re + K∞·(1 + 1/D).
 *
 * @param K1 laminar constant of the fitting, dimensionless (≥ 0)
 * @param Kinf turbulent constant of the fitting, dimensionless (≥ 0)
 * @param Re Reynolds number in the pipe, dimensionless (> 0)
 * @param innerDiameterIn D, the actual inside diameter in inches (> 0)
 * @returns K referred to the velocity in the pipe; validity: Re ≥ about 10 (the method's paper),
 *   constants tabulated for screwed/flanged steel fittings
 * Reference: W. B. Hooper, "The two-K method predicts head losses in pipe fittings",
 * Chemical Engineering 88(17), 96–100 (24 Aug 1981).
 */
export function hooper2K(K1: number, Kinf: number, Re: number, innerDiameterIn: number): number {
  requireNonNegative('hooper2K', 'K1', K1);
  requireNonNegative('hooper2K', 'Kinf', Kinf);
  requirePositive('hooper2K', 'Re', Re);
  requirePositive('hooper2K', 'innerDiameterIn', innerDiameterIn);
  return K1 / Re + Kinf * (1 + 1 / innerDiameterIn);
}
