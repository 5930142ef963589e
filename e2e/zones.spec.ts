import { expect, test } from '@playwright/test';
import type { Page } from '@playwright/test';
import { analyzeSystem, SystemDocumentSchema } from '../src/engine';
import { zoneVerdictWords } from '../src/shared/format/zoneWords';
import { DEMO, signIn } from './helpers';
import { addZones, EntryCounter, enterBuilding, generate, INVENTED_BACKFLOW_POINTS, INVENTED_METER_POINTS, screenshotDir, waitSaved } from './building-entry';

// A zoned tall building entered on the building page from a new project: floors 1–3 straight from
// the supply, floors 4–12 through a booster pump at the base (invented figures). After Generate
// the result shows each zone's verdict as the engine gives it for the stored draft, and the riser
// diagram marks the zone boundary in words. Every wait is on a state of the page.

const run = Date.now().toString(36);

let pageProblems: string[] = [];
test.beforeEach(({ page }) => {
  pageProblems = [];
  page.on('pageerror', (error) => pageProblems.push(`uncaught: ${error.message}`));
});
test.afterEach(() => expect(pageProblems).toEqual([]));

async function storedDocument(page: Page) {
  const path = new URL(page.url()).pathname.replace(/\/(supply|devices|risers|fittings|elevation|fixtures|result|table|diagram|building)$/, '');
  const response = await page.request.get(`/api${path}`);
  expect(response.ok()).toBe(true);
  const { revision } = (await response.json()) as { revision: { document: unknown } };
  return SystemDocumentSchema.parse(revision.document);
}

test('when a 12-storey building is entered with a supply zone and a booster zone, then the result shows each zone’s verdict and the riser diagram marks the boundary', async ({
  page,
}) => {
  test.setTimeout(300_000);
  await signIn(page, DEMO.designer);
  const c = new EntryCounter();
  await enterBuilding(page, c, `Heron Court zones ${run}`, {
    storeys: 12,
    staticLow: '60',
    staticHigh: '72',
    connectionElevation: '-5',
    meterPoints: INVENTED_METER_POINTS,
    backflowPoints: INVENTED_BACKFLOW_POINTS,
  });

  // the zones: Level 1–3 from the supply, Level 4–12 through a variable-speed booster holding 95 psi
  await addZones(page, c, [
    { toFloor: 'Level 3', feed: 'supply' },
    { toFloor: 'Level 12', feed: 'booster-pump', setPressure: '95' },
  ]);
  await expect(page.getByLabel('Zone 2 from floor')).toHaveValue('Level 4');
  await expect(page.getByTestId('preview-placements')).toHaveText(String(12 * 4));
  await generate(page, c);

  // the result: one row per zone, each verdict in the engine's words for what was stored
  await c.click(page.getByRole('navigation', { name: 'Steps of the walk' }).getByRole('link', { name: 'Result' }));
  const table = page.getByTestId('zones-table');
  await expect(table).toBeVisible({ timeout: 60_000 });
  await waitSaved(page);
  const truth = analyzeSystem(await storedDocument(page));
  const zones = truth.zones!;
  expect(zones.map((z) => z.name)).toEqual(['Zone 1 — from the supply', 'Zone 2 — Booster pump for Level 4–Level 12 (set 95 psi)']);
  for (const z of zones) {
    await expect(page.getByTestId(`zone-${z.index}`)).toContainText(z.name);
    await expect(page.getByTestId(`zone-verdict-${z.index}`)).toHaveText(zoneVerdictWords(z));
    await expect(page.getByTestId(`zone-verdict-${z.index}`).locator('[data-verdict]')).toHaveAttribute(
      'data-verdict',
      z.status === 'not-checked' ? 'unknown' : z.status,
    );
  }
  console.log(`zones: ${zones.map((z) => `${z.name}: ${zoneVerdictWords(z)}`).join(' | ')}`);
  await table.screenshot({ path: `${screenshotDir()}/zones-table.png` });

  // the riser diagram: the boundary drawn with its words, and listed in the key
  await page.goto(new URL(page.url()).pathname.replace(/\/result$/, '/diagram'));
  const svg = page.getByTestId('riser-diagram');
  await expect(svg).toBeVisible({ timeout: 60_000 });
  await expect(svg).toContainText('Zone 2 starts');
  await expect(page.getByTestId('riser-zones')).toContainText('Zone 2 — Booster pump for Level 4–Level 12 (set 95 psi)');
  await page.screenshot({ path: `${screenshotDir()}/zones-riser-diagram.png`, fullPage: true });
});
