import { describe, expect, it } from 'vitest';
import { buildRiser, floorsFromTable } from '../../../src/engine/building/riserBuilder';
import { expandBuilding, expandPlacements } from '../../../src/engine/building/expand';
import { APARTMENT_A, APARTMENT_BRANCH_LENGTHS_FT, apartmentBuildingDocument, apartmentBuildingSpec } from '../../../src/engine/building/apartmentBuilding';
import { FIXTURE_TYPES } from '../../../src/engine/catalog/fixtures';
import { EngineInputError } from '../../../src/engine/errors';
import { UnitTypeSchema, type UnitType } from '../../../src/engine/building/schema';
import { expectClose } from '../../helpers/expectClose';

// The building is invented (see apartmentBuilding.ts); the expected figures below are counted by
// hand from its description, not read back from the generator.

describe('floors from a table', () => {
  it('when some elevations are missing, then each is the previous one plus the typical height', () => {
    const floors = floorsFromTable(
      [
        { name: 'Level 1', elevation: 0 },
        { name: 'Level 2' },
        { name: 'Level 3' },
        { name: 'Level 4' },
        { name: 'Level 5' },
        { name: 'Level 6' },
        { name: 'Level 7', elevation: 62 },
      ],
      10,
    );
    expect(floors.map((f) => f.elevation)).toEqual([0, 10, 20, 30, 40, 50, 62]);
    expect(floors.map((f) => f.id)).toEqual(['level-1', 'level-2', 'level-3', 'level-4', 'level-5', 'level-6', 'level-7']);
  });

  it('when a floor is not above the one before it, then the error names that floor', () => {
    expect(() =>
      floorsFromTable(
        [
          { name: 'Level 1', elevation: 0 },
          { name: 'Level 2', elevation: 10 },
          { name: 'Mezzanine', elevation: 8 },
        ],
        10,
      ),
    ).toThrow(/Mezzanine.*not above "Level 2"/);
  });

  it('when the first floor has no elevation, then it says so', () => {
    expect(() => floorsFromTable([{ name: 'Ground' }], 10)).toThrow(EngineInputError);
  });
});

describe('the riser builder', () => {
  it('when a 4-storey building of 16 apartments is built, then it has the riser, mains and placements counted by hand', () => {
    const built = buildRiser(apartmentBuildingSpec(4));
    // Per floor: 1 riser segment + 4 floor-main segments; 4 floors → 20 segments and 20 nodes.
    expect(built.segments).toHaveLength(20);
    expect(built.nodes).toHaveLength(20);
    expect(built.placements).toHaveLength(16);
    // Riser foot: 10 ft horizontal + climb from -5 ft to level 1's main at 9 ft = 14 ft → 24 ft.
    expect(built.segments[0]).toMatchObject({ id: 'riser-foot', from: 'after-backflow', to: 'riser-level-1', length: 24 });
    // Every other riser segment climbs one floor: 10 ft.
    const risers = built.segments.filter((s) => s.id.startsWith('riser-to-'));
    expect(risers.map((s) => s.length)).toEqual([10, 10, 10]);
    // Branch lengths 10/25/40/55 ft: the first apartment uses the unit type's own 10 ft (no override).
    const level4 = built.placements.filter((p) => p.floor === 'level-4');
    expect(level4.map((p) => p.overrides?.segments?.branch?.length ?? APARTMENT_A.segments[0].length)).toEqual([...APARTMENT_BRANCH_LENGTHS_FT]);
    expect(level4[0].overrides).toBeUndefined();
    expect(level4.map((p) => p.label)).toEqual(['Apt Level 4-1', 'Apt Level 4-2', 'Apt Level 4-3', 'Apt Level 4-4']);
  });

  it('when 40 storeys of 8 apartments are built, then segments, nodes and checked fixtures scale as counted by hand', () => {
    const doc = apartmentBuildingDocument(40, 8);
    const expanded = expandBuilding(doc);
    // 3 service, meter-set and backflow-set segments + 40·(1 + 8) riser and main segments + 320 apartments · 7 branch segments.
    expect(expanded.segments).toHaveLength(3 + 40 * 9 + 320 * 7);
    // 4 service nodes + 40·9 riser and main-tap nodes + 320 · 7 apartment nodes.
    expect(expanded.nodes).toHaveLength(4 + 40 * 9 + 320 * 7);
    const checked = expanded.nodes.flatMap((n) => (n as { checkedFixtures?: { id: string }[] }).checkedFixtures ?? []);
    expect(checked).toHaveLength(320);
    expect(new Set(checked.map((c) => c.id)).size).toBe(320);
  });

  it('when the apartments are expanded, then the cold fixture units per apartment are the catalog sum', () => {
    const doc = apartmentBuildingDocument(4);
    const expanded = expandBuilding(doc);
    const groups = expanded.nodes.flatMap((n) => (n as { fixtureGroups?: { fixtureTypeId: string; count: number }[] }).fixtureGroups ?? []);
    let cold = 0;
    for (const g of groups) cold += (FIXTURE_TYPES[g.fixtureTypeId]!.wsfu.cold ?? 0) * g.count;
    // IPC Table E103.3(2) cold loads: WC tank 2.2, lavatory 0.5, shower 1.0, kitchen sink 1.0,
    // dishwasher none (hot only), clothes washer 1.0 → 5.7 per apartment, 16 apartments → 91.2.
    // (The catalog tags the WC, shower and washer rows as unverified; the sum is the same either way.)
    expectClose(cold, 16 * 5.7, { rtol: 1e-12 }); // exact sum of decimal inputs; rtol covers float rounding
  });

  it('when a placement overrides a branch length, then only that placement changes and the override is data of its own', () => {
    const doc = apartmentBuildingDocument(2);
    const expanded = expandBuilding(doc);
    const branch = (pid: string) => expanded.segments.find((s) => (s as { id: string }).id === `${pid}.branch`) as { length: number; from: string };
    expect(branch('level-2-u1').length).toBe(10);
    expect(branch('level-2-u4').length).toBe(55);
    expect(branch('level-2-u4').from).toBe('main-level-2-4');
    // Editing the type changes every placement that does not override the field.
    const edited = { ...doc, unitTypes: [{ ...APARTMENT_A, segments: APARTMENT_A.segments.map((s) => (s.id === 'to-shower' ? { ...s, length: 30 } : s)) }] };
    const again = expandBuilding(edited);
    const showers = again.segments.filter((s) => (s as { id: string }).id.endsWith('.to-shower')) as { length: number }[];
    expect(showers).toHaveLength(8);
    expect(showers.every((s) => s.length === 30)).toBe(true);
  });
});

describe('bad building input gets a message naming the row or field, and nothing is built', () => {
  const spec = () => apartmentBuildingSpec(3);

  it('when a unit type references a fixture type by a misspelt field, then the schema refuses it', () => {
    const bad = { ...APARTMENT_A, nodes: [{ ...APARTMENT_A.nodes[0], fixtureGroup: [] }] };
    expect(UnitTypeSchema.safeParse(bad).success).toBe(false);
  });

  it('when a placement names a missing floor or unit type, then the error names the placement', () => {
    const floorIds = new Set(['level-1']);
    const nodes = new Set(['main-level-1-1']);
    expect(() =>
      expandPlacements([APARTMENT_A], [{ id: 'p1', unitTypeId: 'apartment-a', label: 'Apt 101', floor: 'level-9', at: 'main-level-1-1' }], floorIds, nodes),
    ).toThrow(/Apt 101.*floor "level-9" does not exist/);
    expect(() =>
      expandPlacements([APARTMENT_A], [{ id: 'p1', unitTypeId: 'studio', label: 'Apt 101', floor: 'level-1', at: 'main-level-1-1' }], floorIds, nodes),
    ).toThrow(/Apt 101.*unit type "studio" does not exist/);
    expect(() =>
      expandPlacements(
        [APARTMENT_A],
        [
          {
            id: 'p1',
            unitTypeId: 'apartment-a',
            label: 'Apt 101',
            floor: 'level-1',
            at: 'main-level-1-1',
            overrides: { segments: { 'to-bidet': { length: 3 } } },
          },
        ],
        floorIds,
        nodes,
      ),
    ).toThrow(/override of segment "to-bidet"/);
  });

  it('when a unit type is not a tree from its inlet, then the error names the unit type and node', () => {
    const looped: UnitType = { ...APARTMENT_A, segments: [...APARTMENT_A.segments, { id: 'extra', from: 'wc', to: 'lav', length: 2, fittings: [] }] };
    expect(() => expandPlacements([looped], [], new Set(), new Set())).toThrow(/Apartment A.*"lav" is fed by two segments/);
  });

  it('when the riser names a floor that is not in the list, or no units, then the field is named', () => {
    expect(() => buildRiser({ ...spec(), riser: { ...spec().riser, toFloor: 'roof' } })).toThrow(/"roof" is not in the floor list/);
    expect(() => buildRiser({ ...spec(), units: [] })).toThrow(/at least one unit/);
    expect(() => buildRiser({ ...spec(), units: [{ ...spec().units[0], unitTypeId: 'penthouse' }] })).toThrow(/"penthouse" does not exist/);
  });

  it('when the start point is level with the first floor main and no run to the foot is given, then the foot length is named instead of a pipe of no length', () => {
    const s = spec();
    const level = { ...s, startElevation: s.floors[0].elevation + s.floorMain.heightAboveFloor, riser: { ...s.riser, footLength: 0 } };
    expect(() => buildRiser(level)).toThrow(EngineInputError);
    expect(() => buildRiser(level)).toThrow(/no length.*run from the start point to the foot of the riser/);
    // a run to the foot makes it a real pipe again
    expect(buildRiser({ ...level, riser: { ...level.riser, footLength: 6 } }).segments[0].length).toBe(6);
  });
});

describe('the expanded building obeys the document bounds', () => {
  it('when placements would expand past the node and segment bound, then the error says so before building anything', () => {
    const many = Array.from({ length: 3000 }, (_, i) => ({ id: `p${i}`, unitTypeId: 'apartment-a', label: `Apt ${i}`, floor: 'level-1', at: 'tap' }));
    expect(() => expandPlacements([APARTMENT_A], many, new Set(['level-1']), new Set(['tap']))).toThrow(
      /expand to 21001 nodes and segments; a system holds at most 20000/,
    );
  });
});
