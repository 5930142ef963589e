/**
 * Last guard of the pipeline: no NaN or Infinity may reach a result. A non-finite number here
 * is a defect of the engine (the input stages reject non-finite input), so it throws a plain
 * Error naming the path rather than an input error.
 */
export function assertFiniteDeep(value: unknown, path = 'analysis'): void {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new Error(`engine defect: ${path} is ${String(value)}`);
    return;
  }
  if (value === null || typeof value !== 'object') return;
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const v = value[i];
      if (typeof v === 'number') {
        if (!Number.isFinite(v)) throw new Error(`engine defect: ${path}[${i}] is ${String(v)}`);
      } else if (v !== null && typeof v === 'object') assertFiniteDeep(v, `${path}[${i}]`);
    }
    return;
  }
  for (const key in value as Record<string, unknown>) {
    const v = (value as Record<string, unknown>)[key];
    if (typeof v === 'number') {
      if (!Number.isFinite(v)) throw new Error(`engine defect: ${path}.${key} is ${String(v)}`);
    } else if (v !== null && typeof v === 'object') assertFiniteDeep(v, `${path}.${key}`);
  }
}
