import fs from 'node:fs';
import { expect, test } from '@playwright/test';
import type { Page } from '@playwright/test';
import { analyzeSystem, nodeElevations, SystemDocumentSchema, verdictStatus } from '../src/engine';
import { signed } from '../src/shared/format/quantity';
import { DEMO, DEMO_PROJECT, openProject, signIn } from './helpers';
import { createSystem } from './building-entry';

// A new user, step by step in the order the screens suggest, on invented buildings (the numbers
// typed are invented inputs). Each test makes its own system, so none depends on another; every
// wait is on a state of the page, never a fixed time.

const run = Date.now().toString(36);

async function shot(page: Page, name: string) {
  fs.mkdirSync('e2e-output/new-user', { recursive: true });
  await page.screenshot({ path: `e2e-output/new-user/${name}.png`, fullPage: false });
}

const step = (page: Page, name: string) => page.getByRole('navigation', { name: 'Steps of the walk' }).getByRole('link', { name });
const bar = (page: Page) => page.getByTestId('verdict-bar');

let pageProblems: string[] = [];
test.beforeEach(({ page }) => {
  pageProblems = [];
  page.on('pageerror', (error) => pageProblems.push(`uncaught: ${error.message}`));
});
test.afterEach(() => expect(pageProblems).toEqual([]));

/** Signs in as the demo designer and creates an empty cold-water system; lands on its supply step. */
async function newSystem(page: Page, name: string) {
  await signIn(page, DEMO.designer);
  await openProject(page, DEMO_PROJECT);
  await createSystem(page, `${name} ${run}`, 'cold');
  await expect(page).toHaveURL(/\/revisions\/[^/]+\/supply$/);
}

/** The revision's document as the server stored it (the API address of the page's revision). */
async function storedDocument(page: Page) {
  const path = new URL(page.url()).pathname.replace(/\/(supply|devices|risers|fittings|elevation|fixtures|result|table|diagram)$/, '');
  const response = await page.request.get(`/api${path}`);
  expect(response.ok()).toBe(true);
  const { revision } = (await response.json()) as { revision: { document: unknown } };
  return SystemDocumentSchema.parse(revision.document);
}

async function waitSaved(page: Page) {
  await expect(page.getByTestId('save-state')).toHaveAttribute('data-state', 'saved');
  await expect(page.getByTestId('save-state')).toHaveAttribute('data-held', '0');
}

test('when a new user enters a 4-storey building with the rises typed at the pipe step and never opens the elevation step, then the result is the true one: fail, never green', async ({
  page,
}) => {
  await newSystem(page, 'Four storeys');

  // 1. Supply
  await page.getByLabel(/Static pressure, low/).fill('35');
  await page.getByLabel(/Static pressure, high/).fill('45');
  await page.getByLabel('Where the pressure figures came from').fill('Wrenmoor Water Department letter (invented demo figure)');

  // 2. Meter & devices: the service pipe
  await step(page, 'Meter & devices').click();
  await page.getByRole('button', { name: /Add the service pipe/ }).click();

  // 3. Risers: the service, three riser lifts of 12 ft, a branch to the top-floor apartment
  await step(page, 'Risers').click();
  const service = page.getByTestId('segment-service-1');
  await service.getByLabel('Service pipe material').selectOption('copper-l');
  await service.getByLabel('Service pipe size').selectOption('1');
  await service.getByLabel('Service pipe length (ft)').fill('30');
  await service.getByLabel('Service pipe rise (ft)').fill('0');
  let from = 'Building entry';
  for (const [i, level] of [
    [1, 'Level 2'],
    [2, 'Level 3'],
    [3, 'Level 4'],
  ] as const) {
    await page.getByRole('button', { name: `Add a segment from ${from}` }).click();
    const card = page.getByTestId(`segment-seg-${i}`);
    await card.getByLabel(`seg-${i} length (ft)`).fill('12');
    await card.getByLabel(`seg-${i} rise (ft)`).fill('12');
    await card.getByLabel(`Name of node node-${i}`).fill(level);
    from = level;
  }
  await page.getByRole('button', { name: 'Add a segment from Level 4' }).click();
  const branch = page.getByTestId('segment-seg-4');
  await branch.getByLabel('seg-4 length (ft)').fill('25');
  await branch.getByLabel('seg-4 rise (ft)').fill('0');
  await branch.getByLabel('Name of node node-4').fill('Apartment 401');
  await page.getByRole('button', { name: 'Add fixtures at Apartment 401' }).click();
  await page.getByLabel('Apartment 401: fixture group 1 type').selectOption('shower-private');
  await page.getByLabel('Apartment 401: fixture group 1 count').fill('2');
  await shot(page, 'four-storeys-risers');

  // 4. Fittings: looked at, nothing added. 5. Elevation: never opened.
  await step(page, 'Fittings').click();
  await expect(page.getByRole('heading', { level: 2, name: 'Fittings' })).toBeVisible();

  // 6. Remote fixture
  await step(page, 'Remote fixture').click();
  await page.getByRole('button', { name: 'Check a fixture at Apartment 401' }).click();
  await page.getByLabel('Apartment 401: checked fixture 1 type').selectOption('shower-private');
  await page.getByLabel('Apartment 401: checked fixture 1 name').fill('Shower, apartment 401');

  // 7. Result
  await step(page, 'Result').click();
  await waitSaved(page);
  const doc = await storedDocument(page);
  // the rises typed at the pipe step are the building's geometry: the top node sits 36 ft up
  const top = doc.nodes.find((n) => n.label === 'Apartment 401')!;
  const entry = doc.nodes.find((n) => n.id === doc.segments.find((s) => s.id === 'service-1')!.to)!;
  const z = nodeElevations(doc);
  expect(z.get(top.id)! - z.get(entry.id)!).toBe(36);
  const truth = analyzeSystem(doc);
  expect(verdictStatus(truth)).toBe('fail');
  const shower = truth.fixtures.find((f) => f.label === 'Shower, apartment 401')!;
  const overall = page.getByTestId('overall-verdict');
  await expect(overall.locator('[data-verdict]').first()).toHaveAttribute('data-verdict', 'fail');
  await expect(overall).not.toContainText('Every check passes');
  await expect(page.getByTestId(`margin-${shower.id}`)).toHaveText(signed(shower.margin, truth.units.pressure));
  await expect(bar(page)).toHaveAttribute('data-status', 'fail');
  await expect(page.getByTestId(`verdict-${shower.id}`).locator('[data-verdict]')).toHaveAttribute('data-verdict', 'fail');
  await shot(page, 'four-storeys-result');
});

test('when a system is empty, then its result is Incomplete with what is missing, and it cannot be issued', async ({ page }) => {
  await newSystem(page, 'Empty');
  await step(page, 'Result').click();
  const overall = page.getByTestId('overall-verdict');
  await expect(overall.locator('[data-verdict]').first()).toHaveAttribute('data-verdict', 'incomplete');
  await expect(overall).not.toContainText('Every check passes');
  await expect(page.getByTestId('incomplete-reasons')).toContainText('No checked fixture');
  await expect(page.getByRole('button', { name: 'Issue revision…' })).toBeDisabled();
  await expect(page.getByTestId('issue-blocked')).toBeVisible();
  await expect(bar(page)).toHaveAttribute('data-status', 'incomplete');
  await shot(page, 'empty-result');
});

test('when the demo’s risers step is scrolled to its last segment, then the verdict bar is still on screen', async ({ page }) => {
  await signIn(page, DEMO.designer);
  await openProject(page, DEMO_PROJECT);
  await page.getByRole('link', { name: 'Domestic cold water', exact: true }).first().click();
  await page.getByRole('link', { name: /^(Walk the draft|Open revision)/ }).click();
  await step(page, 'Risers').click();
  const cards = page.locator('[data-testid^="segment-"]').filter({ has: page.locator('input') });
  await expect(cards.first()).toBeVisible();
  const last = cards.last();
  await last.scrollIntoViewIfNeeded();
  await expect(last).toBeInViewport();
  await expect(bar(page)).toBeInViewport();
  await expect(bar(page).getByTestId('bar-margin')).toHaveText(/psi/);
  await shot(page, 'demo-last-segment');
});

test('when a segment is made too small for its flow, then its own card flags the velocity over the limit', async ({ page }) => {
  await newSystem(page, 'Velocity');
  await page.getByLabel(/Static pressure, low/).fill('80');
  await page.getByLabel(/Static pressure, high/).fill('90');
  await page.getByLabel('Where the pressure figures came from').fill('Invented demo figure');
  await step(page, 'Meter & devices').click();
  await page.getByRole('button', { name: /Add the service pipe/ }).click();
  await step(page, 'Risers').click();
  const service = page.getByTestId('segment-service-1');
  await service.getByLabel('Service pipe material').selectOption('copper-l');
  await service.getByLabel('Service pipe size').selectOption('1/2');
  await service.getByLabel('Service pipe length (ft)').fill('20');
  await service.getByLabel('Service pipe rise (ft)').fill('0');
  await page.getByRole('button', { name: 'Add fixtures at Building entry' }).click();
  await page.getByLabel('Building entry: fixture group 1 type').selectOption('water-closet-flush-valve-public');
  await page.getByLabel('Building entry: fixture group 1 count').fill('6');
  const flag = service.locator('[data-flag="velocity"]');
  await expect(flag).toBeVisible();
  await expect(flag).toContainText('over the limit');
  await shot(page, 'velocity-flag');
});

test('when "5,5" and 1e9 are typed, then each gets its message and neither is saved', async ({ page }) => {
  await newSystem(page, 'Bad numbers');
  await step(page, 'Meter & devices').click();
  await page.getByRole('button', { name: /Add the service pipe/ }).click();
  await step(page, 'Risers').click();
  const service = page.getByTestId('segment-service-1');
  await service.getByLabel('Service pipe length (ft)').fill('30');
  await waitSaved(page);
  const length = service.getByLabel('Service pipe length (ft)');

  await length.fill('5,5');
  await expect(service).toContainText('Use a decimal point: write 5.5');
  await expect(page.getByTestId('save-state')).toContainText('1 value not saved');
  await expect(page.getByTestId('save-state')).not.toContainText('All changes saved');

  await length.fill('1e9');
  await expect(service).toContainText('Out of range: length 0–5,000 ft');
  await expect(page.getByTestId('save-state')).toContainText('1 value not saved');
  await shot(page, 'out-of-range');
  // what the server holds is still the last good value
  expect((await storedDocument(page)).segments[0].length).toBe(30);

  await step(page, 'Supply').click();
  await page.getByLabel(/Static pressure, low/).fill('-20');
  const fieldError = (text: string) => page.locator('[id$="-error"]', { hasText: text });
  await expect(fieldError('Out of range: static pressure 0–300 psi')).toBeVisible();
  await page.getByLabel(/Water temperature/).fill('250');
  await expect(fieldError('Out of range: water temperature 33–200 °F')).toBeVisible();
  await expect(page.getByTestId('save-state')).toContainText('2 values not saved');
});

test('when an edit is followed at once by a breadcrumb click, then the edit is kept', async ({ page }) => {
  await newSystem(page, 'Breadcrumb');
  await page.getByLabel(/Static pressure, high/).fill('70');
  await waitSaved(page);
  await page.getByLabel(/Static pressure, low/).fill('61');
  // straight to the project, without waiting for the autosave
  await page.getByRole('link', { name: DEMO_PROJECT, exact: true }).first().click();
  await expect(page.getByRole('heading', { level: 1, name: DEMO_PROJECT })).toBeVisible();
  await page.goBack();
  await expect(page.getByRole('heading', { level: 2, name: 'Supply' })).toBeVisible();
  await expect(page.getByLabel(/Static pressure, low/)).toHaveValue('61');
  await page.reload();
  await expect(page.getByLabel(/Static pressure, low/)).toHaveValue('61');
});
