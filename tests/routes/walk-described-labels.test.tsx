/**
 * The walk's form rows name the document's keys as its description does (src/engine/model/elements.ts):
 * each row's accessible name is the description's label (with the row it belongs to, where a step
 * repeats it), followed by the unit its range gives in the document's unit system (limits.ts), and
 * the description's help is the control's description (aria-describedby). A step that writes its
 * own label, or a description whose label changes without the screen, fails here.
 */
import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { convertDocumentUnits } from '../../src/engine/building/convertUnits';
import { fieldUnit, type SystemDocument, type UnitSystem } from '../../src/engine';
import type { AnyElement } from '../../src/engine/model/describe';
import {
  BOOST_VARIABLE_SPEED,
  CHECKED_FIXTURE,
  DEVICE,
  DEVICE_LOSS_FIXED,
  EXPANSION_TANK,
  FITTING,
  FIXTURE_GROUP,
  FLOW_TEST,
  NODE,
  PRV,
  RECIRCULATION,
  RECIRCULATION_SEGMENT,
  SOURCE,
  SYSTEM_DOCUMENT,
} from '../../src/engine/model/elements';
import { inSentence } from '../../src/features/walk/lib/described';
import { demoDocument, fakeApi } from './support/fake-api';
import { field, renderWalk, stepHref } from './support/render-walk';

const LOADED = { timeout: 10_000 };

/**
 * What a row shows for a described key: "<label>[ <after>] (<unit>)", or "<row> <short name or label in a
 * sentence> (<unit>)" in a repeated row.
 */
function expected<E extends AnyElement>(
  element: E,
  key: keyof z.output<E['schema']> & string,
  sys: UnitSystem,
  naming: { row?: string; after?: string } = {},
): { label: string; help: string | undefined } {
  const d = element.keys[key];
  const name = naming.row ? `${naming.row} ${inSentence(d.short ?? d.label)}` : naming.after ? `${d.label} ${naming.after}` : d.label;
  const unit = d.range ? fieldUnit(d.range, sys) : '';
  return { label: unit ? `${name} (${unit})` : name, help: d.help };
}

/** The control has the description's label as its accessible name, and its help as its description. */
function expectDescribed(want: { label: string; help: string | undefined }) {
  const control = field(want.label);
  const describedBy = (control.getAttribute('aria-describedby') ?? '').split(' ').filter(Boolean);
  const descriptions = describedBy.map((id) => document.getElementById(id)?.textContent ?? '');
  if (want.help) expect(descriptions, want.label).toContain(want.help);
}

describe('the walk’s rows read their labels, units and help from the document’s description', () => {
  it.each(['US', 'SI'] as const)(
    'when the supply step of the demo in %s units is opened, then each described field is named as the description names it, with its unit and help',
    async (sys) => {
      const demo = demoDocument();
      const doc = (sys === demo.unitSystem ? demo : convertDocumentUnits(demo, sys)) as SystemDocument;
      const world = fakeApi({ document: doc });
      const { user } = await renderWalk(world, stepHref(world, 'supply'));
      await screen.findByTestId('step-supply', {}, LOADED);
      for (const key of ['kind', 'staticPressureLow', 'staticPressureHigh', 'pressureBasis', 'pressureDate'] as const)
        expectDescribed(expected(SOURCE, key, sys));
      expectDescribed(expected(NODE, 'elevation', sys, { after: 'of the connection' }));
      expectDescribed(expected(SYSTEM_DOCUMENT, 'waterTemperature', sys));
      // the units are the document's: psi or kPa, °F or °C
      expect(field(`Static pressure, low (${sys === 'US' ? 'psi' : 'kPa'})`)).toBeTruthy();
      await user.click(screen.getByLabelText('A flow test was made at the connection'));
      for (const key of ['staticPressure', 'residualPressure', 'flow', 'date'] as const) expectDescribed(expected(FLOW_TEST, key, sys));
      expect(world.unknown).toEqual([]);
    },
    120_000,
  );

  it('when the devices step of the demo is opened, then each device’s rows are named with the device and the description’s label', async () => {
    const doc = demoDocument();
    const world = fakeApi();
    await renderWalk(world, stepHref(world, 'devices'));
    await screen.findByTestId('step-devices', {}, LOADED);
    const sys = doc.unitSystem;
    doc.devices.forEach((device, i) => {
      const row = `Device ${i + 1}`;
      expectDescribed(expected(DEVICE, 'label', sys, { row }));
      if (device.loss.kind === 'fixed') expectDescribed(expected(DEVICE_LOSS_FIXED, 'loss', sys, { row }));
      if (device.prv) {
        expectDescribed(expected(PRV, 'setPressure', sys, { row }));
        expectDescribed(expected(PRV, 'falloffPerFlow', sys, { row }));
      }
      if (device.boost && 'control' in device.boost && device.boost.control === 'variable-speed')
        expectDescribed(expected(BOOST_VARIABLE_SPEED, 'setPressure', sys, { row }));
    });
    // the demo has a fixed-loss device, a PRV and a variable-speed booster: each kind of row was checked
    expect(doc.devices.some((d) => d.prv)).toBe(true);
    expect(doc.devices.some((d) => d.boost)).toBe(true);
    expect(world.unknown).toEqual([]);
  }, 120_000);

  it('when the fixtures and fittings steps of the demo are opened, then their repeated rows are named with their row and the description’s label', async () => {
    const doc = demoDocument();
    const sys = doc.unitSystem;
    const world = fakeApi();
    const { router } = await renderWalk(world, stepHref(world, 'fixtures'));
    await screen.findByTestId('step-fixtures', {}, LOADED);
    const node = doc.nodes.find((n) => n.checkedFixtures.length > 0)!;
    const row = `${node.label || node.id}: checked fixture 1`;
    expectDescribed(expected(CHECKED_FIXTURE, 'label', sys, { row }));
    expectDescribed(expected(CHECKED_FIXTURE, 'fixtureTypeId', sys, { row }));
    // the type picker keeps its short name inside the row's ("…: checked fixture 1 type", not "… fixture type")
    expect(field(`${row} type`)).toBeTruthy();
    expectDescribed(expected(CHECKED_FIXTURE, 'minFlowPressure', sys, { row }));

    await router.navigate(stepHref(world, 'fittings'));
    await screen.findByTestId('step-fittings', {}, LOADED);
    const segment = doc.segments.find((s) => s.fittings.length > 0)!;
    expectDescribed(expected(FITTING, 'count', sys, { row: `${segment.label || segment.id}: fitting 1` }));
    expectDescribed(expected(FITTING, 'typeId', sys, { row: `${segment.label || segment.id}: fitting 1` }));
    expect(field(`${segment.label || segment.id}: fitting 1 type`)).toBeTruthy();
    // the fittings table's column headers are the same keys' short names
    const table = screen.getByTestId(`fittings-${segment.id}`).parentElement!;
    const headers = [...table.querySelectorAll('th')].map((th) => th.textContent);
    expect(headers).toEqual(expect.arrayContaining([FITTING.keys.typeId.short, FITTING.keys.count.label]));
    expect(world.unknown).toEqual([]);
  }, 120_000);

  it('when a segment whose end serves fixture groups is opened in the pipe step, then its group rows are named with the row and the description’s short names', async () => {
    const doc = demoDocument();
    const sys = doc.unitSystem;
    const world = fakeApi();
    const { user } = await renderWalk(world, stepHref(world, 'risers'));
    await screen.findByTestId('step-risers', {}, LOADED);
    const segment = doc.segments.find((s) => doc.nodes.find((n) => n.id === s.to)!.fixtureGroups.length > 0)!;
    const node = doc.nodes.find((n) => n.id === segment.to)!;
    await user.click(screen.getByRole('button', { name: `Open ${segment.label || segment.id}` }));
    const row = `${node.label || node.id}: fixture group 1`;
    await screen.findByTestId(`node-fields-${node.id}`, {}, LOADED);
    expectDescribed(expected(FIXTURE_GROUP, 'fixtureTypeId', sys, { row }));
    expectDescribed(expected(FIXTURE_GROUP, 'count', sys, { row }));
    expect(field(`${row} type`)).toBeTruthy();
    expect(world.unknown).toEqual([]);
  }, 120_000);

  it('when the result step of a hot system with an expansion tank and a loop is opened, then their fields are named as the description names them', async () => {
    const demo = demoDocument();
    const sys = demo.unitSystem;
    const hot: SystemDocument = {
      ...demo,
      service: 'hot',
      waterTemperature: 140, // °F: a common stored hot-water temperature (common practice)
      // Inputs of the invented demo, not a design: 80 gal heated, 40/140 °F, 60 psi precharge, 135 psi (150 psi relief less 10 %, common practice).
      expansionTank: { heaterVolume: 80, coldTemperature: 40, hotTemperature: 140, supplyPressure: 60, reliefPressure: 135 },
      recirculation: {
        segments: [
          { id: 'rc-1', from: demo.segments[0].from, to: demo.segments[0].to, length: demo.segments[0].length, material: 'copper-l', size: '1' },
          { id: 'rc-2', from: demo.segments[0].to, to: demo.segments[0].from, length: demo.segments[0].length, material: 'copper-l' },
        ],
        temperatureDrop: 10, // °F: within the 5–20 °F commonly allowed (common practice)
      },
    };
    const world = fakeApi({ document: hot });
    await renderWalk(world, stepHref(world, 'result'));
    await screen.findByTestId('step-result', {}, LOADED);
    for (const key of ['heaterVolume', 'coldTemperature', 'hotTemperature', 'supplyPressure', 'reliefPressure'] as const)
      expectDescribed(expected(EXPANSION_TANK, key, sys));
    for (const key of ['heatLossPerLength', 'temperatureDrop', 'fittingAllowance', 'heaterLoss'] as const) expectDescribed(expected(RECIRCULATION, key, sys));
    for (const key of ['from', 'to', 'length', 'material', 'size', 'heatLoss'] as const)
      expectDescribed(expected(RECIRCULATION_SEGMENT, key, sys, { row: 'Loop pipe 1' }));
    // the leaving temperature's hint names the system's own temperature instead of the help
    expect(field(expected(RECIRCULATION, 'hotTemperature', sys).label)).toBeTruthy();
    // the own quantities' units: gal and Btu/h per ft in US units
    expect(field('Volume of water heated (gal)')).toBeTruthy();
    expect(field('Heat loss per length of pipe (Btu/h per ft)')).toBeTruthy();
    expect(world.unknown).toEqual([]);
  }, 120_000);
});
