import { describe, expect, it } from 'vitest';
import { analyzeSystem, type SystemDocument } from '../../src/engine';
import { apartmentBuildingDocument, apartmentBuildingSpec } from '../../src/engine/building/apartmentBuilding';
import { buildRiser } from '../../src/engine/building/riserBuilder';
import { writeGenerated } from '../../src/features/building/lib/document-adapter';

// The 4-storey apartment building is invented (src/engine/building/apartmentBuilding.ts). These
// tests are about the floors the building page writes, not about its numbers: the reference is the
// same building generated into a draft whose floor ids are the builder's own.

/** The generated building with its floors re-keyed the way an imported draft may key them ("L1" …). */
function draftWithOwnFloorIds(): SystemDocument {
  const doc = apartmentBuildingDocument(4) as unknown as SystemDocument;
  const rename = (id: string) => id.replace(/^level-/, 'L');
  return {
    ...doc,
    floors: (doc.floors ?? []).map((f) => ({ ...f, id: rename(f.id) })),
    nodes: doc.nodes.map((n) => (n.floor ? { ...n, floor: rename(n.floor) } : n)),
    placements: (doc.placements ?? []).map((p) => ({ ...p, floor: rename(p.floor) })),
  };
}

describe('generating a building into a draft that has its floors already', () => {
  it('when the draft names its floors with other ids, then Generate joins them by name and adds no second "Level 3"', () => {
    const draft = draftWithOwnFloorIds();
    const spec = apartmentBuildingSpec(4);
    const next = writeGenerated(draft, buildRiser(spec), spec.unitTypes, { startNodeId: spec.startNodeId, mode: 'replace' });

    expect(next.floors?.map((f) => `${f.id} ${f.name}`)).toEqual(['L1 Level 1', 'L2 Level 2', 'L3 Level 3', 'L4 Level 4']);
    const floorIds = new Set(next.floors?.map((f) => f.id));
    for (const n of next.nodes) if (n.floor !== undefined) expect(floorIds).toContain(n.floor);
    for (const p of next.placements ?? []) expect(floorIds).toContain(p.floor);

    // Same building, same answer as the draft it replaced (which was generated with the builder's ids).
    const before = analyzeSystem(draft);
    const after = analyzeSystem(next);
    expect(before.criticalFixtureId).not.toBeNull();
    expect(after.criticalFixtureId).toBe(before.criticalFixtureId);
    expect(after.fixtures.map((f) => f.margin)).toEqual(before.fixtures.map((f) => f.margin));
    expect(after.verdict.status).toBe(before.verdict.status);
  });

  it('when a generated floor has the name of none but the elevation of one, then Generate refuses and names both', () => {
    const draft = draftWithOwnFloorIds();
    const renamed = { ...draft, floors: draft.floors?.map((f) => (f.id === 'L2' ? { ...f, name: 'Second floor' } : f)) };
    const spec = apartmentBuildingSpec(4);
    expect(() => writeGenerated(renamed, buildRiser(spec), spec.unitTypes, { startNodeId: spec.startNodeId, mode: 'replace' })).toThrow(
      /Level 2.*Second floor/,
    );
  });

  it('when the draft gives a generated floor id to a floor of another name, then the generated floor gets a fresh id', () => {
    const spec = apartmentBuildingSpec(4);
    const draft = draftWithOwnFloorIds();
    // The draft's roof (above the building) happens to use the id the builder gives "Level 2".
    const withRoof = { ...draft, floors: [...(draft.floors ?? []).filter((f) => f.id !== 'L2'), { id: 'level-2', name: 'Roof', elevation: 100 }] };
    const without2 = { ...withRoof, nodes: withRoof.nodes.filter((n) => n.floor !== 'L2') };
    const next = writeGenerated(without2, buildRiser(spec), spec.unitTypes, { startNodeId: spec.startNodeId, mode: 'replace' });
    const level2 = next.floors?.find((f) => f.name === 'Level 2');
    expect(level2?.id).toBe('level-2-2');
    expect(next.floors?.find((f) => f.id === 'level-2')?.name).toBe('Roof');
    expect(next.nodes.filter((n) => n.floor === 'level-2-2').length).toBeGreaterThan(0);
  });
});
