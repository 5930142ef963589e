import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import { expect, test } from '@playwright/test';
import type { Page } from '@playwright/test';
import { analyzeSystem, sizingBasisState, sizingBasisText, SystemDocumentSchema } from '../src/engine';
import { zoneVerdictWords } from '../src/shared/format/zoneWords';
import { DEMO, signIn } from './helpers';
import {
  addZones,
  createProject,
  createSystem,
  EntryCounter,
  enterBuilding,
  enterUndersizedLift,
  generate,
  INVENTED_BACKFLOW_POINTS,
  INVENTED_METER_POINTS,
  issueThroughUi,
  waitSaved,
} from './building-entry';
import { withUnit } from '../src/shared/format/quantity';

// Designing, not only checking, through the UI in fresh projects (invented "Wrenmoor" names and
// figures): a system sized by Headroom and applied, whose basis the result step and the issued
// summary state; a hot system fed from that cold system; and a tall building entered with the
// riser builder in a PRV zone and a supply zone, whose summary lists the zones. Every expected
// figure comes from the engine run here on what the server stored; every wait is on a state.

const run = Date.now().toString(36);
const OUT = 'e2e-output/design';
const step = (page: Page, name: string) => page.getByRole('navigation', { name: 'Steps of the walk' }).getByRole('link', { name });

let pageProblems: string[] = [];
test.beforeEach(({ page }) => {
  pageProblems = [];
  page.on('pageerror', (error) => pageProblems.push(`uncaught: ${error.message}`));
});
test.afterEach(() => expect(pageProblems).toEqual([]));

/** The revision's API address, from the walk's address on screen. */
const revisionApi = (page: Page) =>
  `/api${new URL(page.url()).pathname.replace(/\/(supply|devices|risers|fittings|elevation|fixtures|result|table|diagram|building)$/, '')}`;

async function storedDocument(page: Page) {
  const response = await page.request.get(revisionApi(page));
  expect(response.ok()).toBe(true);
  const { revision } = (await response.json()) as { revision: { document: unknown } };
  return SystemDocumentSchema.parse(revision.document);
}

/** The issued summary's text (poppler-utils' pdftotext), with its line breaks folded into spaces. */
async function summaryText(page: Page, name: string): Promise<string> {
  const url = `${revisionApi(page)}/summary.pdf`;
  await expect.poll(async () => (await page.request.get(url)).status(), { timeout: 60_000 }).toBe(200);
  const bytes = await (await page.request.get(url)).body();
  fs.mkdirSync(OUT, { recursive: true });
  const file = `${OUT}/${name}.pdf`;
  fs.writeFileSync(file, bytes);
  return execFileSync('pdftotext', [file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
}

test('when a designer sizes a system and applies it, then the result and the issued summary state the sizing basis, and a hot system fed from it reads its pressure', async ({
  page,
}) => {
  test.slow();
  await signIn(page, DEMO.designer);
  await createProject(page, `Kiln Row laundry ${run}`, '5 Kiln Row, Wrenmoor');
  const coldName = `Laundry cold ${run}`;
  await createSystem(page, coldName, 'cold');
  await enterUndersizedLift(page);

  // Before any sizing, the sizes are the designer's.
  await step(page, 'Result').click();
  await expect(page.getByTestId('sizing-basis')).toContainText('Sizes as entered by the designer');

  // Size and apply: the basis is recorded in the draft and stated on the result step.
  await page.getByRole('button', { name: 'Size the pipes' }).click();
  await expect(page.getByTestId('sizing-answer')).toHaveAttribute('data-feasible', 'yes');
  await page.getByRole('button', { name: 'Apply to draft' }).click();
  await expect(page.getByTestId('sizing-applied')).toBeVisible();
  await waitSaved(page);
  const sized = await storedDocument(page);
  expect(sizingBasisState(sized)).toMatchObject({ kind: 'sized', edited: false });
  await expect(page.getByTestId('sizing-basis')).toContainText(sizingBasisText(sized));
  await expect(page.getByTestId('sizing-basis')).toContainText('for the whole system');

  // Issue it: the summary says how the sizes were chosen, in the same words.
  await issueThroughUi(page, 'Sized by Headroom (demo)');
  const text = await summaryText(page, 'sized-summary');
  expect(text).toContain(sizingBasisText(sized));

  // A hot system fed from this cold system at its building entry: its supply is the cold system's pressure there.
  const truth = analyzeSystem(sized);
  const entry = truth.nodes.find((n) => n.label === 'Building entry')!;
  await page.goto(new URL(page.url()).pathname.replace(/\/systems\/.*$/, ''));
  await createSystem(page, `Laundry hot ${run}`, 'hot');
  await page.getByLabel('Cold-water system feeding the heater').selectOption({ label: coldName });
  await page.getByLabel('Node of the cold system that feeds the heater').selectOption({ label: 'Building entry' });
  await expect(page.getByTestId('fed-from-supply')).toContainText(`Fed from ${coldName} at Building entry`);
  await expect(page.getByTestId('fed-from-pressure')).toHaveText(withUnit(entry.pressure, 'psi'));
  await waitSaved(page);
  const hot = await storedDocument(page);
  expect(hot.source.fedFrom?.resolution).toMatchObject({ status: 'resolved', systemName: coldName, nodeLabel: 'Building entry' });
});

test('when a tall building is entered with the riser builder in a PRV zone and a supply zone, then the result and the issued summary show each zone', async ({
  page,
}) => {
  test.setTimeout(300_000);
  await signIn(page, DEMO.designer);
  const c = new EntryCounter();
  await enterBuilding(page, c, `Kestrel House ${run}`, {
    storeys: 12,
    staticLow: '98',
    staticHigh: '102',
    connectionElevation: '-5',
    meterPoints: INVENTED_METER_POINTS,
    backflowPoints: INVENTED_BACKFLOW_POINTS,
  });
  // Level 1–4 through a PRV set at 65 psi, Level 5–12 straight from the high-pressure main (invented)
  await addZones(page, c, [
    { toFloor: 'Level 4', feed: 'prv', setPressure: '65' },
    { toFloor: 'Level 12', feed: 'supply' },
  ]);
  await generate(page, c);

  await step(page, 'Result').click();
  await expect(page.getByTestId('zones-table')).toBeVisible({ timeout: 60_000 });
  await waitSaved(page);
  const truth = analyzeSystem(await storedDocument(page));
  const zones = truth.zones!;
  expect(zones.length).toBeGreaterThanOrEqual(2);
  expect(zones.some((z) => z.feed.kind === 'prv' && z.name.includes('set 65 psi'))).toBe(true);
  for (const z of zones) await expect(page.getByTestId(`zone-verdict-${z.index}`)).toHaveText(zoneVerdictWords(z));

  await issueThroughUi(page, 'Zoning check (demo)');
  const text = await summaryText(page, 'zoned-summary');
  // the zones section names each zone and the PRV's set pressure (a long name may wrap after its dash)
  expect(text).toContain('Pressure zones');
  for (const z of zones) expect(text).toContain(`Zone ${z.index}`);
  expect(text).toContain('set 65 psi');
  expect(text).toContain('Sizes as entered by the designer');
});
