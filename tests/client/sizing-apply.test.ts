import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { sizeSystem, SystemDocumentSchema, type SystemDocument } from '../../src/engine';
import { apartmentBuildingDocument } from '../../src/engine/building/apartmentBuilding';
import { sizingBasisState } from '../../src/engine';
import {
  applySizes,
  applySizing,
  applySubstitution,
  changedRows,
  lockedSegmentKeys,
  setSizeLocked,
  setUnitSegmentSizeLocked,
  undoSizes,
  undoSizing,
  undoSubstitution,
} from '../../src/features/sizing/lib/apply';

/** The invented demo (Alder & Finch) with its risers drawn at 1 in, so that sizing changes them. */
function undersized(): SystemDocument {
  const doc = SystemDocumentSchema.parse(JSON.parse(readFileSync(new URL('../../src/engine/examples/alder-finch-cold.json', import.meta.url), 'utf8')));
  return { ...doc, segments: doc.segments.map((s) => (s.id.startsWith('riser-') ? { ...s, size: '1' } : s)) };
}

describe('applying a sizing answer to a draft', () => {
  const start = undersized();
  const answer = sizeSystem(start);

  it('when applied, then the draft has exactly the sizes of the engine’s sized document, and undo gives back the sizes entered', () => {
    const applied = applySizes(start, answer.segments);
    expect(applied.segments.map((s) => s.size)).toEqual(answer.document!.segments.map((s) => s.size));
    expect(undoSizes(applied, answer.segments)).toEqual(start);
  });

  it('when a size was edited by hand after applying, then undo keeps that edit', () => {
    const row = changedRows(answer.segments)[0];
    const applied = applySizes(start, answer.segments);
    const edited = { ...applied, segments: applied.segments.map((s) => (s.id === row.segmentId ? { ...s, size: '4' } : s)) };
    const undone = undoSizes(edited, answer.segments);
    expect(undone.segments.find((s) => s.id === row.segmentId)!.size).toBe('4');
  });

  it('when a lock is set and cleared, then only that segment carries sizeLocked, and clearing removes the key', () => {
    const locked = setSizeLocked(start, 'service', true);
    expect(locked.segments.filter((s) => s.sizeLocked).map((s) => s.id)).toEqual(['service']);
    expect('sizeLocked' in setSizeLocked(locked, 'service', false).segments.find((s) => s.id === 'service')!).toBe(false);
  });

  it('when a unit type segment’s lock is set and cleared, then only that unit type segment carries sizeLocked, the answer’s row reads it, and clearing gives the draft back as it was', () => {
    // invented example: 16 apartments of one type
    const doc = SystemDocumentSchema.parse(apartmentBuildingDocument(4));
    const type = doc.unitTypes![0];
    const seg = type.segments[0];
    const row = sizeSystem({ ...doc, source: { ...doc.source, staticPressureLow: 100, staticPressureHigh: 100 } }).segments.find(
      (r) => r.unitType?.id === type.id && r.unitType.segmentId === seg.id,
    )!;
    expect(lockedSegmentKeys(doc).has(row.segmentId)).toBe(false);
    const locked = setUnitSegmentSizeLocked(doc, type.id, seg.id, true);
    const lockedSegments = locked.unitTypes!.flatMap((t) => t.segments.filter((s) => s.sizeLocked).map((s) => `${t.id}/${s.id}`));
    expect(lockedSegments).toEqual([`${type.id}/${seg.id}`]);
    // the placements, the main tree and the other unit segments are not touched
    expect(locked.placements).toBe(doc.placements);
    expect(locked.segments).toBe(doc.segments);
    expect(lockedSegmentKeys(locked)).toEqual(new Set([row.segmentId]));
    // clearing removes the key: the draft is as it was (undo)
    const cleared = setUnitSegmentSizeLocked(locked, type.id, seg.id, false);
    expect('sizeLocked' in cleared.unitTypes![0].segments[0]).toBe(false);
    expect(cleared).toEqual(doc);
    // a main segment's lock is read under its own id
    expect(lockedSegmentKeys(setSizeLocked(doc, doc.segments[0].id, true))).toEqual(new Set([doc.segments[0].id]));
  });

  it('when a substitution is applied and undone, then material and size follow and come back', () => {
    const ids = ['7A-bath', '7A-kitchen'];
    const { document, before } = applySubstitution(start, 'pex-sdr9', answer.segments, ids);
    for (const id of ids) expect(document.segments.find((s) => s.id === id)!.material).toBe('pex-sdr9');
    expect(undoSubstitution(document, before)).toEqual(start);
  });

  it('when applied with its basis, then the draft records the sizing (current) and undo restores the draft as it was, record included', () => {
    const at = new Date('2026-11-30T10:00:00Z');
    const applied = applySizing(start, answer, 0, at);
    expect(applied.segments.map((s) => s.size)).toEqual(answer.document!.segments.map((s) => s.size));
    expect(sizingBasisState(applied)).toMatchObject({
      kind: 'sized',
      edited: false,
      basis: { sizedAt: at.toISOString(), segmentsChanged: changedRows(answer.segments).length },
    });
    expect(undoSizing(applied, answer.segments, undefined)).toEqual(start);
    // a second sizing over a recorded one: undo gives the first record back
    const again = applySizing(applied, answer, 0, new Date('2026-12-01T10:00:00Z'));
    expect(undoSizing(again, answer.segments, applied.sizingBasis).sizingBasis).toEqual(applied.sizingBasis);
  });

  it('when an answer sizes a unit type, then applying writes the unit type’s sizes (not the placements’), undo gives them back, and a later hand edit of a unit size is noticed', () => {
    // invented example: 16 apartments of one type on an invented 100 psi main
    const built = SystemDocumentSchema.parse(apartmentBuildingDocument(4));
    const doc: SystemDocument = { ...built, source: { ...built.source, staticPressureLow: 100, staticPressureHigh: 100 } };
    const result = sizeSystem(doc);
    expect(changedRows(result.segments).some((r) => r.unitType)).toBe(true);
    const applied = applySizing(doc, result, 0, new Date('2026-12-03T10:00:00Z'));
    expect(applied.unitTypes).toEqual(result.document!.unitTypes);
    expect(applied.placements).toEqual(doc.placements);
    expect(sizingBasisState(applied)).toMatchObject({ kind: 'sized', edited: false });
    const edited = {
      ...applied,
      unitTypes: applied.unitTypes!.map((t) => ({ ...t, segments: t.segments.map((s, i) => (i === 0 ? { ...s, size: '2' } : s)) })),
    };
    expect(sizingBasisState(edited)).toMatchObject({ kind: 'sized', edited: true });
    expect(undoSizing(applied, result.segments, undefined)).toEqual(doc);
  });
});
