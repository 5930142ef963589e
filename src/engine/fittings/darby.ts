import { requireNonNegative, requirePositive } from '../guards';

/**
 * Darby three-K method: K = K1/Re + Ki·(1 + Kd/Dn^0.3).
 *
 * @param K1 laminar constant, dimensionless (≥ 0)
 * @param Ki turbulent constant, dimensionless (≥ 0)
 * @param Kd diameter constant, in^0.3 (≥ 0)
 * @param Re Reynolds number in the pipe, dimensionless (> 0)
 * @param nominalSizeIn Dn, the NOMINAL pipe size in inches (> 0)
 * @returns K referred to the velocity in the pipe; validity: all Re, any size (fit to data over
 *   roughly 1/2–24 in)
 * Reference: R. Darby, "Correlate pressure drops through fittings", Chemical Engineering 106(7),
 * 101–104 (1999); R. Darby, *Chemical Engineering Fluid Mechanics*, 2nd ed. (2001), Table 7-3.
 */
export function darby3K(K1: number, Ki: number, Kd: number, Re: number, nominalSizeIn: number): number {
  requireNonNegative('darby3K', 'K1', K1);
  requireNonNegative('darby3K', 'Ki', Ki);
  requireNonNegative('darby3K', 'Kd', Kd);
  requirePositive('darby3K', 'Re', Re);
  requirePositive('darby3K', 'nominalSizeIn', nominalSizeIn);
  return K1 / Re + Ki * (1 + Kd / nominalSizeIn ** 0.3);
}
