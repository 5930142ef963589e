/**
 * Converting a whole system document between US customary and SI units (pure), for a project
 * that switches its unit system: every number that carries a unit is converted through SI
 * (src/engine/units.ts) and rounded to the places a designer writes in that unit, so a converted
 * 3/4 in ID reads 19.05 mm and 60 psi reads 413.7 kPa, not a raw 413.68544…
 *
 * The places below are common practice for plumbing calculations (gauge readings to 0.1 psi or
 * 1 kPa would be coarser than the analysis needs; these keep the converted design within 0.1 % of
 * the original). Catalog sizes ("3/4") are names, not numbers, and stay as they are.
 */
import { rangedPaths } from '../model/describe';
import { SYSTEM_DOCUMENT } from '../model/elements';
import { LIMITS, type LimitQuantity, type OwnQuantity } from '../model/limits';
import { fromSI, M3_PER_GAL, M_PER_FT, toSI, type Quantity, type UnitSystem } from '../units';
import { W_PER_BTU_PER_H } from '../hotWater/recirculationDocument';

/** The hot-water inputs' own quantities (limits.ts), which the units module does not carry. */
type HotWaterQ = Exclude<OwnQuantity, 'pressurePerFlow'>;
type Q = Exclude<Quantity, 'density' | 'pressurePerLength'> | OwnQuantity;

/**
 * SI per US unit: 1 Btu_IT = 1055.05585262 J (NIST SP 811 (2008) App. B.8), per hour; 1 ft = 0.3048 m;
 * 1 °F of difference = 1/1.8 K (NIST SP 811 §B.9); 1 US gal = 3.785411784 L (exact, NIST SP 811 App. B).
 */
const HOT_WATER_FACTORS: Record<HotWaterQ, number> = {
  heat: W_PER_BTU_PER_H,
  heatPerLength: W_PER_BTU_PER_H / M_PER_FT,
  temperatureDifference: 1 / 1.8,
  volume: M3_PER_GAL * 1000,
};

/** Decimal places per quantity and target unit system. */
const PLACES: Record<Q, Record<UnitSystem, number>> = {
  pressure: { US: 2, SI: 1 },
  length: { US: 2, SI: 3 },
  elevation: { US: 2, SI: 3 },
  diameter: { US: 4, SI: 2 },
  flow: { US: 2, SI: 4 },
  velocity: { US: 2, SI: 3 },
  temperature: { US: 1, SI: 1 },
  pressurePerFlow: { US: 4, SI: 2 },
  heat: { US: 0, SI: 1 },
  heatPerLength: { US: 2, SI: 2 },
  temperatureDifference: { US: 1, SI: 2 },
  volume: { US: 2, SI: 1 },
};

/** The quantity a range converts as, or null for a number whose unit is the same in both systems (a count, a coefficient, seconds). */
function convertedAs(range: LimitQuantity): Q | null {
  const { unitQuantity, ownQuantity } = LIMITS[range];
  if (unitQuantity) return unitQuantity === 'density' || unitQuantity === 'pressurePerLength' ? null : unitQuantity;
  return ownQuantity ?? null;
}

/**
 * Where the numbers with a unit are, as paths of keys ("*" = every item of a list or every key of a
 * record), with their quantity and range: every ranged number of the document's description
 * (elements.ts) whose range has a unit, so a new ranged key is converted without a line here.
 */
const CONVERTED_FIELDS: readonly { path: string; quantity: Q; range: LimitQuantity }[] = rangedPaths(SYSTEM_DOCUMENT, '*').flatMap(([path, range]) => {
  const quantity = convertedAs(range);
  return quantity ? [{ path: path.join('.'), quantity, range }] : [];
});

function convertValue(q: Q, value: number, from: UnitSystem, to: UnitSystem, round: boolean): number {
  let out: number;
  if (q === 'pressurePerFlow') out = fromSI('pressure', toSI('pressure', value, from), to) / fromSI('flow', toSI('flow', 1, from), to);
  else if (q in HOT_WATER_FACTORS) {
    const f = HOT_WATER_FACTORS[q as HotWaterQ];
    const si = from === 'US' ? value * f : value;
    out = to === 'US' ? si / f : si;
  } else out = fromSI(q as Exclude<Q, 'pressurePerFlow' | HotWaterQ>, toSI(q as Exclude<Q, 'pressurePerFlow' | HotWaterQ>, value, from), to);
  if (!round) return out;
  // A value too small for its places (a tiny PRV fall-off) keeps 4 significant figures instead of 0.
  const places = PLACES[q][to];
  const rounded = Number(out.toFixed(places));
  return rounded === 0 && out !== 0 ? Number(out.toPrecision(4)) : rounded;
}

/**
 * A value held in SI, in the unit system's unit rounded to the places a designer writes (the same
 * places as a converted document): a catalog template's 0.000946353 m³/s reads 15 gpm or 0.9464 L/s,
 * not 15.0000001 or 0.946353. For values copied from a catalog into a document or shown beside one.
 */
export function roundedFromSI(q: Exclude<Q, 'pressurePerFlow' | HotWaterQ>, valueSI: number, to: UnitSystem): number {
  const out = fromSI(q, valueSI, to);
  const rounded = Number(out.toFixed(PLACES[q][to]));
  return rounded === 0 && out !== 0 ? Number(out.toPrecision(4)) : rounded;
}

function visit(node: unknown, keys: readonly string[], fn: (v: number) => number): void {
  if (node === null || typeof node !== 'object') return;
  const [key, ...rest] = keys;
  const obj = node as Record<string, unknown>;
  const targets = key === '*' ? Object.keys(obj) : [key];
  for (const k of targets) {
    if (!(k in obj)) continue;
    if (rest.length === 0) {
      if (typeof obj[k] === 'number') obj[k] = fn(obj[k] as number);
    } else visit(obj[k], rest, fn);
  }
}

/**
 * The document in the other unit system: a deep copy with `unitSystem` changed and every unit-bearing
 * number converted (rounded unless `round` is false). The document's own unit system is read from it.
 */
export function convertDocumentUnits<D extends { unitSystem: UnitSystem }>(doc: D, to: UnitSystem, opts: { round?: boolean } = {}): D {
  const from = doc.unitSystem;
  const out = structuredClone(doc);
  if (from === to) return out;
  const round = opts.round ?? true;
  for (const { path, quantity, range } of CONVERTED_FIELDS) {
    // Roughness keeps 4 significant figures (its magnitude makes fixed places meaningless).
    const convert =
      range === 'roughness'
        ? (v: number) => {
            const out = convertValue(quantity, v, from, to, false);
            return round ? Number(out.toPrecision(4)) : out;
          }
        : (v: number) => convertValue(quantity, v, from, to, round);
    visit(out, path.split('.'), convert);
  }
  out.unitSystem = to;
  return out;
}
