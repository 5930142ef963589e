/**
 * Helpers between HTML inputs and the document's numbers. An empty number input is "not given"
 * (undefined), never 0 and never NaN. Number boxes are text boxes (inputmode decimal), so what
 * was typed reaches us as typed: a decimal comma is refused with a message that offers the point
 * ("5,5" → "write 5.5"), and never turned into 55.
 */

/** A number box whose text is not a number: kept in the form with its message, never in the draft. */
export class RefusedNumber {
  constructor(
    readonly text: string,
    readonly message: string,
  ) {}
}

export function parseNumberText(text: string): number | undefined | RefusedNumber {
  const t = text
    .trim()
    .replace(/\u2212/g, '-')
    .replace(/\s+/g, '');
  if (t === '') return undefined;
  if (t.includes(',')) {
    if (/^[+-]?\d{1,3},\d{3}$/.test(t))
      return new RefusedNumber(text, `“${text.trim()}” is unclear: write ${t.replace(',', '')}, or ${t.replace(',', '.')} with a decimal point`);
    // refused rather than guessed: the point version is offered, so nothing is read as another number
    if (/^[+-]?\d*,\d+$/.test(t)) return new RefusedNumber(text, `Use a decimal point: write ${t.replace(',', '.')}`);
    return new RefusedNumber(text, 'Use a decimal point and no thousands separators (e.g. 1250.5)');
  }
  const n = Number(t);
  return /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(t) && Number.isFinite(n) ? n : new RefusedNumber(text, 'Enter a number');
}

export function numberOrUndefined(value: unknown): number | undefined | RefusedNumber {
  if (value === '' || value === null || value === undefined) return undefined;
  if (typeof value === 'number') return Number.isFinite(value) ? value : new RefusedNumber(String(value), 'Enter a number');
  return parseNumberText(String(value));
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
