import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyzeSystem, SystemDocumentSchema, type SystemDocument } from '../../../src/engine';
import { MATERIALS } from '../../../src/engine/catalog/materials';
import { FITTING_TYPES } from '../../../src/engine/fittings/types';
import { SizingError } from '../../../src/engine/sizing/sizeSystem';
import { smallestSubstitute } from '../../../src/engine/sizing/substitute';
import { forbiddenDifferences } from '../../../server/services/fieldChangeRules';

/** The invented demo (Alder & Finch), as an issued revision's document. */
const issued = (): SystemDocument =>
  SystemDocumentSchema.parse(JSON.parse(readFileSync(new URL('../../../src/engine/examples/alder-finch-cold.json', import.meta.url), 'utf8')));
const PEX = MATERIALS['pex-sdr9'];
const APARTMENT_7A = ['7A-branch', '7A-bath', '7A-kitchen'];

const passes = (doc: SystemDocument) => {
  const a = analyzeSystem(doc);
  return a.verdict.allFixturesPass && a.verdict.allVelocitiesPass;
};
const withSize = (doc: SystemDocument, id: string, size: string): SystemDocument => ({
  ...doc,
  segments: doc.segments.map((s) => (s.id === id ? { ...s, size } : s)),
});

describe('smallest PEX that still passes (a contractor on a field change)', () => {
  it('when apartment 7A is substituted with PEX, then only its segments change, to PEX sizes that pass, and no one of them can be a size smaller', () => {
    const before = issued();
    const r = smallestSubstitute(before, { segmentIds: APARTMENT_7A });
    expect(r.sizing.feasible).toBe(true);
    expect(r.substituted).toEqual(APARTMENT_7A);
    const doc = r.sizing.document!;
    for (const s of doc.segments) {
      const old = before.segments.find((x) => x.id === s.id)!;
      if (APARTMENT_7A.includes(s.id)) {
        expect(s.material).toBe('pex-sdr9');
        expect(PEX.sizes.some((z) => z.key === s.size)).toBe(true);
      } else {
        expect([s.material, s.size]).toEqual([old.material, old.size]);
      }
    }
    expect(passes(doc)).toBe(true);
    // each substituted segment at the next smaller PEX size its fittings have data for (the PEX
    // fitting tables cover 1/2–1 in or 1/2–2 in) fails a fixture or a velocity (the engine decides, not this test)
    const ascending = [...PEX.sizes].sort((a, b) => a.innerDiameterM - b.innerDiameterM).map((z) => z.key);
    const covered = (id: string, size: string) =>
      (doc.segments.find((s) => s.id === id)!.fittings ?? []).every((f) => {
        const e = FITTING_TYPES[f.typeId];
        return f.custom || !e || e.pipeFamily !== 'pex' || e.equivalentLengthFt?.[size] !== undefined;
      });
    for (const id of APARTMENT_7A) {
      const k = ascending.indexOf(doc.segments.find((s) => s.id === id)!.size!);
      const smaller = ascending
        .slice(0, Math.max(k, 0))
        .filter((size) => covered(id, size))
        .at(-1);
      if (smaller !== undefined) expect(passes(withSize(doc, id, smaller))).toBe(false);
    }
  });

  it('when the proposed document is checked against the field-change policy, then it changes nothing a contractor may not change', () => {
    const before = issued();
    const r = smallestSubstitute(before, { segmentIds: APARTMENT_7A });
    expect(forbiddenDifferences(before, SystemDocumentSchema.parse(r.sizing.document))).toEqual({});
  });

  it('when a named segment is locked by the designer, then it is skipped and keeps its copper', () => {
    const before = issued();
    const locked = { ...before, segments: before.segments.map((s) => (s.id === '7A-bath' ? { ...s, sizeLocked: true } : s)) };
    const r = smallestSubstitute(locked, { segmentIds: APARTMENT_7A });
    expect(r.skipped).toEqual([{ segmentId: '7A-bath', reason: 'locked' }]);
    const bath = r.sizing.document!.segments.find((s) => s.id === '7A-bath')!;
    const old = before.segments.find((s) => s.id === '7A-bath')!;
    expect([bath.material, bath.size]).toEqual([old.material, old.size]);
  });

  it('when every named segment is locked, or the material is not in the catalog, then a named error and nothing changes', () => {
    const before = issued();
    const locked = { ...before, segments: before.segments.map((s) => (APARTMENT_7A.includes(s.id) ? { ...s, sizeLocked: true } : s)) };
    expect(() => smallestSubstitute(locked, { segmentIds: APARTMENT_7A })).toThrow(/locked by the designer/);
    expect(() => smallestSubstitute(before, { segmentIds: APARTMENT_7A, material: 'unobtainium' })).toThrow(SizingError);
    expect(() => smallestSubstitute(before, { segmentIds: ['nope'] })).toThrow(/No segment "nope"/);
  });
});
