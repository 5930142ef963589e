/**
 * The vocabulary in which the elements of the system document are described once, as data
 * (elements.ts), and what is derived from a description: the zod schema of the element (and so the
 * exported JSON Schema), its fast reader (fastParse.ts), the plausible range and unit of each
 * numeric key (limits.ts, building/convertUnits.ts), who may change each key (the field change's
 * rules and the tree editor's policy), and the value shapes the property-test generators follow.
 *
 * A description is a list of keys in the order of the document format. Each key has:
 *   - a value: its type and constraint (sign of a number, bounds of a string or list, enumeration,
 *     a nested described element or union), with the zod type and the fast reader of that value;
 *   - a presence: required, optional (absent, or present as undefined, stays so), or a default;
 *   - `range`: the plausible range of a number (a LimitQuantity of limits.ts), which also gives its
 *     unit (length, pressure, flow …, units.ts) — a number with no unit (a count, a coefficient)
 *     has a range and no unit;
 *   - `changedBy`: 'designer' (only the designer of a draft) or 'field-change' (a contractor's field
 *     change may change it too);
 *   - `editor`: the tree editor's columns that write the key;
 *   - `label` (a short name for screens), `short` (its name inside a table of the element's rows)
 *     and `help` (the schema's description text).
 *
 * Each element also gets a reader here, built once at module load from the same list (closures): it
 * either returns exactly what zod returns for the element, or declines (throws DECLINED). It is the
 * reference the tests hold to zod; the hot path (fastParse.ts) uses the readers generated from the
 * same descriptions (readerSource.ts → readers.generated.ts), which read fixed property names and
 * are several times as fast as these.
 */
import { z } from 'zod';
import type { LimitQuantity } from './limits';

// ---- the fast reader's primitives (shared with fastParse.ts)

/** Thrown inside a fast reader when the input is not one it accepts; caught at the reader's entry. */
class Declined {}
export const DECLINED = Object.freeze(new Declined());

export type Obj = Record<string, unknown>;
/** Reads a defined value: returns it (a fresh copy for objects and lists) or declines. */
export type Reader<T = unknown> = (v: unknown) => T;

export function decline(): never {
  throw DECLINED;
}

/** A plain JSON-like object (class instances and other prototypes are declined: zod may differ on them). */
export function obj(v: unknown): Obj {
  if (typeof v !== 'object' || v === null) decline();
  const proto = Object.getPrototypeOf(v);
  if (proto !== Object.prototype && proto !== null) decline();
  return v as Obj;
}

/** Number of own enumerable keys: compared with the keys read, it rejects unknown keys (strict objects). */
export function keyCount(o: Obj): number {
  let n = 0;
  for (const _ in o) n++;
  return n;
}

export function strictKeys(o: Obj, known: number): void {
  if (keyCount(o) !== known) decline();
}

export function readNumber(v: unknown): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) decline();
  return v;
}
export function readPositive(v: unknown): number {
  if (!(readNumber(v) > 0)) decline();
  return v as number;
}
export function readNonNegative(v: unknown): number {
  if (!(readNumber(v) >= 0)) decline();
  return v as number;
}
export function readPositiveInt(v: unknown): number {
  if (!Number.isSafeInteger(v) || !((v as number) > 0)) decline();
  return v as number;
}
export function readNonNegativeInt(v: unknown): number {
  if (!Number.isSafeInteger(v) || !((v as number) >= 0)) decline();
  return v as number;
}
/** A number from `min` to `max`, both included. */
export function readBetween(v: unknown, min: number, max: number): number {
  if (!(readNumber(v) >= min && (v as number) <= max)) decline();
  return v as number;
}
export function readLiteral<T extends string | number>(v: unknown, literal: T): T {
  if (v !== literal) decline();
  return literal;
}
/** A string other than `except` (a reserved name). */
export function readExcept(v: string, except: string): string {
  if (v === except) decline();
  return v;
}
/**
 * A record (an object used as a map) of at most `max` keys. zod reads a record's own keys
 * (Reflect.ownKeys): one it would see and for-in would not (a symbol, a non-enumerable key) is
 * declined, and so is a "__proto__" key (assigning it would not make an own key).
 */
export function readRecord<T>(v: unknown, key: Reader<string>, item: Reader<T>, max: number): Record<string, T> {
  const o = obj(v);
  if (Object.getOwnPropertySymbols(o).length > 0 || Object.getOwnPropertyNames(o).length !== keyCount(o)) decline();
  const out: Record<string, T> = {};
  let n = 0;
  for (const k in o) {
    if (k === '__proto__') decline();
    key(k);
    out[k] = item(o[k]);
    n++;
  }
  if (n > max) decline();
  return out;
}
export function readBoolean(v: unknown): boolean {
  if (typeof v !== 'boolean') decline();
  return v;
}
/** A string of at least `min` and at most `max` UTF-16 units (over `max` units zod, counting code points, may still accept: declined). */
export function readBounded(v: unknown, min: number, max: number): string {
  if (typeof v !== 'string' || v.length < min || v.length > max) decline();
  return v;
}
export function readOneOf<T extends string>(v: unknown, values: readonly T[]): T {
  for (let i = 0; i < values.length; i++) if (v === values[i]) return v as T;
  return decline();
}
export function readList<T>(v: unknown, item: Reader<T>, min: number, max: number): T[] {
  if (!Array.isArray(v) || v.length > max || v.length < min) decline();
  const out: T[] = new Array(v.length);
  for (let i = 0; i < v.length; i++) out[i] = item(v[i]);
  return out;
}

// ---- values: a type with its constraint, its zod type and its reader

/** What a value is, for code that walks a description (generators, unit paths). */
export type ValueShape =
  | { kind: 'number'; sign: 'any' | 'positive' | 'nonNegative'; min?: number; max?: number }
  | { kind: 'count'; min: 0 | 1 }
  | { kind: 'string'; min: number; max: number; except?: string }
  | { kind: 'boolean' }
  | { kind: 'literal'; value: string | number }
  | { kind: 'enum'; values: readonly string[] }
  | { kind: 'list'; item: ValueShape; min: number; max: number }
  | { kind: 'record'; key: ValueShape; item: ValueShape; max: number }
  | { kind: 'element'; element: AnyElement }
  | { kind: 'union'; of: readonly AnyElement[]; discriminator?: string };

export interface Value<Z extends z.ZodType> {
  zod: Z;
  read: Reader;
  shape: ValueShape;
}

export const value = {
  /** Any finite number. */
  number: (): Value<z.ZodNumber> => ({ zod: z.number(), read: readNumber, shape: { kind: 'number', sign: 'any' } }),
  positive: (): Value<z.ZodNumber> => ({ zod: z.number().positive(), read: readPositive, shape: { kind: 'number', sign: 'positive' } }),
  nonNegative: (): Value<z.ZodNumber> => ({ zod: z.number().nonnegative(), read: readNonNegative, shape: { kind: 'number', sign: 'nonNegative' } }),
  /** A number from `min` to `max`, both included. */
  between: (min: number, max: number): Value<z.ZodNumber> => ({
    zod: z.number().min(min).max(max),
    read: (v) => readBetween(v, min, max),
    shape: { kind: 'number', sign: 'any', min, max },
  }),
  /** A whole number of at least 1 (how many fittings, fixtures). */
  count: (): Value<z.ZodNumber> => ({ zod: z.number().int().positive(), read: readPositiveInt, shape: { kind: 'count', min: 1 } }),
  /** A whole number of at least 0 (how many segments a sizing changed). */
  wholeNumber: (): Value<z.ZodNumber> => ({ zod: z.number().int().nonnegative(), read: readNonNegativeInt, shape: { kind: 'count', min: 0 } }),
  /** Exactly this string or number (a version, the tag of a union option). */
  literal: <const T extends string | number>(literal: T): Value<z.ZodLiteral<T>> => ({
    zod: z.literal(literal),
    read: (v) => readLiteral(v, literal),
    shape: { kind: 'literal', value: literal },
  }),
  boolean: (): Value<z.ZodBoolean> => ({ zod: z.boolean(), read: readBoolean, shape: { kind: 'boolean' } }),
  /** A string of `min` (at least 1: an id, a source) to `max` characters; `except` a reserved name, refused with `message`. */
  string: (min: number, max: number, reserved?: { except: string; message: string }): Value<z.ZodString> => {
    if (!reserved) return { zod: z.string().min(min).max(max), read: (v) => readBounded(v, min, max), shape: { kind: 'string', min, max } };
    const { except, message } = reserved;
    return {
      zod: z
        .string()
        .min(min)
        .max(max)
        .refine((v) => v !== except, { message }),
      read: (v) => readExcept(readBounded(v, min, max), except),
      shape: { kind: 'string', min, max, except },
    };
  },
  /** Text of at most `max` characters, at least one when `nonEmpty`. */
  text: (max: number, opts: { nonEmpty?: boolean } = {}): Value<z.ZodString> => {
    const min = opts.nonEmpty ? 1 : 0;
    return {
      zod: opts.nonEmpty ? z.string().max(max).min(1) : z.string().max(max),
      read: (v) => readBounded(v, min, max),
      shape: { kind: 'string', min, max },
    };
  },
  oneOf: <const T extends readonly [string, ...string[]]>(values: T): Value<z.ZodEnum<{ [K in T[number]]: K }>> => ({
    zod: z.enum(values),
    read: (v) => readOneOf(v, values),
    shape: { kind: 'enum', values },
  }),
  /** A list of values or described elements, of `min` (default 0) to `max` items. */
  list: <Z extends z.ZodType>(item: Value<Z>, max: number, min = 0): Value<z.ZodArray<Z>> => {
    const read = item.read;
    return {
      zod: min > 0 ? z.array(item.zod).min(min).max(max) : z.array(item.zod).max(max),
      read: (v) => readList(v, read, min, max),
      shape: { kind: 'list', item: item.shape, min, max },
    };
  },
  /**
   * A record: an object whose keys are names (ids) and whose values are all of one kind. With
   * `max`, at most that many keys, refused with `message`.
   */
  record: <K extends z.ZodString, Z extends z.ZodType>(key: Value<K>, item: Value<Z>, limit?: { max: number; message: string }): Value<z.ZodRecord<K, Z>> => {
    const readKey = key.read as Reader<string>;
    const readItem = item.read;
    const max = limit?.max ?? Number.MAX_SAFE_INTEGER;
    const zod = z.record(key.zod, item.zod);
    return {
      zod: limit ? zod.refine((r) => Object.keys(r).length <= limit.max, { message: limit.message }) : zod,
      read: (v) => readRecord(v, readKey, readItem, max),
      shape: { kind: 'record', key: key.shape, item: item.shape, max },
    };
  },
  /** A nested described element. */
  element: <S extends z.ZodType>(e: Element<S>): Value<S> => ({ zod: e.schema, read: e.read, shape: { kind: 'element', element: e } }),
  /**
   * One of several described elements (a zod union, tried in order). Each option must have a
   * required key no other option has: as the options are strict, the key present decides which one
   * can apply, so the reader follows zod without trying them in turn.
   */
  union: <const E extends readonly [AnyElement, AnyElement, ...AnyElement[]]>(of: E): Value<z.ZodUnion<{ [K in keyof E]: E[K]['schema'] }>> => {
    const by = of.map((e) => {
      const own = Object.keys(e.keys).find((k) => e.keys[k].presence === 'required' && of.every((f) => f === e || !(k in f.keys)));
      if (!own) throw new Error(`union option "${e.name}" has no required key of its own`);
      return [own, e.read] as const;
    });
    return {
      zod: z.union(of.map((e) => e.schema) as unknown as { [K in keyof E]: E[K]['schema'] }),
      read: (v) => {
        const o = obj(v);
        for (const [key, read] of by) if (key in o) return read(o);
        return decline();
      },
      shape: { kind: 'union', of },
    };
  },
  /**
   * One of several described elements told apart by the value of one required key, `discriminator`
   * (a zod discriminated union): each option has it as a literal of its own.
   */
  tagged: <const E extends readonly [AnyElement, ...AnyElement[]]>(
    discriminator: string,
    of: E,
  ): Value<z.ZodDiscriminatedUnion<{ [K in keyof E]: E[K]['schema'] }, string>> => {
    const by = new Map<unknown, Reader>(of.map((e) => [tagOf(e, discriminator), e.read]));
    return {
      zod: z.discriminatedUnion(discriminator, of.map((e) => e.schema) as unknown as { [K in keyof E]: E[K]['schema'] }),
      read: (v) => {
        const o = obj(v);
        const read = by.get(o[discriminator]);
        return read ? read(o) : decline();
      },
      shape: { kind: 'union', of, discriminator },
    };
  },
};

/** The literal value of an option's discriminator key. */
export function tagOf(e: AnyElement, discriminator: string): string | number {
  const shape = e.keys[discriminator]?.shape;
  if (shape?.kind !== 'literal' || e.keys[discriminator].presence !== 'required')
    throw new Error(`option "${e.name}" has no required literal "${discriminator}"`);
  return shape.value;
}

// ---- keys: a value with its presence and what the trade and the workflow say about it

export type ChangedBy = 'designer' | 'field-change';
export type Presence = 'required' | 'optional' | 'default';

export interface KeyMeta {
  /** Short name for screens ("Developed length"). */
  label: string;
  /**
   * The name where the element is already named: a table column's header over the element's rows
   * ("Length" over segments), and after a row's name in a cell's accessible name ("Level 3: fixture
   * group 1" + "type"). Without it, `label` serves both.
   */
  short?: string;
  /** The schema's description text (JSON Schema `description`); omitted where the key name says it all. */
  help?: string;
  /** Plausible range of a number (limits.ts); with it, its unit. */
  range?: LimitQuantity;
  /** Who may change it: the designer only (the default), or a contractor's field change too. */
  changedBy?: ChangedBy;
  /** The tree editor's columns that write this key (src/features/tree-editor/policy.ts); the column
   * whose only writer this key is takes its header from it (tree-editor/columns.ts). */
  editor?: readonly string[];
}

export interface Key<Z extends z.ZodType = z.ZodType>
  extends Readonly<Required<Pick<KeyMeta, 'label' | 'changedBy'>>>, Readonly<Omit<KeyMeta, 'label' | 'changedBy'>> {
  readonly zod: Z;
  readonly presence: Presence;
  readonly read: Reader;
  readonly shape: ValueShape;
  /** The default, for presence 'default'. */
  readonly fallback?: unknown;
}

const described = <Z extends z.ZodType>(zod: Z, help: string | undefined): Z => (help === undefined ? zod : zod.describe(help));
const keyOf = <Z extends z.ZodType>(zod: Z, v: Value<z.ZodType>, presence: Presence, meta: KeyMeta, fallback?: unknown): Key<Z> => ({
  ...meta,
  changedBy: meta.changedBy ?? 'designer',
  zod: described(zod, meta.help),
  presence,
  read: v.read,
  shape: v.shape,
  fallback,
});

export function required<Z extends z.ZodType>(v: Value<Z>, meta: KeyMeta): Key<Z> {
  return keyOf(v.zod, v, 'required', meta);
}
export function optional<Z extends z.ZodType>(v: Value<Z>, meta: KeyMeta): Key<z.ZodOptional<Z>> {
  return keyOf(v.zod.optional(), v, 'optional', meta);
}
/** Absent or undefined reads as `fallback` (a fresh empty list each time for `[]`). */
export function withDefault<Z extends z.ZodType>(v: Value<Z>, fallback: z.util.NoUndefined<z.output<Z>>, meta: KeyMeta): Key<z.ZodDefault<Z>> {
  return keyOf(v.zod.default(fallback), v, 'default', meta, fallback);
}

// ---- elements

type Keys = Record<string, Key>;
type ShapeOf<K extends Keys> = { [P in keyof K]: K[P]['zod'] };

export interface Element<S extends z.ZodType = z.ZodType> {
  /** The element's name in messages and descriptions ("segment"). */
  readonly name: string;
  readonly keys: Keys;
  readonly schema: S;
  /** The fast reader: exactly what `schema.parse` returns, or DECLINED thrown. */
  readonly read: Reader<z.output<S>>;
}
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- any element, whatever its zod type
export type AnyElement = Element<any>;

const REQUIRED = 0;
const OPTIONAL = 1;
const DEFAULT = 2;

/** The fast reader of a strict object with these keys, in order: the same output as zod (keys in schema order). */
function compileReader(keys: Keys): Reader<Obj> {
  const names = Object.keys(keys);
  const n = names.length;
  const reads = names.map((k) => keys[k].read);
  const presence = names.map((k) => (keys[k].presence === 'required' ? REQUIRED : keys[k].presence === 'optional' ? OPTIONAL : DEFAULT));
  const fallbacks = names.map((k): (() => unknown) => {
    const f = keys[k].fallback;
    return Array.isArray(f) && f.length === 0 ? () => [] : () => f;
  });
  return (v) => {
    const o = obj(v);
    const out: Obj = {};
    let known = 0;
    for (let i = 0; i < n; i++) {
      const k = names[i];
      const p = presence[i];
      if (p === REQUIRED) {
        out[k] = reads[i](o[k]);
        known++;
      } else if (k in o) {
        const x = o[k];
        out[k] = x === undefined ? (p === OPTIONAL ? undefined : fallbacks[i]()) : reads[i](x);
        known++;
      } else if (p === DEFAULT) out[k] = fallbacks[i]();
    }
    strictKeys(o, known);
    return out;
  };
}

/**
 * A described element: its keys, the strict zod object derived from them, and its fast reader.
 * `help` describes the element itself (the schema's description wherever the element is used).
 */
export function element<K extends Keys>(name: string, keys: K, opts: { help?: string } = {}): Element<z.ZodObject<ShapeOf<K>, z.core.$strict>> {
  const shape = Object.fromEntries(Object.entries(keys).map(([k, d]) => [k, d.zod])) as ShapeOf<K>;
  return { name, keys, schema: described(z.strictObject(shape), opts.help), read: compileReader(keys) as Reader<never> };
}

// ---- what is derived from a description

/** The keys a contractor's field change may change. */
export function fieldChangeKeys<S extends z.ZodType>(e: Element<S>): (keyof z.output<S> & string)[] {
  return Object.keys(e.keys).filter((k) => e.keys[k].changedBy === 'field-change') as (keyof z.output<S> & string)[];
}

/** The keys in the format's order. */
export function keyOrder<S extends z.ZodType>(e: Element<S>): (keyof z.output<S> & string)[] {
  return Object.keys(e.keys) as (keyof z.output<S> & string)[];
}

/**
 * Every numeric key with a range inside the element, nested elements, lists and records included,
 * as [path parts, range]. `list` is the part written for "every item of a list" ("[]" or "*"); "*"
 * is written for "every value of a record". A range on a list or record of numbers applies to each.
 */
export function rangedPaths(e: AnyElement, list: string): [string[], LimitQuantity][] {
  const out: [string[], LimitQuantity][] = [];
  const seen = new Set<string>();
  const add = (path: string[], range: LimitQuantity) => {
    const id = path.join('\u0000');
    if (seen.has(id)) return;
    seen.add(id);
    out.push([path, range]);
  };
  const leaf = (shape: ValueShape, path: string[]): string[] =>
    shape.kind === 'list' ? leaf(shape.item, [...path, list]) : shape.kind === 'record' ? leaf(shape.item, [...path, '*']) : path;
  const walk = (shape: ValueShape, path: string[]) => {
    if (shape.kind === 'list') walk(shape.item, [...path, list]);
    else if (shape.kind === 'record') walk(shape.item, [...path, '*']);
    else if (shape.kind === 'element') walkElement(shape.element, path);
    else if (shape.kind === 'union') for (const el of shape.of) walkElement(el, path);
  };
  const walkElement = (el: AnyElement, path: string[]) => {
    for (const [k, d] of Object.entries(el.keys)) {
      if (d.range) add(leaf(d.shape, [...path, k]), d.range);
      walk(d.shape, [...path, k]);
    }
  };
  walkElement(e, []);
  return out;
}
