/**
 * Fixture schedules on the building page: a pasted schedule is previewed row by row with each
 * row's match or error and applied only when every row matches; a file that is not text or is
 * over 1 MiB is refused with a message; the export is read back by the same import.
 */
import { fireEvent, screen, waitFor } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { FIXTURE_TYPES } from '../../src/engine/catalog/fixtures';
import { SCHEDULE_MAX_BYTES } from '../../src/engine/building/schedule';
import { buildingPaths } from '../../src/features/building/paths';
import { exportSchedule, previewSchedule } from '../../src/features/building/lib/schedule';
import type { UnitTypeForm } from '../../src/features/building/lib/form';
import { fakeApi } from './support/fake-api';
import type { FakeApi } from './support/fake-api';
import { field, renderWalk } from './support/render-walk';

const href = (world: FakeApi) => buildingPaths.building.getHref(world.ids.projectId, world.ids.systemId, world.ids.revisionId);
const fixtureSelects = () => [...document.querySelectorAll<HTMLSelectElement>('select[aria-label$=" fixture"]')];

describe('fixture schedules on the building page', () => {
  it('when a pasted schedule has an unknown fixture, then that line names it and nothing is applied; corrected, its fixtures join the unit type', async () => {
    const world = fakeApi();
    const { user } = await renderWalk(world, href(world));
    await screen.findByRole('heading', { name: 'Building' });
    await user.click(screen.getByText('Fixture schedule: import or export'));
    const box = field('Paste a schedule (CSV or a spreadsheet range)');
    const bad = 'floor,unit,fixture,count\ntypical,Unit A,lavatory,1\ntypical,Unit A,hot tub jet,1\n';
    fireEvent.change(box, { target: { value: bad } });
    await user.click(screen.getByRole('button', { name: 'Preview the schedule' }));
    expect((await screen.findByTestId('schedule-line-3')).textContent).toContain('Line 3: "hot tub jet"');
    expect(screen.getByTestId('schedule-line-2').textContent).toContain(FIXTURE_TYPES['lavatory-private'].label);
    expect((screen.getByRole('button', { name: /^Apply/ }) as HTMLButtonElement).disabled).toBe(true);
    expect(fixtureSelects().filter((s) => s.value !== '')).toHaveLength(0);

    const good = 'floor,unit,fixture,count\ntypical,Unit A,lavatory,1\ntypical,Unit A,"water closet, flush tank",1\n';
    fireEvent.change(box, { target: { value: good } });
    await user.click(screen.getByRole('button', { name: 'Preview the schedule' }));
    await user.click(await screen.findByRole('button', { name: 'Apply 2 rows' }));
    await waitFor(() =>
      expect(
        fixtureSelects()
          .map((s) => s.value)
          .filter(Boolean),
      ).toEqual(['lavatory-private', 'water-closet-flush-tank-private']),
    );
    expect(world.saves()).toHaveLength(0);
  }, 60_000);

  it('when the file is not text or is over 1 MiB, then it is refused with a message naming it', async () => {
    const world = fakeApi();
    const { user } = await renderWalk(world, href(world));
    await screen.findByRole('heading', { name: 'Building' });
    await user.click(screen.getByText('Fixture schedule: import or export'));
    const input = field('Upload a schedule file');
    fireEvent.change(input, { target: { files: [new File([new Uint8Array([137, 80, 78, 71])], 'plan.png', { type: 'image/png' })] } });
    expect((await screen.findByText(/“plan.png” is not a CSV or text file/)).textContent).toBeTruthy();
    const big = new File(['x'.repeat(SCHEDULE_MAX_BYTES + 1)], 'huge.csv', { type: 'text/csv' });
    fireEvent.change(input, { target: { files: [big] } });
    expect((await screen.findByText(/“huge.csv” is larger than 1 MiB/)).textContent).toBeTruthy();
    expect(screen.queryByTestId('schedule-preview')).toBeNull();
  }, 60_000);

  it('when unit types are exported, then the same import reads every row back to the same fixtures and counts', () => {
    const types: UnitTypeForm[] = [
      {
        id: 'apt',
        name: 'Apartment B',
        rows: [
          {
            key: 'm',
            name: 'manifold',
            from: 'inlet',
            heightAboveFloor: 8,
            fixtureTypeId: '',
            count: 1,
            checked: false,
            material: 'pex-sdr9',
            size: '1',
            length: 10,
            fittings: [],
          },
          {
            key: 'w',
            name: 'wc',
            from: 'm',
            heightAboveFloor: 1,
            fixtureTypeId: 'water-closet-flush-tank-private',
            count: 2,
            checked: false,
            material: 'pex-sdr9',
            size: '1/2',
            length: 12,
            fittings: [],
          },
          {
            key: 's',
            name: 'shower',
            from: 'm',
            heightAboveFloor: 6.5,
            fixtureTypeId: 'shower-private',
            count: 1,
            checked: true,
            material: 'pex-sdr9',
            size: '1/2',
            length: 18,
            fittings: [],
          },
        ],
      },
    ];
    const back = previewSchedule(exportSchedule(types), types);
    expect(back.fileErrors).toEqual([]);
    expect(back.rows.map((r) => [r.unitTypeId, r.fixtureTypeId, r.count, r.heightAboveFloor, r.length, r.size, r.checked, r.error])).toEqual([
      ['apt', 'water-closet-flush-tank-private', 2, 1, 12, '1/2', false, null],
      ['apt', 'shower-private', 1, 6.5, 18, '1/2', true, null],
    ]);
  });

  it('when a branch column is not a number, then that line names it', () => {
    const types: UnitTypeForm[] = [{ id: 'apt', name: 'Apt', rows: [] }];
    const text = 'floor,unit,fixture,count,height,length\ntypical,Apt,lavatory,1,2,fourteen\n';
    expect(previewSchedule(text, types).rows[0].error).toBe('Line 2: length “fourteen” is not a positive number.');
  });
});
