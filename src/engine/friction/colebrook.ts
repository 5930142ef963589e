import { requireNonNegative, requirePositive } from '../guards';
import { swameeJain1976 } from './swameeJain';

/** Relative change of 1/√f at which the Colebrook iteration stops (the brief's requirement). */
export const COLEBROOK_TOLERANCE = 1e-10;
const MAX_ITERATIONS = 100;

/**
 * Colebrook (1939) equation for the Darcy friction factor of turbulent flow in commercial pipe,
 * solved iteratively (Newton's method on x = 1/√f, started from Swamee–Jain) until the relative
 * change of x is below 1e-10:
 *
 *   1/√f = −2·log10( (ε/D)/3.7 + 2.51/(Re·√f) )
 *
 * @param Re Reynolds number, dimensionless (> 0); the equation is meant for turbulent flow, Re ≥ 4000
 * @param relRoughness relative roughness ε/D, dimensionless (≥ 0; the Moody chart spans 0–0.05)
 * @returns Darcy friction factor, dimensionless
 * Reference: C. F. Colebrook, "Turbulent flow in pipes, with particular reference to the transition
 * region between the smooth and rough pipe laws", J. Inst. Civil Eng. 11(4), 133–156 (1939).
 */
export function colebrook(Re: number, relRoughness: number): number {
  requirePositive('colebrook', 'Re', Re);
  requireNonNegative('colebrook', 'relRoughness', relRoughness);
  const a = relRoughness / 3.7;
  const b = 2.51 / Re;
  const k = 2 / Math.LN10;
  let x = 1 / Math.sqrt(swameeJain1976(Math.max(Re, 1), relRoughness));
  for (let i = 0; i < MAX_ITERATIONS; i++) {
    const arg = a + b * x;
    const F = x + 2 * Math.log10(arg);
    const dF = 1 + (k * b) / arg;
    let next = x - F / dF;
    if (!(next > 0)) next = x / 2; // keep the iterate in the physical branch
    const change = Math.abs(next - x) / next;
    x = next;
    if (change < COLEBROOK_TOLERANCE) return 1 / (x * x);
  }
  throw new RangeError(`colebrook: no convergence for Re = ${Re}, relRoughness = ${relRoughness}`);
}
