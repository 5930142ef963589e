/**
 * What only paper and e-mail print: times. Numbers go through src/shared/format/quantity.ts, the
 * format the screens use too.
 */

/** An ISO time as "2026-12-01 14:03 UTC" (no locale: the same bytes on every server). */
export function utc(isoTime: string): string {
  const d = new Date(isoTime);
  return `${d.toISOString().slice(0, 10)} ${d.toISOString().slice(11, 16)} UTC`;
}
