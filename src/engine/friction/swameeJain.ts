import { requireNonNegative, requirePositive } from '../guards';

/**
 * Swamee–Jain (1976) explicit approximation of the Colebrook equation:
 *
 *   f = 0.25 / [ log10( (ε/D)/3.7 + 5.74/Re^0.9 ) ]²
 *
 * @param Re Reynolds number, dimensionless (> 0); stated validity 5e3 ≤ Re ≤ 1e8
 * @param relRoughness ε/D, dimensionless (≥ 0); stated validity 1e-6 ≤ ε/D ≤ 5e-2
 * @returns Darcy friction factor, dimensionless (within about 1 % of Colebrook in its range)
 * Reference: P. K. Swamee and A. K. Jain, "Explicit equations for pipe-flow problems",
 * J. Hydraulics Division (ASCE) 102(5), 657–664 (1976).
 */
export function swameeJain1976(Re: number, relRoughness: number): number {
  requirePositive('swameeJain1976', 'Re', Re);
  requireNonNegative('swameeJain1976', 'relRoughness', relRoughness);
  const l = Math.log10(relRoughness / 3.7 + 5.74 / Re ** 0.9);
  if (!(l < 0)) {
    throw new RangeError(`swameeJain1976: outside the formula's domain at Re = ${Re}, relRoughness = ${relRoughness}`);
  }
  return 0.25 / (l * l);
}
