/** Number and date formatting shared by the PDF and the e-mail text (one format, so tests can match it). */

/**
 * Decimals printed per unit: 0.01 psi and 0.1 kPa are both finer than a test gauge reads
 * (common practice); lengths to 0.1 ft / 0.01 m; flows to 0.1 gpm / 0.01 L/s.
 */
const DECIMALS: Record<string, number> = {
  psi: 2,
  kPa: 1,
  ft: 1,
  m: 2,
  in: 3,
  mm: 1,
  gpm: 1,
  'L/s': 2,
  'ft/s': 2,
  'm/s': 2,
  '°F': 1,
  '°C': 1,
};

export function num(value: number | null | undefined, unit: string): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const d = DECIMALS[unit] ?? 2;
  const s = value.toFixed(d);
  // no "-0.00"
  return /^-0(\.0+)?$/.test(s) ? s.slice(1) : s;
}

export const withUnit = (value: number | null | undefined, unit: string) => `${num(value, unit)} ${unit}`;

/** Signed, for ledger changes and margins: "+1.23" / "-0.45". */
export function signed(value: number, unit: string): string {
  const s = num(value, unit);
  return value > 0 && s !== num(0, unit) ? `+${s}` : s;
}

/** An ISO time as "2026-12-01 14:03 UTC" (no locale: the same bytes on every server). */
export function utc(isoTime: string): string {
  const d = new Date(isoTime);
  return `${d.toISOString().slice(0, 10)} ${d.toISOString().slice(11, 16)} UTC`;
}
