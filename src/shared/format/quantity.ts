/**
 * One number format for the screens, the issued summary, the e-mail text and the field-change words:
 * a value is printed by its unit, so the same value in the same unit reads the same everywhere.
 * Display only: the engine's numbers are never rounded (the CSV and workbook exports carry them whole).
 *
 * - Decimals come from the unit, never from the caller (DECIMALS below).
 * - Negative values carry a true minus sign, U+2212 ("−"): in Work Sans (the screens' and the PDF's
 *   font, which carries the glyph) it is exactly as wide as "+" and the digits are tabular, so signed
 *   columns line up, and it cannot be mistaken for the hyphen of a range ("Level 2 – Level 4").
 *   Spreadsheet users get numbers from the exports, not from copied text.
 * - No digit grouping ("1234.5", not "1,234.5"): a comma reads as the decimal sign to many SI users.
 * - A value that rounds to zero prints as zero without a sign ("0.00", never "−0.00") ...
 * - ... except through `signed`, whose sign is the message (a margin, a change): a value that is not
 *   zero but rounds to zero prints its sign and its first significant digit ("−0.004"), so a failing
 *   margin never reads as "0.00" beside a FAIL, and a passing one never reads as negative.
 */

/**
 * Decimals printed per unit: what a gauge, tape or meter reads and what a designer writes (common
 * practice), at about the same resolution in both unit systems.
 */
export const DECIMALS = {
  // pressure: 0.01 psi ≈ 0.07 kPa, finer than a test gauge reads; margins are compared at this step
  psi: 2,
  kPa: 1,
  // pressure per length (friction gradient): 0.01 psi/100 ft ≈ 0.2 kPa/100 m
  'psi/100 ft': 2,
  'kPa/100 m': 1,
  // length and elevation: a tape's tenth of a foot ≈ 3 cm; centimetres
  ft: 1,
  m: 2,
  // inside diameter: pipe dimension tables print 0.001 in and 0.1 mm
  in: 3,
  mm: 1,
  // flow: 0.1 gpm ≈ 0.006 L/s
  gpm: 1,
  'L/s': 2,
  // velocity: limits are written to 0.1; two decimals keep a value just over its limit visibly over
  'ft/s': 2,
  'm/s': 2,
  // temperature: a thermometer's 1 °F ≈ 0.5 °C; a temperature difference in kelvin as in °C
  '°F': 0,
  '°C': 1,
  K: 1,
  // density of water: the property tables' resolution
  'lb/ft³': 3,
  'kg/m³': 2,
  // volume (expansion tank): tanks are rated to 0.1 gal; 0.01 gal ≈ 0.04 L
  gal: 2,
  L: 1,
  // heat loss: whole Btu/h and watts
  'Btu/h': 0,
  W: 0,
  'Btu/h per ft': 1,
  'W/m': 1,
  // fixture units: the code tables list values such as 2.25 and 0.25 WSFU
  WSFU: 2,
  // a recompute time on the screen
  ms: 0,
  // dimensionless: loss coefficients as K tables print them; Hazen–Williams C as a whole number;
  // an expansion tank's acceptance factor as the sizing formula is written out
  'loss coefficient': 2,
  'Hazen–Williams C': 0,
  'acceptance factor': 3,
} as const satisfies Record<string, number>;

/** A unit (or, for a dimensionless number, the name of the quantity) that has a row in DECIMALS. */
export type Unit = keyof typeof DECIMALS;

/**
 * The few quantities read finer than the ordinary one of their unit (the quantity and the unit
 * choose the decimals; without a kind, the unit's row above).
 */
export const FINER = {
  // a recirculation loop carries a few gpm: 0.76 gpm must not print as 0.8
  'loop flow': { gpm: 2, 'L/s': 3 },
  // absolute roughness: thousandths of an inch or hundredths of a millimetre, as material tables give it
  roughness: { in: 6, mm: 4 },
  // kinematic viscosity of water in mm²/s (≈ 1): the property tables' four decimals
  'kinematic viscosity': { 'mm²/s': 4 },
} as const satisfies Record<string, Record<string, number>>;

export type FinerKind = keyof typeof FINER;
type UnitArg = Unit | (string & {});

/** U+2212, the minus sign (see the module's comment for why). */
export const MINUS = '\u2212';

const missing = (v: number | null | undefined): v is null | undefined => v === null || v === undefined || !Number.isFinite(v);

/** The decimals of a unit; a unit without a row is a programming error, named. */
export function decimalsOf(unit: string, kind?: FinerKind): number {
  const d = kind ? (FINER[kind] as Record<string, number>)[unit] : (DECIMALS as Record<string, number>)[unit];
  if (d === undefined)
    throw new RangeError(`format: no decimals are set for ${kind ? `${kind} in` : 'the unit'} "${unit}" (add it to ${kind ? 'FINER' : 'DECIMALS'})`);
  return d;
}

/** The smallest step a unit prints: 0.01 for psi, 0.1 for kPa. */
export const stepOf = (unit: string, kind?: FinerKind): number => 10 ** -decimalsOf(unit, kind);

/** The magnitude rounded to the unit's decimals ("12.30"), with whether it is zero at that step. */
function magnitude(value: number, unit: string, kind?: FinerKind): { text: string; zero: boolean } {
  const text = Math.abs(value).toFixed(decimalsOf(unit, kind));
  return { text, zero: /^0(\.0+)?$/.test(text) };
}

/** The number alone ("12.30", "−3.4"); "—" when there is none. A value that rounds to zero reads "0.00". */
export function num(value: number | null | undefined, unit: UnitArg, kind?: FinerKind): string {
  if (missing(value)) return '—';
  const { text, zero } = magnitude(value, unit, kind);
  return value < 0 && !zero ? `${MINUS}${text}` : text;
}

/** The number and its unit: "12.30 psi"; "— psi" when there is none. */
export const withUnit = (value: number | null | undefined, unit: UnitArg, kind?: FinerKind): string => `${num(value, unit, kind)} ${unit}`;

/**
 * A margin or a change with its sign always written: "+1.23", "−0.45", "0.00" for zero. A value that is
 * not zero but rounds to zero keeps its sign and shows its first significant digit: "−0.004".
 */
export function signed(value: number | null | undefined, unit: UnitArg, kind?: FinerKind): string {
  if (missing(value)) return '—';
  if (value === 0) return num(0, unit, kind);
  const { text, zero } = magnitude(value, unit, kind);
  const shown = zero ? firstSignificant(Math.abs(value)) : text;
  return `${value < 0 ? MINUS : '+'}${shown}`;
}

const ONE_SIGNIFICANT = new Intl.NumberFormat('en', { maximumSignificantDigits: 1, useGrouping: false });
/** 0.0043 → "0.004", without exponent notation however small. */
const firstSignificant = (v: number) => ONE_SIGNIFICANT.format(v);

/**
 * A chart axis label: whole numbers for steps of 1 or more, else the step's own decimals (at most 3),
 * so the labels of one axis have the same decimals; never "−0".
 */
export function axisTickLabel(value: number, step: number): string {
  const decimals = step >= 1 ? 0 : Math.min(3, Math.ceil(-Math.log10(step) - 1e-9));
  const text = Math.abs(value).toFixed(decimals);
  return value < 0 && !/^0(\.0+)?$/.test(text) ? `${MINUS}${text}` : text;
}
