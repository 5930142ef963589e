import { requirePositive } from '../guards';

/** Sharp-edged (flush) entrance from a large vessel: K = 0.5 (Crane TP-410 (2009); Idelchik, Handbook of Hydraulic Resistance, 4th ed.; Blevins, Applied Fluid Dynamics Handbook (1984) — as collected in CalebBell/fluids 1.3.1 `entrance_sharp`). */
export const ENTRANCE_SHARP_K = 0.5;
/** Inward-projecting (re-entrant) entrance: K = 0.78 (Crane TP-410 (2009), via CalebBell/fluids 1.3.1 test `entrance_distance(Di=0.1, method="Crane")` = 0.78). */
export const ENTRANCE_REENTRANT_K = 0.78;
/** Exit into a large vessel: K = 1.0, the whole velocity head is lost (common practice; CalebBell/fluids 1.3.1 `exit_normal`). */
export const EXIT_K = 1.0;

/**
 * Sudden expansion, Borda–Carnot: K = (1 − β²)², β = d_small/d_large.
 * @param dSmallM upstream (small) inside diameter, m (> 0)
 * @param dLargeM downstream (large) inside diameter, m (≥ dSmallM)
 * @returns K referred to the SMALL (upstream) pipe velocity; exact for turbulent flow with uniform
 *   velocity profiles (momentum balance)
 * Reference: Crane TP-410 (2009), sudden enlargement with θ = 180°; CalebBell/fluids 1.3.1 `diffuser_sharp`; I. E. Idelchik, *Handbook of
 * Hydraulic Resistance*, 4th ed. (2008), sudden expansion.
 */
export function suddenExpansionK(dSmallM: number, dLargeM: number): number {
  requirePositive('suddenExpansionK', 'dSmallM', dSmallM);
  requirePositive('suddenExpansionK', 'dLargeM', dLargeM);
  if (dLargeM < dSmallM) throw new RangeError(`suddenExpansionK: dLargeM (${dLargeM}) is smaller than dSmallM (${dSmallM})`);
  const b2 = (dSmallM / dLargeM) ** 2;
  return (1 - b2) ** 2;
}

/**
 * Sudden contraction, Crane (θ = 180°): K = 0.5·(1 − β²), β = d_small/d_large.
 * @param dLargeM upstream (large) inside diameter, m (> 0)
 * @param dSmallM downstream (small) inside diameter, m (≤ dLargeM)
 * @returns K referred to the SMALL (downstream) pipe velocity; turbulent flow
 * Reference: Crane TP-410 (2009), sudden contraction with θ = 180°; CalebBell/fluids 1.3.1 `contraction_sharp(method="Crane")`.
 */
export function suddenContractionK(dLargeM: number, dSmallM: number): number {
  requirePositive('suddenContractionK', 'dLargeM', dLargeM);
  requirePositive('suddenContractionK', 'dSmallM', dSmallM);
  if (dSmallM > dLargeM) throw new RangeError(`suddenContractionK: dSmallM (${dSmallM}) is larger than dLargeM (${dLargeM})`);
  const b2 = (dSmallM / dLargeM) ** 2;
  return 0.5 * (1 - b2);
}

/**
 * Re-refers a loss coefficient to another pipe's velocity: K2 = K1·(D2/D1)⁴ (same loss, V ∝ 1/D²).
 * @param K loss coefficient referred to the pipe of fromDiameterM
 * @param fromDiameterM D1, m; @param toDiameterM D2, m
 * Reference: Crane TP-410 (2009) (K referred to another size); CalebBell/fluids 1.3.1 `change_K_basis`.
 */
export function changeKBasis(K: number, fromDiameterM: number, toDiameterM: number): number {
  requirePositive('changeKBasis', 'fromDiameterM', fromDiameterM);
  requirePositive('changeKBasis', 'toDiameterM', toDiameterM);
  if (!Number.isFinite(K) || K < 0) throw new RangeError(`changeKBasis: K must be a finite number ≥ 0, got ${K}`);
  return K * (toDiameterM / fromDiameterM) ** 4;
}
