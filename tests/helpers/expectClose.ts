/**
 * Float comparison for engineering quantities: passes when
 * |actual − expected| ≤ max(atol, rtol·|expected|).
 * Throws an Error that names the label, both values and the tolerance used.
 */
export interface CloseTolerance {
  /** Relative tolerance (fraction of |expected|). */
  rtol: number;
  /** Absolute tolerance, in the quantity's own units; defaults to 0. */
  atol?: number;
}

export function expectClose(actual: number, expected: number, tolerance: CloseTolerance, label?: string): void {
  const { rtol, atol = 0 } = tolerance;
  const name = label ? `${label}: ` : '';
  if (!Number.isFinite(rtol) || rtol < 0 || !Number.isFinite(atol) || atol < 0) {
    throw new Error(`${name}invalid tolerance rtol=${rtol}, atol=${atol}`);
  }
  if (typeof actual !== 'number' || !Number.isFinite(actual)) {
    throw new Error(`${name}expected a finite number close to ${expected}, got ${String(actual)}`);
  }
  const allowed = Math.max(atol, rtol * Math.abs(expected));
  const diff = Math.abs(actual - expected);
  if (!(diff <= allowed)) {
    const rel = expected !== 0 ? diff / Math.abs(expected) : Infinity;
    throw new Error(
      `${name}expected ${actual} to be within ${allowed} of ${expected} ` +
        `(rtol=${rtol}, atol=${atol}); difference ${diff} (relative ${rel.toExponential(3)})`,
    );
  }
}
