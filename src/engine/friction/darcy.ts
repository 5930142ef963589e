import { requireFinite, requireNonNegative } from '../guards';
import { churchill1977 } from './churchill';
import { colebrook } from './colebrook';
import { laminarFrictionFactor } from './laminar';
import { swameeJain1976 } from './swameeJain';
import type { FrictionMethod } from './registry';

export type FlowRegime = 'laminar' | 'transitional' | 'turbulent';

/**
 * Regime limits on Re. 2300: the usual lower limit of transition in pipes (White, *Fluid Mechanics*,
 * 7th ed. (2011) §6.1 gives ≈ 2300); 4000: the lower limit of the Moody chart's turbulent region and
 * of Colebrook's use (common practice).
 */
export const LAMINAR_RE_LIMIT = 2300;
export const TURBULENT_RE_LIMIT = 4000;

export interface DarcyFrictionResult {
  f: number;
  regime: FlowRegime;
  /** True when the correlation was used outside its published range (or in transition). */
  outsideValidity: boolean;
  note?: string;
}

type ExplicitMethod = Exclude<FrictionMethod, 'hazen-williams'>;

const TURBULENT: Record<ExplicitMethod, (Re: number, eD: number) => number> = {
  colebrook,
  'swamee-jain': swameeJain1976,
  'churchill-1977': churchill1977,
};

/**
 * Darcy friction factor by the chosen method with a documented regime treatment:
 * Re = 0 → f = 0 (no flow, no loss); Re < 2300 → laminar 64/Re; 2300 ≤ Re < 4000 → Churchill 1977
 * (valid across regimes), flagged outsideValidity because transitional flow is not reproducible;
 * Re ≥ 4000 → the chosen method, flagged when Re or ε/D is outside its published range.
 */
export function darcyFrictionFactor(method: ExplicitMethod, Re: number, relRoughness: number): DarcyFrictionResult {
  requireNonNegative('darcyFrictionFactor', 'Re', Re);
  requireNonNegative('darcyFrictionFactor', 'relRoughness', relRoughness);
  const turbulent = TURBULENT[method];
  if (turbulent === undefined) throw new RangeError(`darcyFrictionFactor: unknown method ${String(method)}`);
  if (Re === 0) return { f: 0, regime: 'laminar', outsideValidity: false, note: 'no flow' };
  if (Re < LAMINAR_RE_LIMIT) return { f: laminarFrictionFactor(Re), regime: 'laminar', outsideValidity: false };
  if (Re < TURBULENT_RE_LIMIT) {
    return {
      f: churchill1977(Re, relRoughness),
      regime: 'transitional',
      outsideValidity: true,
      note: 'transitional flow (2300 ≤ Re < 4000): Churchill 1977 used; friction is uncertain here',
    };
  }
  const f = requireFinite('darcyFrictionFactor', 'f', turbulent(Re, relRoughness));
  const range = TURBULENT_VALIDITY[method];
  const outside = Re < range.reMin || Re > range.reMax || relRoughness < range.eDMin || relRoughness > range.eDMax;
  return outside
    ? { f, regime: 'turbulent', outsideValidity: true, note: `${method} used outside its published range (${range.text})` }
    : { f, regime: 'turbulent', outsideValidity: false };
}

/** Published ranges of the turbulent correlations (see each function's doc comment). */
const TURBULENT_VALIDITY: Record<ExplicitMethod, { reMin: number; reMax: number; eDMin: number; eDMax: number; text: string }> = {
  // Colebrook's own tests spanned the Moody chart: Re 4e3–1e8, ε/D up to 0.05 (Moody 1944 chart range).
  colebrook: { reMin: 4e3, reMax: 1e8, eDMin: 0, eDMax: 0.05, text: '4e3 ≤ Re ≤ 1e8, ε/D ≤ 0.05' },
  // Swamee & Jain (1976): 5e3 ≤ Re ≤ 1e8, 1e-6 ≤ ε/D ≤ 1e-2 … 5e-2 as published.
  'swamee-jain': { reMin: 5e3, reMax: 1e8, eDMin: 1e-6, eDMax: 5e-2, text: '5e3 ≤ Re ≤ 1e8, 1e-6 ≤ ε/D ≤ 0.05' },
  // Churchill (1977) spans all regimes; ε/D range of the Moody chart.
  'churchill-1977': { reMin: 0, reMax: Infinity, eDMin: 0, eDMax: 0.05, text: 'all Re, ε/D ≤ 0.05' },
};
