/** Number formatting for the walk's screens (display only; the engine's numbers are not rounded). */
const cache = new Map<number, Intl.NumberFormat>();
function formatter(digits: number) {
  let f = cache.get(digits);
  if (!f) {
    f = new Intl.NumberFormat('en', { minimumFractionDigits: digits, maximumFractionDigits: digits });
    cache.set(digits, f);
  }
  return f;
}

export function fmt(value: number | null | undefined, digits = 1): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  // −0.0 reads as a sign error; show 0.0
  const rounded = Number(value.toFixed(digits));
  return formatter(digits).format(rounded === 0 ? 0 : value);
}

/** A change with its sign always written: +1.2, −3.4 (a true minus sign). */
export function signed(value: number | null | undefined, digits = 1): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const text = fmt(Math.abs(value), digits);
  if (Number(Math.abs(value).toFixed(digits)) === 0) return text;
  return value < 0 ? `−${text}` : `+${text}`;
}
