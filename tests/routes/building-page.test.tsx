/**
 * The building page under a draft revision, through the walk's real routes against the fake API:
 * the demo's named floors listed, floors added above them at a typical height, a unit type defined once, the riser builder's short form, the
 * preview's counts (against the engine's own riser builder run here on the same inputs), one
 * Generate that names what it replaces and is undone in one step, and the saved draft analysed
 * by the engine. Inputs are invented.
 */
import { screen, waitFor } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { SystemDocument } from '../../src/engine';
import { analyzeSystem, nodeElevations } from '../../src/engine';
import { buildRiser, floorsFromTable } from '../../src/engine/building/riserBuilder';
import type { UnitType } from '../../src/engine/building/schema';
import { AUTOSAVE_DELAY_MS } from '../../src/features/walk/draft/use-draft';
import { num } from '../../src/shared/format/quantity';
import { UNIT_LABELS } from '../../src/engine';
import { buildingPaths } from '../../src/features/building/paths';
import { demoDocument, fakeApi } from './support/fake-api';
import type { FakeApi } from './support/fake-api';
import { field, renderWalk } from './support/render-walk';

const SAVE_WAIT = { timeout: AUTOSAVE_DELAY_MS + 8_000 };
const demo = demoDocument();
const start = demo.segments[0].to;
const href = (world: FakeApi) => buildingPaths.building.getHref(world.ids.projectId, world.ids.systemId, world.ids.revisionId);
const lastSaved = (world: FakeApi) => (world.saves().at(-1)!.body as { document: SystemDocument }).document;

/** The unit the test types, as the engine's building module writes it. */
const TYPE: UnitType = {
  id: 'unit-a',
  name: 'Apartment A',
  nodes: [
    { id: 'unit-manifold', label: 'unit manifold', heightAboveFloor: 0, fixtureGroups: [], checkedFixtures: [] },
    {
      id: 'shower',
      label: 'shower',
      heightAboveFloor: 6.5,
      fixtureGroups: [{ fixtureTypeId: 'shower-private', count: 1 }],
      checkedFixtures: [{ id: 'shower', fixtureTypeId: 'shower-private' }],
    },
  ],
  segments: [
    { id: 'branch', from: 'inlet', to: 'unit-manifold', material: 'pex-sdr9', size: '1', length: 10, fittings: [] },
    { id: 'to-shower', from: 'unit-manifold', to: 'shower', material: 'pex-sdr9', size: '1/2', length: 18, fittings: [] },
  ],
};

async function enterBuilding(user: Awaited<ReturnType<typeof renderWalk>>['user']) {
  // two storeys above the demo's roof, 10 ft apart (invented)
  await user.clear(field('Typical floor-to-floor height (ft)'));
  await user.type(field('Typical floor-to-floor height (ft)'), '10');
  await user.type(field('Floors to add'), '2');
  await user.click(screen.getByRole('button', { name: 'Add floors' }));
  await user.clear(field('Unit type 1 name'));
  await user.type(field('Unit type 1 name'), 'Apartment A');
  await user.selectOptions(field('Apartment A, unit manifold material'), 'pex-sdr9');
  await user.selectOptions(field('Apartment A, unit manifold size'), '1');
  await user.type(field('Apartment A, unit manifold length'), '10');
  await user.click(screen.getByRole('button', { name: 'Add a point to Apartment A' }));
  await user.selectOptions(field('Apartment A, point 2 fixture'), 'shower-private');
  await user.clear(field(`Apartment A point 2 name`));
  await user.type(field(`Apartment A point 2 name`), 'shower');
  await user.clear(field('Apartment A, shower height above floor'));
  await user.type(field('Apartment A, shower height above floor'), '6.5');
  await user.selectOptions(field('Apartment A, shower size'), '1/2');
  await user.type(field('Apartment A, shower length'), '18');
  await user.click(field('Check Apartment A, shower'));
  await user.selectOptions(field('Riser starts at'), start);
  await user.selectOptions(field('Riser material'), 'copper-l');
  await user.selectOptions(field('Riser size'), '2');
  await user.selectOptions(field('Floor main material'), 'copper-l');
  await user.selectOptions(field('Floor main size'), '1-1/4');
  await user.type(field('Position 1 main length'), '8');
}

describe('the building page', () => {
  it('when a building is entered, then the preview counts what the engine builds, Generate names what it replaces, and one Undo restores the draft', async () => {
    const world = fakeApi();
    const { user } = await renderWalk(world, href(world));
    await screen.findByRole('heading', { name: 'Building' });
    await enterBuilding(user);
    // the starting fittings are removed so the unit is TYPE exactly
    const removeFitting = (point: string) => document.querySelector<HTMLElement>(`[aria-label="Remove Apartment A, ${point} fitting 1"]`);
    for (const point of ['unit manifold', 'shower']) {
      for (let el = removeFitting(point); el; el = removeFitting(point)) await user.click(el);
    }

    // the demo's own floors, then the two added above them
    const floors = floorsFromTable([...demo.floors.map((f) => ({ name: f.name, elevation: f.elevation })), { name: 'Level 9' }, { name: 'Level 10' }], 10);
    const expected = buildRiser({
      floors,
      startNodeId: start,
      startElevation: nodeElevations(demo).get(start)!,
      riser: { material: 'copper-l', sizes: [{ fromFloor: floors[0].id, size: '2' }], fromFloor: floors[0].id, toFloor: floors.at(-1)!.id, footLength: 0 },
      floorMain: { material: 'copper-l', size: '1-1/4', heightAboveFloor: 0 },
      units: [{ unitTypeId: TYPE.id, labelPattern: 'Unit {floor}-{n}', mainLength: 8 }],
      unitTypes: [TYPE],
    });
    const segments = expected.segments.length + expected.placements.length * TYPE.segments.length;
    await waitFor(() => expect(screen.getByTestId('preview-segments').textContent).toBe(String(segments)));
    expect(screen.getByTestId('preview-nodes').textContent).toBe(String(expected.nodes.length + expected.placements.length * TYPE.nodes.length));
    expect(screen.getByTestId('preview-checked').textContent).toBe(String(expected.placements.length));

    await user.click(screen.getByRole('button', { name: 'Generate into draft' }));
    // the start point has the demo's tree after it: the confirmation names it, nothing is written yet
    const list = await screen.findByTestId('replace-list');
    expect(list.textContent).toContain(demo.segments[1].label ?? demo.segments[1].id);
    await user.click(screen.getByRole('button', { name: 'Replace them' }));
    await screen.findByTestId('generated');

    await waitFor(() => expect(world.saves().length).toBeGreaterThan(0), SAVE_WAIT);
    const saved = lastSaved(world);
    const analysis = analyzeSystem(saved);
    const checkedIds = expected.placements.map((p) => `${p.id}.shower`).sort();
    expect(analysis.fixtures.map((f) => f.id).sort()).toEqual(checkedIds);
    // the top floor's shower has the least margin: the highest, farthest
    expect(analysis.criticalFixtureId).toBe(`${expected.placements.at(-1)!.id}.shower`);
    expect(saved.segments.some((s) => s.id === demo.segments[1].id)).toBe(false);
    // the demo's floors are kept, not doubled: the draft has each floor once, the two new ones on top
    expect(saved.floors.map((f) => [f.id, f.name, f.elevation])).toEqual(floors.map((f) => [f.id, f.name, f.elevation]));

    const before = world.saves().length;
    await user.click(screen.getByRole('button', { name: 'Undo generate' }));
    await waitFor(() => expect(world.saves().length).toBeGreaterThan(before), SAVE_WAIT);
    expect(lastSaved(world)).toEqual(demo);
  }, 90_000);

  it('when the demo’s draft is opened, then the floors table lists its named floors from the lowest up with their elevations', async () => {
    const world = fakeApi();
    await renderWalk(world, href(world));
    await screen.findByRole('heading', { name: 'Building' });
    const floors = [...demo.floors].sort((a, b) => a.elevation - b.elevation);
    // the demo building: Level 1 to Level 7 and the roof (invented scenario)
    expect(floors).toHaveLength(8);
    floors.forEach((f, i) => {
      expect(field(`Floor ${i + 1} name`).value).toBe(f.name);
      expect(field(`Floor ${i + 1} elevation`).value).toBe(String(f.elevation));
      expect(screen.getByTestId(`floor-elevation-${i}`).textContent).toBe(num(f.elevation, UNIT_LABELS[demo.unitSystem].elevation));
    });
    expect(document.querySelector('[aria-label="Floor 9 name"]')).toBeNull();
    // the typical height is the storey most of its floors share, so a floor added above takes it
    const steps = floors.slice(1).map((f, i) => f.elevation - floors[i].elevation);
    const typical = Number(field('Typical floor-to-floor height (ft)').value);
    expect(steps.filter((h) => h === typical).length).toBeGreaterThan(steps.length / 2);
    // nothing is written by opening the page
    expect(world.saves()).toHaveLength(0);
  }, 60_000);

  it('when a floor is not above the one below, then its row says so and nothing is generated', async () => {
    const world = fakeApi();
    const { user } = await renderWalk(world, href(world));
    await screen.findByRole('heading', { name: 'Building' });
    // the demo's Level 2 moved below Level 1
    await user.clear(field('Floor 2 elevation'));
    await user.type(field('Floor 2 elevation'), '-3');
    expect(await screen.findByText(/Not above Level 1/)).toBeTruthy();
    await user.click(screen.getByRole('button', { name: 'Generate into draft' }));
    expect(screen.queryByTestId('generated')).toBeNull();
    expect(screen.queryByTestId('replace-list')).toBeNull();
    expect(world.saves()).toHaveLength(0);
  }, 60_000);
});
