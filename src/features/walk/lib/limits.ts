/**
 * Plain limits on the walk's number fields: a value outside its plausible range is refused with
 * a message that says the range ("length 0–5,000 ft") and never reaches the draft.
 *
 * The ranges are Headroom's own plausibility bounds for building water piping (common practice,
 * not a code requirement): wide enough for any building a designer would check, narrow enough
 * that a slip of the keyboard (1e9 ft, 99,999 psi) is caught where it is typed. The engine
 * refuses implausible magnitudes too (`value-out-of-range`); these bounds are for the screen.
 */
import type { UnitSystem } from '../../../engine';

export type LimitKind =
  | 'length'
  | 'rise'
  | 'elevation'
  | 'staticPressure'
  | 'pressure'
  | 'pressureLoss'
  | 'temperature'
  | 'flow'
  | 'diameter'
  | 'roughness'
  | 'hazenWilliamsC'
  | 'count'
  | 'seconds';

type Range = { label: string; US: [number, number, string]; SI: [number, number, string] };

export const LIMITS: Record<LimitKind, Range> = {
  length: { label: 'length', US: [0, 5000, 'ft'], SI: [0, 1500, 'm'] },
  rise: { label: 'rise', US: [-1000, 1000, 'ft'], SI: [-300, 300, 'm'] },
  elevation: { label: 'elevation', US: [-1000, 3000, 'ft'], SI: [-300, 900, 'm'] },
  staticPressure: { label: 'static pressure', US: [0, 300, 'psi'], SI: [0, 2000, 'kPa'] },
  pressure: { label: 'pressure', US: [0, 300, 'psi'], SI: [0, 2000, 'kPa'] },
  pressureLoss: { label: 'pressure loss', US: [0, 150, 'psi'], SI: [0, 1000, 'kPa'] },
  temperature: { label: 'water temperature', US: [33, 200, '°F'], SI: [1, 93, '°C'] },
  flow: { label: 'flow', US: [0, 5000, 'gpm'], SI: [0, 300, 'L/s'] },
  diameter: { label: 'inside diameter', US: [0, 48, 'in'], SI: [0, 1200, 'mm'] },
  roughness: { label: 'roughness', US: [0, 0.5, 'in'], SI: [0, 12, 'mm'] },
  hazenWilliamsC: { label: 'Hazen–Williams C', US: [40, 160, ''], SI: [40, 160, ''] },
  count: { label: 'count', US: [1, 10000, ''], SI: [1, 10000, ''] },
  seconds: { label: 'time', US: [0, 86400, 's'], SI: [0, 86400, 's'] },
};

/** Which limit a form field has, by its own name (the last part of its path). */
const BY_FIELD: Record<string, LimitKind> = {
  length: 'length',
  rise: 'rise',
  elevation: 'elevation',
  connectionElevation: 'elevation',
  heightAboveFloor: 'rise',
  staticPressureLow: 'staticPressure',
  staticPressureHigh: 'staticPressure',
  staticPressure: 'staticPressure',
  residualPressure: 'pressure',
  minFlowPressure: 'pressure',
  prvSet: 'pressure',
  setPressure: 'pressure',
  boostGain: 'pressure',
  designGain: 'pressure',
  shutoffGain: 'pressure',
  prvFalloff: 'pressureLoss',
  fixedLoss: 'pressureLoss',
  loss: 'pressureLoss',
  waterTemperature: 'temperature',
  flow: 'flow',
  flowOverride: 'flow',
  continuousDemand: 'flow',
  innerDiameter: 'diameter',
  roughness: 'roughness',
  hazenWilliamsC: 'hazenWilliamsC',
  count: 'count',
  durationSeconds: 'seconds',
  recurrenceSeconds: 'seconds',
};

export function limitKindOf(path: string): LimitKind | null {
  const key = path.split('.').pop() ?? '';
  return BY_FIELD[key] ?? null;
}

const NUM = new Intl.NumberFormat('en', { maximumFractionDigits: 3 });

/** "length 0–5,000 ft": the range in words, with the unit of the document. */
export function rangeText(kind: LimitKind, system: UnitSystem): string {
  const r = LIMITS[kind];
  const [min, max, unit] = r[system];
  const sign = (n: number) => (n < 0 ? `−${NUM.format(-n)}` : NUM.format(n));
  return `${r.label} ${sign(min)}–${sign(max)}${unit ? (unit.startsWith('°') ? unit : ` ${unit}`) : ''}`;
}

/** The message for a value outside its range, or null when it is within (bounds included). */
export function rangeMessage(kind: LimitKind, value: number, system: UnitSystem): string | null {
  const [min, max] = LIMITS[kind][system];
  if (!Number.isFinite(value)) return `Out of range: ${rangeText(kind, system)}`;
  return value < min || value > max ? `Out of range: ${rangeText(kind, system)}` : null;
}
