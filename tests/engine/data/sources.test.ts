/**
 * Honest sources: every source string the engine ships either cites a published source or carries the
 * unverified flag and the caution words; none says "from memory" or names a software library's file.
 * (A rule of the product, not a published value.)
 */
import { describe, expect, it } from 'vitest';
import { NOT_VERIFIED, shippedSources, unverifiedSources } from '../../../src/engine/catalog/sources';
import { pressureRating } from '../../../src/engine/catalog/pressureRatings';
import { fittingK } from '../../../src/engine/fittings';
import { fahrenheitToCelsius } from '../../../src/engine/units';

/** A software library's file or internal name: a path with a code-file extension, a repository path, or a package's internals. */
const LIBRARY_FILE = /\.(py|js|ts|c|h|cpp|m)\b|[\w-]+\/[\w-]+\/[\w./-]+|CalebBell|\bfluids\s*\/|_roughness|Crane_fts|\bK_\w+_Crane\b/i;

describe('shipped source strings', () => {
  const all = shippedSources();

  it('cover every catalog: materials, fixtures, fittings, meters, the demand table, methods, criteria, pressure ratings', () => {
    const kinds = new Set(all.map((s) => s.kind));
    for (const k of [
      'material',
      'fixture-type',
      'fitting-type',
      'device-template',
      'demand-table',
      'friction-method',
      'fitting-method',
      'demand-method',
      'criteria',
      'pressure-rating',
    ]) {
      expect(kinds.has(k as never), k).toBe(true);
    }
    expect(all.length).toBeGreaterThan(100);
  });

  it('never say "from memory" (any case): a value is either cited or flagged unverified', () => {
    const offenders = all.filter((s) => /from\s+memory/i.test(s.source)).map((s) => `${s.kind} ${s.id} ${s.field}: ${s.source}`);
    expect(offenders).toEqual([]);
  });

  it('never name a software library file or internal name', () => {
    const offenders = all.filter((s) => LIBRARY_FILE.test(s.source)).map((s) => `${s.kind} ${s.id} ${s.field}: ${s.source}`);
    expect(offenders).toEqual([]);
  });

  it('never cite an unattributed sheet as if it were a source', () => {
    expect(all.filter((s) => /unattributed/i.test(s.source)).map((s) => s.source)).toEqual([]);
  });

  it('the flag and the words agree: unverified ⇔ the source carries the caution', () => {
    for (const s of all) expect(s.source.includes(NOT_VERIFIED), `${s.kind} ${s.id} ${s.field}`).toBe(!s.verified);
  });

  it('each source is a real sentence naming something (at least 15 characters)', () => {
    for (const s of all) expect(s.source.trim().length, `${s.kind} ${s.id} ${s.field}`).toBeGreaterThanOrEqual(15);
  });

  it('the caution is the product wording', () => {
    expect(NOT_VERIFIED).toBe('not verified against the printed code — confirm against the adopted edition');
  });
});

describe('unverifiedSources()', () => {
  const list = unverifiedSources();
  const has = (kind: string, id: string, field?: string) => list.some((s) => s.kind === kind && s.id === id && (field === undefined || s.field === field));

  it('lists exactly the shipped entries whose flag is false', () => {
    expect(list.length).toBe(shippedSources().filter((s) => !s.verified).length);
    expect(list.every((s) => !s.verified)).toBe(true);
  });
  it('includes what could not be checked: CPVC dimensions, PEX C, the IPC WSFU rows from showers on, meter curves, equivalent lengths, the demand table, PEX ratings', () => {
    expect(has('material', 'cpvc-sdr11', 'dimensions')).toBe(true);
    expect(has('material', 'pex-sdr9', 'hazenWilliamsC')).toBe(true);
    expect(has('fixture-type', 'shower-private')).toBe(true);
    expect(has('fixture-type', 'water-closet-flush-valve-public')).toBe(true);
    expect(has('device-template', 'meter-displacement-5-8')).toBe(true);
    expect(has('fitting-type', 'elbow-90-standard', 'equivalent-length')).toBe(true);
    expect(has('demand-table', 'hunter-table-ipc')).toBe(true);
    expect(has('pressure-rating', 'pex-sdr9')).toBe(true);
    expect(has('fitting-method', 'equivalent-length')).toBe(true);
    expect(has('demand-method', 'hunter-table')).toBe(true);
  });
  it('leaves out what was checked: copper dimensions, IPC Table 604.3 rows, Crane K of a 90° elbow, the copper joint rating', () => {
    expect(has('material', 'copper-l', 'dimensions')).toBe(false);
    expect(has('fixture-type', 'lavatory-private')).toBe(false);
    expect(has('fitting-type', 'elbow-90-standard', 'crane')).toBe(false);
    expect(has('fitting-type', 'tee-branch', 'crane')).toBe(false);
    expect(has('pressure-rating', 'copper-joint-95-5')).toBe(false);
    expect(has('fitting-method', 'crane')).toBe(false);
    expect(has('friction-method', 'hazen-williams')).toBe(false);
  });
});

describe('sources reaching a result carry the caution where they are unverified', () => {
  it('a fitting by the equivalent-length method says so; by Crane it does not', () => {
    const ctx = { nominalSizeIn: 0.75, nominalSizeKey: '3/4', innerDiameterM: 0.785 * 0.0254, Re: 5e4, frictionFactor: 0.022 };
    expect(fittingK('elbow-90-standard', { ...ctx, method: 'equivalent-length' }).source).toContain(NOT_VERIFIED);
    expect(fittingK('elbow-90-standard', { ...ctx, method: 'crane' }).source).not.toContain(NOT_VERIFIED);
  });
  it('a pressure rating flagged unverified says so in its source; a verified one does not', () => {
    for (const [m, tF] of [
      ['pex-sdr9', 140],
      ['cpvc-sdr11', 100],
      ['cpvc-sdr11', 140],
      ['copper-l', 140],
    ] as const) {
      const r = pressureRating(m, '3/4', fahrenheitToCelsius(tF))!;
      expect(r.source.includes(NOT_VERIFIED), `${m} ${tF} °F`).toBe(!r.verified);
      expect(r.source).not.toMatch(/from\s+memory/i);
    }
  });
});
