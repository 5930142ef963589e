import { describe, expect, it } from 'vitest';
import { APARTMENT_A } from '../../src/engine/building/apartmentBuilding';
import { UnitTypeSchema, type UnitType } from '../../src/engine/building/schema';
import { unitTypeFromForm, unitTypeToForm } from '../../src/features/building/lib/unit-types';

// The invented apartment of apartmentBuilding.ts, as the building page writes it, then given the
// keys the page's unit-type table does not show: a designer's size lock, a custom pipe,
// a second fixture group and a checked fixture's own minimum (invented figures).
function withHiddenKeys(): UnitType {
  const base = unitTypeFromForm(unitTypeToForm(APARTMENT_A));
  const shower = base.nodes.find((n) => n.checkedFixtures.length > 0)!;
  const custom = base.segments.find((s) => s.to !== shower.id && s.id !== 'branch')!;
  return UnitTypeSchema.parse({
    ...base,
    nodes: base.nodes.map((n) =>
      n.id === shower.id
        ? {
            ...n,
            fixtureGroups: [...n.fixtureGroups, { fixtureTypeId: 'lavatory', count: 2 }],
            checkedFixtures: n.checkedFixtures.map((c) => ({ ...c, minFlowPressure: 25 })),
          }
        : n,
    ),
    segments: base.segments.map((s) =>
      s.id === 'branch'
        ? { ...s, sizeLocked: true }
        : s.id === custom.id
          ? { ...s, custom: { innerDiameter: 0.55, roughness: 0.00006, hazenWilliamsC: 150, velocityClass: 'plastic' } }
          : s,
    ),
  });
}

describe('the building page keeps the unit type keys its table does not show', () => {
  it('when a stored unit type is opened and applied unchanged, then it comes back identical, every hidden key kept', () => {
    const stored = withHiddenKeys();
    expect(unitTypeFromForm(unitTypeToForm(stored), stored)).toEqual(stored);
    // without the stored type (a new unit type) the hidden keys cannot exist: this is what was lost before
    expect(unitTypeFromForm(unitTypeToForm(stored))).not.toEqual(stored);
  });

  it('when a length is edited, then only that length changes', () => {
    const stored = withHiddenKeys();
    const form = unitTypeToForm(stored);
    form.rows[0] = { ...form.rows[0], length: form.rows[0].length + 7 };
    const next = unitTypeFromForm(form, stored);
    const branchBefore = stored.segments.find((s) => s.id === 'branch')!;
    const branchAfter = next.segments.find((s) => s.id === 'branch')!;
    expect(branchAfter).toEqual({ ...branchBefore, length: branchBefore.length + 7 });
    expect(next.nodes).toEqual(stored.nodes);
    expect(next.segments.filter((s) => s.id !== 'branch')).toEqual(stored.segments.filter((s) => s.id !== 'branch'));
  });

  it('when the material of the segment with a custom pipe is changed, then the custom pipe goes (the new material and size describe the pipe)', () => {
    const stored = withHiddenKeys();
    const withCustom = stored.segments.find((s) => s.custom)!;
    const form = unitTypeToForm(stored);
    const row = form.rows.findIndex((r) => withCustom.to === r.key);
    form.rows[row] = { ...form.rows[row], material: 'copper-l', size: '1/2' };
    const after = unitTypeFromForm(form, stored).segments.find((s) => s.id === withCustom.id)!;
    expect(after.custom).toBeUndefined();
    expect(after).toMatchObject({ material: 'copper-l', size: '1/2' });
  });

  it('when a checked fixture is unticked, then it is no longer checked, and its node keeps its second fixture group', () => {
    const stored = withHiddenKeys();
    const form = unitTypeToForm(stored);
    const row = form.rows.findIndex((r) => r.checked);
    form.rows[row] = { ...form.rows[row], checked: false };
    const node = unitTypeFromForm(form, stored).nodes.find((n) => n.id === form.rows[row].key)!;
    expect(node.checkedFixtures).toEqual([]);
    expect(node.fixtureGroups.map((g) => g.fixtureTypeId)).toContain('lavatory');
  });
});
