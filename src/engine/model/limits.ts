/**
 * Plausible ranges of every numeric input of a system document, one table by quantity.
 *
 * A value outside its range is not a building anyone designs: it is a typing slip ("5,5" read as
 * 55, an extra zero, a unit mix-up) or an attack on the server. The engine refuses it with
 * `value-out-of-range` naming the element and field (analysis/input.ts); the client's forms use
 * `checkRange` to refuse it before it is saved. The message states the range in the document's
 * own units ("length 0–5,000 ft").
 *
 * Each range is written twice, in round numbers of each unit system (the US and SI bounds are
 * close, not exact conversions of each other): a document is checked against the bounds of its own
 * unit system, so the number in the message is exactly the number checked. `siBase` gives the
 * same bounds in SI base units (Pa, m, m³/s, m/s, °C, s) for code that works inside the engine.
 *
 * The bounds are judgements of what real buildings need, with headroom; each says why. They are
 * not code limits: the adopted code, the AHJ and licensed practice govern what is acceptable, and
 * the checks (analysis/checks.ts) judge that. A range only keeps nonsense out.
 */
import { toSI, UNIT_LABELS, type Quantity, type UnitSystem } from '../units';
import { rangedPaths } from './describe';
import { SYSTEM_DOCUMENT } from './elements';

/** The kinds of numeric input a document holds, each with one range. */
export type LimitQuantity =
  | 'length'
  | 'equivalentLength'
  | 'elevation'
  | 'rise'
  | 'heightAboveFloor'
  | 'staticPressure'
  | 'pressureSetting'
  | 'pressureGain'
  | 'pressureLoss'
  | 'minFlowPressure'
  | 'pressureFalloff'
  | 'waterTemperature'
  | 'flow'
  | 'fixtureFlow'
  | 'velocityLimit'
  | 'innerDiameter'
  | 'roughness'
  | 'hazenWilliamsC'
  | 'lossCoefficient'
  | 'fixtureCount'
  | 'fittingCount'
  | 'fixtureUnits'
  | 'useDuration'
  | 'useInterval'
  | 'heaterVolume'
  | 'revisionNumber'
  | 'loopHeatLoss'
  | 'loopHeatLossPerLength'
  | 'loopTemperatureDrop'
  | 'fittingAllowance'
  | 'segmentCount';

/**
 * Quantities of a document's numbers that the units module does not carry, each converted by its
 * own factor (building/convertUnits.ts): a PRV's fall-off (psi per gpm ↔ kPa per L/s), heat (Btu/h
 * ↔ W), heat per length (Btu/h per ft ↔ W/m), a temperature difference (°F ↔ K) and a volume
 * (gal ↔ L).
 */
export type OwnQuantity = 'pressurePerFlow' | 'heat' | 'heatPerLength' | 'temperatureDifference' | 'volume';

/** The unit of each own quantity in each unit system, as screens write it. */
export const OWN_UNIT_LABELS: Readonly<Record<OwnQuantity, Readonly<Record<UnitSystem, string>>>> = Object.freeze({
  pressurePerFlow: { US: 'psi per gpm', SI: 'kPa per L/s' },
  heat: { US: 'Btu/h', SI: 'W' },
  heatPerLength: { US: 'Btu/h per ft', SI: 'W/m' },
  temperatureDifference: { US: '°F', SI: 'K' },
  volume: { US: 'gal', SI: 'L' },
});

export interface Bounds {
  min: number;
  max: number;
}

export interface QuantityLimit {
  /** Plain name used in the message ("length", "static pressure"). */
  noun: string;
  /** The units-module quantity used to convert, or null for a dimensionless number or a count. */
  unitQuantity: Quantity | null;
  /** Unit text when unitQuantity is null (e.g. "s"), or '' for a pure number. */
  fixedUnit?: string;
  /** With unitQuantity null, a unit that still differs between the unit systems: its own quantity (converted by building/convertUnits.ts). */
  ownQuantity?: OwnQuantity;
  /** True when the lower bound itself is refused (a length must be more than zero). */
  minExclusive: boolean;
  /** Whole numbers only (counts). */
  integer: boolean;
  US: Bounds;
  SI: Bounds;
  /** Why the bounds are plausible. */
  why: string;
}

/**
 * The table. Reference building for the upper bounds: a 40-storey tower (about 160 m, 525 ft, of
 * height; 4 m floor to floor is common practice) with its service line and site, which every
 * bound covers with headroom.
 */
export const LIMITS: Readonly<Record<LimitQuantity, QuantityLimit>> = Object.freeze({
  length: {
    noun: 'length',
    unitQuantity: 'length',
    minExclusive: true,
    integer: false,
    US: { min: 0, max: 5000 },
    SI: { min: 0, max: 1500 },
    why: "One segment's developed length: a service line across a large site or a 40-storey riser is a few hundred feet; 5,000 ft (about a mile) is beyond any single pipe run in a building's water system.",
  },
  equivalentLength: {
    noun: 'equivalent length',
    unitQuantity: 'length',
    minExclusive: false,
    integer: false,
    US: { min: 0, max: 1000 },
    SI: { min: 0, max: 300 },
    why: 'Fitting equivalent lengths in plumbing tables are a few feet to a few tens of feet (a large valve); 1,000 ft of pipe for one fitting is far beyond any of them.',
  },
  elevation: {
    noun: 'elevation',
    unitQuantity: 'elevation',
    minExclusive: false,
    integer: false,
    US: { min: -1000, max: 1000 },
    SI: { min: -300, max: 300 },
    why: 'Elevations are above any datum the designer picks (street, ground floor, sea level of a low site): a 40-storey tower is about 525 ft tall; ±1,000 ft covers it on a sloping site with a distant datum.',
  },
  rise: {
    noun: 'rise',
    unitQuantity: 'elevation',
    minExclusive: false,
    integer: false,
    US: { min: -1000, max: 1000 },
    SI: { min: -300, max: 300 },
    why: "One segment's rise cannot exceed the building's height: ±1,000 ft covers a riser the full height of a 40-storey tower with headroom.",
  },
  heightAboveFloor: {
    noun: 'height above floor',
    unitQuantity: 'elevation',
    minExclusive: false,
    integer: false,
    US: { min: -50, max: 50 },
    SI: { min: -15, max: 15 },
    why: 'A node sits within its own storey (a fixture outlet a few feet up, a main in the ceiling, a branch below the slab); ±50 ft covers a double-height hall or plant room, beyond which the node belongs on another floor.',
  },
  staticPressure: {
    noun: 'static pressure',
    unitQuantity: 'pressure',
    minExclusive: false,
    integer: false,
    US: { min: 0, max: 300 },
    SI: { min: 0, max: 2000 },
    why: 'Gauge pressure at the connection or during a flow test: utility mains run about 40–150 psi (common practice); 300 psi is above the working rating of common building pipe (class 200 plastic, type L copper at high temperature), so a higher figure is a typing slip.',
  },
  pressureSetting: {
    noun: 'set pressure',
    unitQuantity: 'pressure',
    minExclusive: true,
    integer: false,
    US: { min: 0, max: 300 },
    SI: { min: 0, max: 2000 },
    why: 'A PRV or a variable-speed booster is set to a building pressure (typically 50–80 psi, common practice); 300 psi bounds it like the static pressure.',
  },
  pressureGain: {
    noun: 'pressure gain',
    unitQuantity: 'pressure',
    minExclusive: false,
    integer: false,
    US: { min: 0, max: 300 },
    SI: { min: 0, max: 2000 },
    why: 'A domestic booster adds tens of psi, a tall building up to about 200 psi in one stage (common practice); 300 psi bounds it like the static pressure.',
  },
  pressureLoss: {
    noun: 'pressure loss',
    unitQuantity: 'pressure',
    minExclusive: false,
    integer: false,
    US: { min: 0, max: 300 },
    SI: { min: 0, max: 2000 },
    why: 'A device loss (meter, backflow preventer, filter) is a few to about 25 psi at its rated flow (common practice); no device may lose more than the 300 psi a system can hold.',
  },
  minFlowPressure: {
    noun: 'minimum flow pressure',
    unitQuantity: 'pressure',
    minExclusive: false,
    integer: false,
    US: { min: 0, max: 100 },
    SI: { min: 0, max: 700 },
    why: 'Fixture minimum flow pressures in the code tables are 8–35 psi (IPC Table 604.3); 100 psi is above every fixture and device a building supplies.',
  },
  pressureFalloff: {
    noun: 'PRV fall-off',
    unitQuantity: null,
    ownQuantity: 'pressurePerFlow',
    minExclusive: false,
    integer: false,
    US: { min: 0, max: 10 },
    SI: { min: 0, max: 1000 },
    why: 'A PRV outlet falls a few psi over its flow range (a fraction of a psi per gpm, common practice); 10 psi per gpm (about 1,000 kPa per L/s) is far steeper than any valve sized for its flow.',
  },
  waterTemperature: {
    noun: 'water temperature',
    unitQuantity: 'temperature',
    minExclusive: false,
    integer: false,
    US: { min: 33, max: 200 },
    SI: { min: 0.5, max: 93 },
    why: 'Liquid water in a building: just above freezing for cold mains, 140 °F stored hot water and up to 180 °F for dishwasher boosters (common practice); 200 °F stays below boiling at atmospheric pressure, where the water properties used (IAPWS, 1 atm) hold.',
  },
  flow: {
    noun: 'flow',
    unitQuantity: 'flow',
    minExclusive: false,
    integer: false,
    US: { min: 0, max: 5000 },
    SI: { min: 0, max: 300 },
    why: "A building's design flow, a continuous demand or a hydrant flow test: a 40-storey tower's peak demand is a few hundred gpm, a hydrant test 1,000–1,500 gpm (NFPA 291 classes); 5,000 gpm is beyond both.",
  },
  fixtureFlow: {
    noun: 'fixture flow',
    unitQuantity: 'flow',
    minExclusive: true,
    integer: false,
    US: { min: 0, max: 100 },
    SI: { min: 0, max: 6 },
    why: 'One fixture or outlet draws a few gpm (a flush valve about 25–35 gpm, common practice); 100 gpm is beyond any single fixture.',
  },
  velocityLimit: {
    noun: 'velocity limit',
    unitQuantity: 'velocity',
    minExclusive: true,
    integer: false,
    US: { min: 0, max: 20 },
    SI: { min: 0, max: 6 },
    why: 'Design velocity limits are 5–8 ft/s (copper tube practice; IRC Appendix P note); 20 ft/s is far beyond any that a designer would adopt.',
  },
  innerDiameter: {
    noun: 'inside diameter',
    unitQuantity: 'diameter',
    minExclusive: false,
    integer: false,
    US: { min: 0.1, max: 24 },
    SI: { min: 2.5, max: 600 },
    why: 'Building water pipe runs from 1/4 in tube to a 12 in service (common practice); 0.1–24 in covers them with headroom, and a smaller figure is usually millimetres typed into inches.',
  },
  roughness: {
    noun: 'roughness',
    unitQuantity: 'diameter',
    minExclusive: false,
    integer: false,
    US: { min: 0, max: 0.5 },
    SI: { min: 0, max: 12 },
    why: 'Absolute roughness of pipe runs from about 0.00006 in (drawn tubing) to about 0.35 in (riveted steel, the roughest in published tables); 0.5 in bounds them.',
  },
  hazenWilliamsC: {
    noun: 'Hazen–Williams C',
    unitQuantity: null,
    fixedUnit: '',
    minExclusive: false,
    integer: false,
    US: { min: 20, max: 200 },
    SI: { min: 20, max: 200 },
    why: 'Published C values run from about 40 (old tuberculated iron) to 150–160 (plastic); 20–200 keeps any plausible pipe and refuses a typing slip.',
  },
  lossCoefficient: {
    noun: 'loss coefficient K',
    unitQuantity: null,
    fixedUnit: '',
    minExclusive: false,
    integer: false,
    US: { min: 0, max: 200 },
    SI: { min: 0, max: 200 },
    why: 'Fitting and valve K values in published tables are below about 10 for open valves and fittings and reach tens for throttling valves; 200 bounds any single fitting.',
  },
  heaterVolume: {
    noun: 'volume of water heated (gal in US units, L in SI)',
    unitQuantity: null,
    fixedUnit: '',
    ownQuantity: 'volume',
    minExclusive: false,
    integer: false,
    US: { min: 0, max: 20000 },
    SI: { min: 0, max: 20000 },
    why: "The storage of a building's water heaters: a dwelling's heater holds 30–100 gal (common practice); a large building's plant a few thousand. 20,000 (gal or L) covers any domestic plant; the engine sizes the tank from it and refuses zero by name.",
  },
  revisionNumber: {
    noun: 'revision number',
    unitQuantity: null,
    fixedUnit: '',
    minExclusive: false,
    integer: true,
    US: { min: 1, max: 100000 },
    SI: { min: 1, max: 100000 },
    why: 'The cold system revision a fed hot system read, written by Headroom: numbered from 1; 100,000 revisions of one system is beyond any project.',
  },
  fixtureCount: {
    noun: 'fixture count',
    unitQuantity: null,
    fixedUnit: '',
    minExclusive: false,
    integer: true,
    US: { min: 1, max: 10000 },
    SI: { min: 1, max: 10000 },
    why: 'One group of identical fixtures at one node: a 40-storey tower has a few thousand fixtures in all; 10,000 in one group covers a whole building entered as one load.',
  },
  segmentCount: {
    noun: 'segment count',
    unitQuantity: null,
    fixedUnit: '',
    minExclusive: false,
    integer: true,
    US: { min: 0, max: 20000 },
    SI: { min: 0, max: 20000 },
    why: 'Segments counted by Headroom in an applied sizing: from none to every segment a document may hold (DOCUMENT_BOUNDS.segments).',
  },
  fittingCount: {
    noun: 'fitting count',
    unitQuantity: null,
    fixedUnit: '',
    minExclusive: false,
    integer: true,
    US: { min: 1, max: 1000 },
    SI: { min: 1, max: 1000 },
    why: 'Fittings of one type on one segment: a long run has tens of elbows; 1,000 covers a full riser entered as one segment.',
  },
  fixtureUnits: {
    noun: 'fixture units',
    unitQuantity: null,
    fixedUnit: 'WSFU',
    minExclusive: false,
    integer: false,
    US: { min: 0, max: 100 },
    SI: { min: 0, max: 100 },
    why: 'Load values per fixture in the code tables are 0.25–10 WSFU (IPC Table E103.3(2)); 100 per fixture is beyond any fixture type.',
  },
  useDuration: {
    noun: 'duration of use',
    unitQuantity: null,
    fixedUnit: 's',
    minExclusive: true,
    integer: false,
    US: { min: 0, max: 3600 },
    SI: { min: 0, max: 3600 },
    why: "Hunter's durations of use are seconds to minutes (a flush, a bath fill); a use longer than an hour is a continuous demand.",
  },
  loopHeatLoss: {
    noun: 'heat loss of a loop pipe (Btu/h in US units, W in SI)',
    unitQuantity: null,
    fixedUnit: '',
    ownQuantity: 'heat',
    minExclusive: false,
    integer: false,
    US: { min: 0, max: 1000000 },
    SI: { min: 0, max: 300000 },
    why: "A recirculation loop's pipe loses tens of Btu/h per ft insulated, about a hundred bare (from memory); 1,000,000 Btu/h (300 kW) is more than a whole tower's loop loses.",
  },
  loopHeatLossPerLength: {
    noun: 'heat loss per length (Btu/h per ft in US units, W/m in SI)',
    unitQuantity: null,
    fixedUnit: '',
    ownQuantity: 'heatPerLength',
    minExclusive: false,
    integer: false,
    US: { min: 0, max: 200 },
    SI: { min: 0, max: 200 },
    why: 'Insulated hot-water pipe loses about 10–30 Btu/h per ft and bare copper up to about 100 (from memory); 200 Btu/h per ft (about 190 W/m; 200 W/m in SI) is above any domestic loop.',
  },
  loopTemperatureDrop: {
    noun: 'temperature drop around the loop (°F in US units, K in SI)',
    unitQuantity: null,
    fixedUnit: '',
    ownQuantity: 'temperatureDifference',
    minExclusive: false,
    integer: false,
    US: { min: 0, max: 50 },
    SI: { min: 0, max: 28 },
    why: 'Loops are designed for a drop of about 5–20 °F (common practice); 50 °F (28 K) would leave the far end of the loop too cool to use. Zero is refused by the engine by name.',
  },
  fittingAllowance: {
    noun: 'fitting allowance (fraction of the pipe friction)',
    unitQuantity: null,
    fixedUnit: '',
    minExclusive: false,
    integer: false,
    US: { min: 0, max: 5 },
    SI: { min: 0, max: 5 },
    why: "The rule of thumb takes fittings as 25 % of the pipe's friction (0.25); 5 (fittings five times the pipe) bounds any loop that is still mostly pipe.",
  },
  useInterval: {
    noun: 'time between uses',
    unitQuantity: null,
    fixedUnit: 's',
    minExclusive: true,
    integer: false,
    US: { min: 0, max: 86400 },
    SI: { min: 0, max: 86400 },
    why: "Hunter's recurrence times at the peak are minutes (300–900 s in his examples); a day covers any fixture used at all during a peak.",
  },
} satisfies Record<LimitQuantity, QuantityLimit>);

/** The unit text of a quantity in a unit system ("ft", "psi", "psi per gpm", "" for a pure number). */
export function limitUnit(quantity: LimitQuantity, unitSystem: UnitSystem): string {
  const lim = LIMITS[quantity];
  if (quantity === 'pressureFalloff') return unitSystem === 'US' ? 'psi per gpm' : 'kPa per L/s';
  if (lim.unitQuantity) return UNIT_LABELS[unitSystem][lim.unitQuantity];
  return lim.fixedUnit ?? '';
}

/**
 * The unit a number of this quantity is written in, in a unit system, for a form's label: "psi",
 * "gal", "Btu/h per ft", "s"; '' for a pure number or a count. (limitUnit gives the unit of a range
 * message, whose noun already names the hot-water quantities' units.)
 */
export function fieldUnit(quantity: LimitQuantity, unitSystem: UnitSystem): string {
  const lim = LIMITS[quantity];
  if (lim.unitQuantity) return UNIT_LABELS[unitSystem][lim.unitQuantity];
  if (lim.ownQuantity) return OWN_UNIT_LABELS[lim.ownQuantity][unitSystem];
  return lim.fixedUnit ?? '';
}

/** Bounds of a quantity in SI base units (Pa, m, m³/s, m/s, °C; Pa per m³/s for fall-off; s). */
export function siBase(quantity: LimitQuantity): Bounds {
  const lim = LIMITS[quantity];
  if (quantity === 'pressureFalloff') return { min: (lim.SI.min * 1000) / 1e-3, max: (lim.SI.max * 1000) / 1e-3 };
  if (!lim.unitQuantity) return { ...lim.SI };
  return { min: toSI(lim.unitQuantity, lim.SI.min, 'SI'), max: toSI(lim.unitQuantity, lim.SI.max, 'SI') };
}

/** "5,000", "-1,000", "0.5": thousands grouped with commas, up to 3 decimals, no locale lookup. */
export function formatBound(value: number): string {
  const negative = value < 0;
  const [whole, frac] = Math.abs(value)
    .toFixed(3)
    .replace(/\.?0+$/, '')
    .split('.');
  const grouped = whole.replace(/\B(?=(\d{3})+(?!\d))/g, ',');
  return `${negative ? '−' : ''}${grouped}${frac ? `.${frac}` : ''}`;
}

/** The range in words: "length 0–5,000 ft", "elevation −1,000 to 1,000 ft", "fixture count 1–10,000". */
export function rangeText(quantity: LimitQuantity, unitSystem: UnitSystem): string {
  const lim = LIMITS[quantity];
  const { min, max } = lim[unitSystem];
  const unit = limitUnit(quantity, unitSystem);
  const unitText = unit === '' ? '' : ` ${unit}`;
  const span = min < 0 ? `${formatBound(min)} to ${formatBound(max)}` : `${formatBound(min)}–${formatBound(max)}`;
  return `${lim.noun} ${span}${unitText}`;
}

/**
 * Checks one value, in the document's units, against its quantity's range.
 * Returns null when it is plausible, else a plain message saying the range, e.g.
 * "Out of range: length 0–5,000 ft (more than 0)". A non-number or non-finite value is refused.
 */
export function checkRange(quantity: LimitQuantity, value: number, unitSystem: UnitSystem): string | null {
  const lim = LIMITS[quantity];
  // The message is built only for a value refused (the engine checks every number of a document).
  if (typeof value !== 'number' || !Number.isFinite(value)) return `Enter a number: ${rangeText(quantity, unitSystem)}`;
  if (lim.integer && !Number.isInteger(value)) return `Enter a whole number: ${rangeText(quantity, unitSystem)}`;
  const { min, max } = lim[unitSystem];
  const belowMin = lim.minExclusive ? value <= min : value < min;
  if (belowMin || value > max) {
    return `Out of range: ${rangeText(quantity, unitSystem)}${lim.minExclusive ? ` (more than ${formatBound(min)})` : ''}`;
  }
  return null;
}

/**
 * Which range applies to each numeric field of a document, by its path with `[]` for a list index
 * and `*` for every key of a record: read from the document's description (elements.ts), where each
 * number names its range. The engine's checks (analysis/ranges.ts) read the same descriptions; forms
 * look fields up here.
 */
export const FIELD_QUANTITIES: Readonly<Record<string, LimitQuantity>> = Object.freeze(
  Object.fromEntries(rangedPaths(SYSTEM_DOCUMENT, '[]').map(([path, range]) => [path.join('.').replaceAll('.[]', '[]'), range])),
);
