/**
 * The result step's zones table and the zone marks on the pressure profile, through the walk's
 * real routes on the invented demo "Alder & Finch" (a booster and PRVs, so several zones). What
 * the page shows is compared with the engine's own run on the same document, formatted as the
 * screens format it — never with a number written here.
 */
import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { analyzeSystem, ledgerFor } from '../../src/engine';
import { zoneFloorsWords, zoneVerdictWords } from '../../src/shared/format/zoneWords';
import { num, signed } from '../../src/shared/format/quantity';
import { zoneCrossings } from '../../src/features/walk/components/pressure-profile';
import { demoDocument, fakeApi } from './support/fake-api';
import { renderWalk, stepHref } from './support/render-walk';

const doc = demoDocument();
const analysis = analyzeSystem(doc);

describe('the result step: pressure zones', () => {
  it('when the result opens, then each zone of the engine is a row with its feed, floors, pressures, static check and verdict in words', async () => {
    const world = fakeApi();
    await renderWalk(world, stepHref(world, 'result'));
    const table = await screen.findByTestId('zones-table', {}, { timeout: 10_000 });
    const zones = analysis.zones!;
    expect(zones.length).toBeGreaterThan(1);
    expect(within(table).getAllByRole('row').slice(1)).toHaveLength(zones.length);
    for (const z of zones) {
      const row = screen.getByTestId(`zone-${z.index}`);
      const text = row.textContent ?? '';
      expect(text).toContain(z.name);
      expect(text).toContain(zoneFloorsWords(z, analysis.units.elevation));
      if (z.lowestResidual) expect(text).toContain(num(z.lowestResidual.pressure, analysis.units.pressure));
      if (z.highestStatic) expect(screen.getByTestId(`zone-static-${z.index}`).textContent).toContain(num(z.highestStatic.pressure, analysis.units.pressure));
      if (z.criticalFixture) expect(text).toContain(signed(z.criticalFixture.margin, analysis.units.pressure));
      const verdict = screen.getByTestId(`zone-verdict-${z.index}`);
      expect(verdict.textContent).toBe(zoneVerdictWords(z));
      // a zone without a checked fixture is never drawn as a pass
      expect(verdict.querySelector('[data-verdict]')?.getAttribute('data-verdict')).toBe(z.status === 'not-checked' ? 'unknown' : z.status);
    }
    expect(world.unknown).toEqual([]);
  });

  it('when the critical path enters a zone, then the profile chart marks it and names the zone in its text', async () => {
    const world = fakeApi();
    await renderWalk(world, stepHref(world, 'result'));
    const chart = await screen.findByTestId('pressure-chart', {}, { timeout: 10_000 });
    const crossings = zoneCrossings(analysis, ledgerFor(analysis, analysis.criticalFixtureId!));
    expect(crossings.length).toBeGreaterThan(0);
    expect(chart.querySelectorAll('[data-testid="zone-crossing"]')).toHaveLength(crossings.length);
    for (const c of crossings) expect(chart.textContent).toContain(`The path enters ${c.name}`);
  });
});
