/**
 * What the generated range checks (ranges.generated.ts) work with: the bounds of the document's
 * unit system, the path walked so far, the element an issue is reported on, and the one call made
 * for a value out of range. ranges.ts makes the context and collects the issues.
 */
import type { ElementType } from '../errors';
import { LIMITS, type LimitQuantity } from '../model/limits';
import type { UnitSystem } from '../units';

/** One quantity's limits in one unit system, flattened for the per-value test (LIMITS is frozen). */
export interface Bound {
  min: number;
  max: number;
  minExclusive: boolean;
  integer: boolean;
}

function boundsOf(sys: UnitSystem): Readonly<Record<LimitQuantity, Bound>> {
  const b = {} as Record<LimitQuantity, Bound>;
  for (const quantity of Object.keys(LIMITS) as LimitQuantity[]) {
    const lim = LIMITS[quantity];
    b[quantity] = { min: lim[sys].min, max: lim[sys].max, minExclusive: lim.minExclusive, integer: lim.integer };
  }
  return Object.freeze(b);
}
/** The bounds of each unit system, built once. */
export const BOUNDS: Readonly<Record<UnitSystem, Readonly<Record<LimitQuantity, Bound>>>> = Object.freeze({ US: boundsOf('US'), SI: boundsOf('SI') });

/**
 * True exactly when checkRange (model/limits.ts) finds nothing to say: the same tests, without its
 * lookup by name, so the common case (every value in range) allocates nothing.
 */
export function inRange(b: Bound, value: number): boolean {
  return Number.isFinite(value) && (!b.integer || Number.isInteger(value)) && (b.minExclusive ? value > b.min : value >= b.min) && value <= b.max;
}

export interface RangeContext {
  readonly bounds: Readonly<Record<LimitQuantity, Bound>>;
  /** Keys, list indices and record keys from the document to the element being walked. */
  readonly path: (string | number)[];
  /** The element an issue is reported on, its id, and the path length where its fields begin. */
  type: ElementType;
  id: string | null;
  depth: number;
  /** A value out of its quantity's range, at `key` (a key, a list index or a record key) below `path`. */
  fail(quantity: LimitQuantity, key: string | number, value: unknown): void;
}
