/**
 * Helpers between HTML inputs and the document's numbers. An empty number input is "not given"
 * (undefined), never 0 and never NaN.
 */
export function numberOrUndefined(value: unknown): number | undefined {
  if (value === '' || value === null || value === undefined) return undefined;
  const n = typeof value === 'number' ? value : Number(String(value).trim());
  return Number.isFinite(n) ? n : Number.NaN;
}

export const numberInput = { setValueAs: numberOrUndefined } as const;

/** zod's messages in the words of the screen. */
export function plainError(message: string | undefined): string | undefined {
  if (!message) return undefined;
  if (/expected number, received (undefined|NaN)/.test(message)) return 'Enter a number';
  if (/expected number/.test(message)) return 'Enter a number';
  if (/Too small: expected number to be >0/.test(message)) return 'Must be more than zero';
  if (/Too small: expected number to be >=0/.test(message)) return 'Must be zero or more';
  if (/expected int/.test(message)) return 'Enter a whole number';
  if (/Too small: expected string to have >=1/.test(message)) return 'Required';
  if (/expected string, received undefined/.test(message)) return 'Required';
  return message;
}

/** A new id not yet in `taken`: prefix-1, prefix-2, … */
export function freshId(prefix: string, taken: Iterable<string>): string {
  const used = new Set(taken);
  for (let i = 1; ; i++) {
    const id = `${prefix}-${i}`;
    if (!used.has(id)) return id;
  }
}
