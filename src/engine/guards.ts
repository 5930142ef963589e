/**
 * Argument guards shared by the correlations. They throw a plain RangeError with a
 * message naming the function and argument; the analysis layer wraps these into its
 * structured input errors. Nothing here keeps state.
 */

export function requireFinite(fn: string, name: string, value: number): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new RangeError(`${fn}: ${name} must be a finite number, got ${String(value)}`);
  }
  return value;
}

export function requirePositive(fn: string, name: string, value: number): number {
  requireFinite(fn, name, value);
  if (!(value > 0)) throw new RangeError(`${fn}: ${name} must be greater than 0, got ${value}`);
  return value;
}

export function requireNonNegative(fn: string, name: string, value: number): number {
  requireFinite(fn, name, value);
  if (value < 0) throw new RangeError(`${fn}: ${name} must not be negative, got ${value}`);
  return value;
}
