import fs from 'node:fs';
import Papa from 'papaparse';
import { expect, test } from '@playwright/test';
import type { Page } from '@playwright/test';
import { analyzeSystem, SystemDocumentSchema, type SystemDocument } from '../src/engine';
import { UNIT_INLET } from '../src/engine/model/schema';
import { num } from '../src/shared/format/quantity';
import { DEMO, signIn } from './helpers';
import { createProject, createSystem, screenshotDir, waitSaved } from './building-entry';

// Typical units as a designer uses them, from an empty project: the fixtures of a unit type come
// from a pasted schedule in the trade's words (a wrong line is named and nothing is applied), the
// building is generated from it, the schedule is exported in the same words, and an edit of the
// type reaches every placement while a placement's own override stays and says so.
// Every input is invented demo data. Each test makes its own project; every wait is on a state.

const run = Date.now().toString(36);
const step = (page: Page, name: string) => page.getByRole('navigation', { name: 'Steps of the walk' }).getByRole('link', { name });
const SHOWER = 'shower-private';

let pageProblems: string[] = [];
test.beforeEach(({ page }) => {
  pageProblems = [];
  page.on('pageerror', (error) => pageProblems.push(`uncaught: ${error.message}`));
});
test.afterEach(() => expect(pageProblems).toEqual([]));

async function storedDocument(page: Page): Promise<SystemDocument> {
  const path = new URL(page.url()).pathname.replace(/\/(supply|devices|risers|fittings|elevation|fixtures|result|table|diagram|building)$/, '');
  const response = await page.request.get(`/api${path}`);
  expect(response.ok()).toBe(true);
  const { revision } = (await response.json()) as { revision: { document: unknown } };
  return SystemDocumentSchema.parse(revision.document);
}

/** The schedule a designer pastes: the typical apartment's fixtures, one line a fixture Headroom does not know. */
const scheduleWith = (fourth: string) =>
  [
    'floor,unit,fixture,count,occupancy,height,length,size,check',
    'typical,Apartment A,"water closet, flush tank",1,private,0,8,1/2,no',
    'typical,Apartment A,lavatory,1,private,0,8,1/2,no',
    'typical,Apartment A,shower,1,private,6.5,12,1/2,yes',
    `typical,Apartment A,${fourth},1,private,0,8,1/2,no`,
  ].join('\n');

/**
 * From a new project: supply, the service pipe, three floors 10 ft apart, "Apartment A" with its
 * branch, its fixtures from a schedule (first refused, then corrected), a riser with two apartments
 * per floor (the second on a longer branch, an override), and Generate.
 */
async function enterThreeStoreys(page: Page, name: string): Promise<void> {
  await signIn(page, DEMO.designer);
  await createProject(page, name, '3 Tern Court, Wrenmoor (invented)');
  await createSystem(page, 'Domestic cold water', 'cold');
  await page.getByLabel(/Elevation of the connection/).fill('-5');
  await page.getByLabel(/Static pressure, low/).fill('70');
  await page.getByLabel(/Static pressure, high/).fill('78');
  await page.getByLabel('Where the pressure figures came from').fill('Utility pressure letter (invented demo figure)');
  await step(page, 'Meter & devices').click();
  await page.getByRole('button', { name: /Add the service pipe/ }).click();
  await step(page, 'Risers').click();
  const service = page.getByTestId('segment-service-1');
  await service.getByLabel('Service pipe material').selectOption('copper-k');
  await service.getByLabel('Service pipe size').selectOption('2');
  await service.getByLabel('Service pipe length (ft)').fill('40');
  await service.getByLabel('Service pipe rise (ft)').fill('5');
  await waitSaved(page);

  await page.getByRole('link', { name: /Build from floors/ }).click();
  await expect(page.getByTestId('building-page')).toBeVisible();
  await page.getByLabel(/Typical floor-to-floor height/).fill('10');
  await page.getByLabel('Floors to add').fill('2');
  await page.getByRole('button', { name: 'Add floors' }).click();
  await expect(page.getByTestId('floor-elevation-2')).toHaveText(num(20, 'ft'));
  const type = page.getByTestId('unit-type-0');
  await type.getByLabel('Unit type 1 name').fill('Apartment A');
  await type.getByLabel('Apartment A, unit manifold material').selectOption('pex-sdr9');
  await type.getByLabel('Apartment A, unit manifold size').selectOption('1');
  await type.getByLabel('Apartment A, unit manifold length').fill('10');

  // the schedule, pasted with a fixture Headroom does not know on line 5
  await page.getByText('Fixture schedule: import or export').click();
  const box = page.getByLabel('Paste a schedule (CSV or a spreadsheet range)');
  await box.fill(scheduleWith('hot tub jet'));
  await page.getByRole('button', { name: 'Preview the schedule' }).click();
  const preview = page.getByTestId('schedule-preview');
  await expect(preview.getByTestId('schedule-line-5')).toContainText('Line 5');
  await expect(preview.getByTestId('schedule-line-5')).toContainText('hot tub jet');
  await expect(preview.getByTestId('schedule-line-4')).toContainText('✓');
  await expect(preview.getByRole('button', { name: /^Apply/ })).toBeDisabled();
  await page.screenshot({ path: `${screenshotDir()}/schedule-error-row.png`, fullPage: false });
  // nothing applied: the unit type still has only its branch from the main (a point with no fixture)
  await expect(type.getByLabel(/^Apartment A, .* fixture$/)).toHaveCount(1);

  // corrected, previewed again, applied
  await box.fill(scheduleWith('kitchen sink'));
  await page.getByRole('button', { name: 'Preview the schedule' }).click();
  await expect(preview.getByTestId('schedule-line-5')).toContainText('✓');
  await preview.getByRole('button', { name: 'Apply 4 rows' }).click();
  await expect(page.getByText('4 schedule rows applied to the unit types.')).toBeVisible();
  await expect(type.getByLabel(/^Apartment A, .* fixture$/)).toHaveCount(5);
  await expect(type.getByLabel('Apartment A, shower fixture', { exact: true })).toHaveValue('shower-private');

  await page.getByLabel('Riser material').selectOption('copper-l');
  await page.getByLabel('Riser size').selectOption('1-1/2');
  await page.getByLabel(/Run to the foot of the riser/).fill('15');
  await page.getByLabel('Floor main size').selectOption('1-1/4');
  await page.getByLabel('Position 1 main length').fill('10');
  await page.getByRole('button', { name: 'Add a unit position' }).click();
  await page.getByLabel('Position 2 branch length').fill('25');
  await expect(page.getByTestId('preview-placements')).toHaveText('6');
  await page.getByRole('button', { name: 'Generate into draft' }).click();
  await expect(page.getByText(/^Generated \d+ segments/)).toBeVisible({ timeout: 60_000 });
  await expect(page.getByTestId('verdict-bar')).toHaveAttribute('data-status', /^(pass|fail)$/, { timeout: 60_000 });
  await waitSaved(page);
}

/** The residual pressure (document units) of each placement's checked shower, by placement id. */
function showerResiduals(doc: SystemDocument): Map<string, number> {
  const analysis = analyzeSystem(doc);
  const out = new Map<string, number>();
  for (const p of doc.placements ?? []) {
    const f = analysis.fixtures.find((x) => x.id.startsWith(`${p.id}.`) && x.fixtureTypeId === SHOWER);
    if (f) out.set(p.id, f.residual);
  }
  return out;
}

test('when a pasted fixture schedule names a fixture Headroom does not know, then its line is named and nothing is applied; corrected, it builds the units and exports in the same words', async ({
  page,
}) => {
  test.setTimeout(240_000);
  await enterThreeStoreys(page, `Tern Court schedule ${run}`);

  const doc = await storedDocument(page);
  const [type] = doc.unitTypes ?? [];
  expect(type.name).toBe('Apartment A');
  const fixtures = type.nodes.flatMap((n) => n.fixtureGroups.map((g) => [g.fixtureTypeId, g.count]));
  expect(fixtures.sort()).toEqual(
    [
      ['kitchen-sink-private', 1],
      ['lavatory-private', 1],
      [SHOWER, 1],
      ['water-closet-flush-tank-private', 1],
    ].sort(),
  );
  expect(doc.placements).toHaveLength(6);
  // "check: yes" on the shower line: every apartment's shower is a checked fixture
  expect(showerResiduals(doc).size).toBe(6);

  // the export: the same columns and words the import reads, and read back without an error
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Export the unit types’ schedule' }).click()]);
  const exported = fs.readFileSync((await download.path())!, 'utf8');
  const rows = Papa.parse<Record<string, string>>(exported, { header: true, skipEmptyLines: true }).data;
  expect(rows.map((r) => [r.floor, r.unit, r.count]).every(([f, u, c]) => f === 'typical' && u === 'Apartment A' && c === '1')).toBe(true);
  expect(rows.find((r) => /shower/i.test(r.fixture))).toMatchObject({ height: '6.5', length: '12', check: 'yes' });
  await page.getByLabel('Paste a schedule (CSV or a spreadsheet range)').fill(exported);
  await page.getByRole('button', { name: 'Preview the schedule' }).click();
  await expect(page.getByTestId('schedule-preview')).toContainText(`${rows.length} rows ready.`);
});

test('when a unit type’s shower branch and its branch from the main are lengthened, then every placement follows except where a placement overrides the length, which it shows', async ({
  page,
}) => {
  test.setTimeout(240_000);
  await enterThreeStoreys(page, `Tern Court types ${run}`);
  const before = await storedDocument(page);
  const residualsBefore = showerResiduals(before);
  const overridden = (before.placements ?? []).filter((p) => Object.keys(p.overrides?.segments ?? {}).length > 0);
  expect(overridden.length).toBe(3); // the second apartment of each floor, on its 25 ft branch

  const type = page.getByTestId('unit-type-0');
  await type.getByLabel('Apartment A, shower length', { exact: true }).fill('30');
  await type.getByLabel('Apartment A, unit manifold length').fill('14');
  await page.getByRole('button', { name: 'Apply unit types to every placement' }).click();
  await expect(page.getByText('Unit types applied to 6 placements.')).toBeVisible();
  await waitSaved(page);

  const after = await storedDocument(page);
  const residualsAfter = showerResiduals(after);
  // the type's longer shower branch lowers every apartment's shower pressure, on every floor
  expect(residualsAfter.size).toBe(6);
  for (const [id, r] of residualsBefore) expect(residualsAfter.get(id)!).toBeLessThan(r);
  // the override is kept as data and on screen; the other placements read the type's new length
  const manifold = after.unitTypes![0].segments.find((s) => s.from === UNIT_INLET)!;
  expect(manifold.length).toBe(14);
  for (const p of after.placements!.filter((x) => overridden.some((o) => o.id === x.id))) {
    expect(p.overrides?.segments?.[manifold.id]?.length).toBe(25);
    await expect(page.getByTestId(`placement-${p.id}`)).toContainText('override');
  }
  const plain = after.placements!.find((x) => !overridden.some((o) => o.id === x.id))!;
  await expect(page.getByTestId(`placement-${plain.id}`)).toContainText('as its type');
  // the page itself never scrolls sideways: the unit type's wide table scrolls inside its own box
  const sideways = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
  expect(sideways).toBeLessThanOrEqual(0);
  await page.screenshot({ path: `${screenshotDir()}/type-edit-placements.png`, fullPage: false });
});
