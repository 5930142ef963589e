import { requireNonNegative, requirePositive } from '../guards';

/**
 * Churchill (1977) friction factor, one expression for laminar, transitional and turbulent flow:
 *
 *   f = 8·[ (8/Re)^12 + (A + B)^−1.5 ]^(1/12)
 *   A = [ 2.457·ln( 1 / ((7/Re)^0.9 + 0.27·ε/D) ) ]^16,   B = (37530/Re)^16
 *
 * @param Re Reynolds number, dimensionless (> 0); all regimes
 * @param relRoughness ε/D, dimensionless (≥ 0)
 * @returns Darcy friction factor, dimensionless (reproduces 64/Re in laminar flow and Colebrook
 *   within about 1 % in turbulent flow; its transitional values are an interpolation, not data)
 * Reference: S. W. Churchill, "Friction-factor equation spans all fluid-flow regimes",
 * Chemical Engineering 84(24), 91–92 (7 Nov 1977).
 */
export function churchill1977(Re: number, relRoughness: number): number {
  requirePositive('churchill1977', 'Re', Re);
  requireNonNegative('churchill1977', 'relRoughness', relRoughness);
  const A = (2.457 * Math.log(1 / ((7 / Re) ** 0.9 + 0.27 * relRoughness))) ** 16;
  const B = (37530 / Re) ** 16;
  const f = 8 * ((8 / Re) ** 12 + (A + B) ** -1.5) ** (1 / 12);
  if (!Number.isFinite(f)) {
    throw new RangeError(`churchill1977: not representable at Re = ${Re}, relRoughness = ${relRoughness}`);
  }
  return f;
}
