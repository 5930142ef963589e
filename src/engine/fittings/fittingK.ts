/**
 * Loss coefficient of one fitting by the chosen method, from the fitting-type registry, with the
 * fallback rule stated: requested method → crane → hooper-2k → darby-3k → fixed K. A fallback is
 * reported in `fellBackFrom` so the analysis can warn.
 */
import { requireFinite, requireNonNegative, requirePositive } from '../guards';
import { M_PER_FT, M_PER_IN } from '../units';
import { craneFtLookup } from './crane';
import { darby3K } from './darby';
import { hooper2K } from './hooper';
import { FITTING_TYPES, type FittingTypeEntry, type FittingTypeId } from './types';

export type FittingMethod = 'crane' | 'hooper-2k' | 'darby-3k' | 'equivalent-length';

export interface FittingContext {
  method: FittingMethod;
  /** Inside diameter of the pipe the K is referred to, m. */
  innerDiameterM: number;
  /** Nominal size, in (Crane f_T and Darby's Dn are by nominal size). */
  nominalSizeIn: number;
  /** Nominal size key of the equivalent-length tables, e.g. '3/4', '1-1/4'. */
  nominalSizeKey: string;
  /** Reynolds number in that pipe (0 for no flow). */
  Re: number;
  /** Darcy friction factor in that pipe (used by the equivalent-length method, K = f·Le/D). */
  frictionFactor: number;
}

export interface FittingKResult {
  /** Loss coefficient referred to the velocity in the pipe of innerDiameterM. */
  K: number;
  /** Equivalent length, m (equivalent-length method only). */
  equivalentLengthM?: number;
  /** The method whose data produced K (for a constant K: the requested method, with fixedK set). */
  method: FittingMethod;
  /** True when K is the type's constant K (entrances, exits, or the last fallback). */
  fixedK?: boolean;
  source: string;
  /** The requested method, when it had no data for this type or size and another was used. */
  fellBackFrom?: FittingMethod;
  /** True when a table was read outside its range (Crane f_T beyond 1/2–10 in, butterfly N beyond 24 in). */
  extrapolated?: boolean;
  /** The tested Reynolds numbers of a measured fitting, when Re is outside them (its K is used as published). */
  outsideTestedRe?: { min: number; max: number };
}

type Attempt = Omit<FittingKResult, 'fellBackFrom'> | undefined;

const FALLBACK_ORDER: readonly FittingMethod[] = ['crane', 'hooper-2k', 'darby-3k'];

/** The requested method, then the fallbacks in their order without it (built once, immutable). */
const orderFor = (m: FittingMethod): readonly FittingMethod[] => Object.freeze([m, ...FALLBACK_ORDER.filter((x) => x !== m)]);
const ORDER_BY_METHOD: Readonly<Record<FittingMethod, readonly FittingMethod[]>> = Object.freeze({
  crane: orderFor('crane'),
  'hooper-2k': orderFor('hooper-2k'),
  'darby-3k': orderFor('darby-3k'),
  'equivalent-length': orderFor('equivalent-length'),
});

const SOURCE_PREFIXES = ['crane', 'hooper', 'darby', 'equivalent-length', 'fixed K'] as const;
type SourcePrefix = (typeof SOURCE_PREFIXES)[number];

function findSource(entry: FittingTypeEntry, prefix: string): string {
  return entry.sources.find((s) => s.startsWith(prefix)) ?? entry.sources.join('; ');
}

/** Each registry entry's source line per method, looked up once (entries and sources are frozen). */
const SOURCES: Readonly<Record<FittingTypeId, Readonly<Record<SourcePrefix, string>>>> = Object.freeze(
  Object.fromEntries(
    Object.values(FITTING_TYPES).map((entry) => [
      entry.id,
      Object.freeze(Object.fromEntries(SOURCE_PREFIXES.map((p) => [p, findSource(entry, p)])) as Record<SourcePrefix, string>),
    ]),
  ),
);

function sourceFor(entry: FittingTypeEntry, prefix: SourcePrefix): string {
  const known = Object.prototype.hasOwnProperty.call(SOURCES, entry.id) ? SOURCES[entry.id] : undefined;
  return known !== undefined && FITTING_TYPES[entry.id] === entry ? known[prefix] : findSource(entry, prefix);
}

function tryCrane(entry: FittingTypeEntry, ctx: FittingContext): Attempt {
  let N = entry.craneN;
  let extrapolatedN = false;
  if (entry.craneNBySize && entry.craneNBySize.length > 0) {
    const band = entry.craneNBySize.find((b) => ctx.nominalSizeIn <= b.maxNominalIn);
    const last = entry.craneNBySize[entry.craneNBySize.length - 1];
    N = band ? band.N : last.N;
    extrapolatedN = band === undefined;
  }
  if (N === undefined) return undefined;
  const { fT, extrapolated } = craneFtLookup(ctx.nominalSizeIn);
  return { K: N * fT, method: 'crane', source: sourceFor(entry, 'crane'), extrapolated: extrapolated || extrapolatedN };
}

/** At Re = 0 the K1/Re term is dropped in the two- and three-K methods: its share of the loss,
 * K1·μV/(2D), vanishes with V, so the zero-flow loss is 0 either way and K stays finite. */
function tryHooper(entry: FittingTypeEntry, ctx: FittingContext): Attempt {
  if (!entry.hooper) return undefined;
  const { K1, Kinf } = entry.hooper;
  const K = ctx.Re > 0 ? hooper2K(K1, Kinf, ctx.Re, ctx.innerDiameterM / M_PER_IN) : Kinf * (1 + M_PER_IN / ctx.innerDiameterM);
  return { K, method: 'hooper-2k', source: sourceFor(entry, 'hooper') };
}

function tryDarby(entry: FittingTypeEntry, ctx: FittingContext): Attempt {
  if (!entry.darby) return undefined;
  const { K1, Ki, Kd } = entry.darby;
  const K = ctx.Re > 0 ? darby3K(K1, Ki, Kd, ctx.Re, ctx.nominalSizeIn) : Ki * (1 + Kd / ctx.nominalSizeIn ** 0.3);
  return { K, method: 'darby-3k', source: sourceFor(entry, 'darby') };
}

function tryEquivalentLength(entry: FittingTypeEntry, ctx: FittingContext): Attempt {
  const Le = entry.equivalentLengthFt?.[ctx.nominalSizeKey];
  if (Le === undefined) return undefined;
  let equivalentLengthM = Le * M_PER_FT;
  let K = (ctx.frictionFactor * equivalentLengthM) / ctx.innerDiameterM;
  // a published lowest K (the push-fit elbow's plateau) wins over a length that would give less
  if (entry.kFloor !== undefined && K < entry.kFloor) {
    K = entry.kFloor;
    if (ctx.frictionFactor > 0) equivalentLengthM = (K * ctx.innerDiameterM) / ctx.frictionFactor;
  }
  return {
    K,
    equivalentLengthM,
    method: 'equivalent-length',
    source: sourceFor(entry, 'equivalent-length'),
  };
}

const ATTEMPTS: Record<FittingMethod, (entry: FittingTypeEntry, ctx: FittingContext) => Attempt> = {
  crane: tryCrane,
  'hooper-2k': tryHooper,
  'darby-3k': tryDarby,
  'equivalent-length': tryEquivalentLength,
};

function hasMethodData(entry: FittingTypeEntry): boolean {
  return (
    entry.craneN !== undefined ||
    entry.craneNBySize !== undefined ||
    entry.hooper !== undefined ||
    entry.darby !== undefined ||
    entry.equivalentLengthFt !== undefined
  );
}

export function fittingK(typeId: FittingTypeId, ctx: FittingContext): FittingKResult {
  const entry = Object.prototype.hasOwnProperty.call(FITTING_TYPES, typeId) ? FITTING_TYPES[typeId] : undefined;
  if (!entry) throw new RangeError(`fittingK: unknown fitting type '${typeId}'`);
  if (!ATTEMPTS[ctx.method]) throw new RangeError(`fittingK: unknown method '${String(ctx.method)}'`);
  requirePositive('fittingK', 'innerDiameterM', ctx.innerDiameterM);
  requirePositive('fittingK', 'nominalSizeIn', ctx.nominalSizeIn);
  requireNonNegative('fittingK', 'Re', ctx.Re);
  requireNonNegative('fittingK', 'frictionFactor', ctx.frictionFactor);
  return fittingKOfEntry(entry, ctx);
}

/**
 * fittingK for a registry entry and a context its caller has already checked (a known method,
 * innerDiameterM and nominalSizeIn > 0, Re and frictionFactor finite and ≥ 0): the analysis'
 * hot path, without the argument guards. Same result as fittingK.
 */
export function fittingKOfEntry(entry: FittingTypeEntry, ctx: FittingContext): FittingKResult {
  const result = fittingKOfData(entry, ctx);
  const tested = entry.testedRe;
  return tested !== undefined && ctx.Re > 0 && (ctx.Re < tested.min || ctx.Re > tested.max) ? { ...result, outsideTestedRe: tested } : result;
}

function fittingKOfData(entry: FittingTypeEntry, ctx: FittingContext): FittingKResult {
  // A K measured at some sizes only (the push-to-connect fittings): that K under every method, at those sizes.
  if (entry.kBySize !== undefined) {
    const K = Object.prototype.hasOwnProperty.call(entry.kBySize, ctx.nominalSizeKey) ? entry.kBySize[ctx.nominalSizeKey] : undefined;
    if (K === undefined) throw new RangeError(`fittingK: fitting type '${entry.id}' has no data for any method at size ${ctx.nominalSizeKey}`);
    const result: FittingKResult = { K, method: ctx.method, fixedK: true, source: sourceFor(entry, 'fixed K') };
    if (ctx.method === 'equivalent-length' && ctx.frictionFactor > 0) result.equivalentLengthM = (K * ctx.innerDiameterM) / ctx.frictionFactor;
    return result;
  }
  // Entrances and exits: one constant K whatever the method.
  if (!hasMethodData(entry) && entry.fixedK !== undefined) {
    const result: FittingKResult = { K: entry.fixedK, method: ctx.method, fixedK: true, source: entry.sources[0] };
    if (ctx.method === 'equivalent-length' && ctx.frictionFactor > 0) {
      result.equivalentLengthM = (entry.fixedK * ctx.innerDiameterM) / ctx.frictionFactor;
    }
    return result;
  }

  for (const method of ORDER_BY_METHOD[ctx.method]) {
    const attempt = ATTEMPTS[method](entry, ctx);
    if (attempt) {
      requireFinite('fittingK', 'K', attempt.K);
      return method === ctx.method ? attempt : { ...attempt, fellBackFrom: ctx.method };
    }
  }
  if (entry.fixedK !== undefined) {
    return { K: entry.fixedK, method: ctx.method, fixedK: true, source: sourceFor(entry, 'fixed K'), fellBackFrom: ctx.method };
  }
  // A fitting published only as an equivalent length (manufacturers' PEX data): the length is used
  // under every method, as a custom fitting's equivalent length is ("this many feet of this pipe").
  const asLength = ctx.method === 'equivalent-length' ? undefined : tryEquivalentLength(entry, ctx);
  if (asLength) return { ...asLength, fellBackFrom: ctx.method };
  throw new RangeError(`fittingK: fitting type '${entry.id}' has no data for any method at size ${ctx.nominalSizeKey}`);
}
