import { requirePositive } from '../guards';

/**
 * Darcy friction factor of fully developed laminar flow in a round pipe (Hagen–Poiseuille):
 * f = 64/Re.
 *
 * @param Re Reynolds number ρVD/μ, dimensionless (> 0); valid for Re below about 2000–2300
 * @returns Darcy friction factor, dimensionless
 * Reference: F. M. White, *Fluid Mechanics*, 7th ed. (2011), eq. (6.49); any fluid-mechanics text.
 */
export function laminarFrictionFactor(Re: number): number {
  requirePositive('laminarFrictionFactor', 'Re', Re);
  return 64 / Re;
}
