/**
 * A stored unit type read into the page's rows and written back keeps its ids, piping and
 * fixtures (placements' overrides and checked fixtures refer to those ids); a new row gets an id
 * from its name.
 */
import { describe, expect, it } from 'vitest';
import { APARTMENT_A } from '../../src/engine/building/apartmentBuilding';
import { unitTypeFromForm, unitTypeToForm } from '../../src/features/building/lib/unit-types';
import { newFixtureRow } from '../../src/features/building/lib/defaults';

const withoutSegmentLabels = (t: typeof APARTMENT_A) => ({ ...t, segments: t.segments.map(({ label: _label, ...s }) => s) });

describe('unit types between the document and the page', () => {
  it('when the reference apartment is read and written back, then nodes and segments are the same', () => {
    expect(withoutSegmentLabels(unitTypeFromForm(unitTypeToForm(APARTMENT_A)))).toEqual(withoutSegmentLabels(APARTMENT_A));
  });

  it('when a point is added, then it gets an id from its name that no other point has', () => {
    const form = unitTypeToForm(APARTMENT_A);
    const row = { ...newFixtureRow(form.rows), name: 'Shower', fixtureTypeId: 'shower-private', length: 9 };
    const type = unitTypeFromForm({ ...form, rows: [...form.rows, row] });
    const added = type.nodes.at(-1)!;
    expect(added.id).toBe('shower-2');
    expect(type.segments.at(-1)).toMatchObject({ id: 'to-shower-2', from: 'manifold', to: 'shower-2', length: 9 });
  });
});
