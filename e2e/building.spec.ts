import fs from 'node:fs';
import { expect, test } from '@playwright/test';
import type { Page } from '@playwright/test';
import { analyzeSystem, SystemDocumentSchema, verdictStatus } from '../src/engine';
import { signed } from '../src/shared/format/quantity';
import { DEMO, signIn } from './helpers';
import { EntryCounter, enterBuilding, generate, INVENTED_BACKFLOW_POINTS, INVENTED_METER_POINTS, screenshotDir, waitSaved } from './building-entry';

// A new user enters a whole building from an empty project, in the order the screens suggest,
// and the spec counts every entry and click it makes (printed, and held to the aims).
// Each test makes its own project; every wait is on a state of the page.

const run = Date.now().toString(36);
const bar = (page: Page) => page.getByTestId('verdict-bar');
const INPUTS = {
  staticLow: '60',
  staticHigh: '72',
  connectionElevation: '-5',
  meterPoints: INVENTED_METER_POINTS,
  backflowPoints: INVENTED_BACKFLOW_POINTS,
};

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

async function enterAndCheck(page: Page, storeys: number, aims: { entries: number; clicks: number }) {
  test.setTimeout(300_000);
  await signIn(page, DEMO.designer);
  const c = new EntryCounter();
  await enterBuilding(page, c, `Kestrel Row ${storeys} storeys ${run}`, { storeys, ...INPUTS });
  const shownAfterMs = await generate(page, c);
  await expect(bar(page)).toHaveAttribute('data-status', 'fail');

  // the result: the verdict the engine gives for what was stored, never green for this failing building
  await c.click(page.getByRole('navigation', { name: 'Steps of the walk' }).getByRole('link', { name: 'Result' }));
  const overall = page.getByTestId('overall-verdict');
  await expect(overall.locator('[data-verdict]').first()).toHaveAttribute('data-verdict', 'fail', { timeout: 60_000 });
  await waitSaved(page);
  const doc = await storedDocument(page);
  const truth = analyzeSystem(doc);
  expect(verdictStatus(truth)).toBe('fail');
  const critical = truth.fixtures.find((f) => f.id === truth.criticalFixtureId) ?? truth.fixtures.reduce((a, b) => (b.margin < a.margin ? b : a));
  // the top floor's farthest apartment governs (the expectation for this building)
  expect(critical.label).toMatch(new RegExp(`Level ${storeys}-4\\b.*[Ss]hower`));
  await expect(page.getByTestId(`margin-${critical.id}`)).toHaveText(signed(critical.margin, truth.units.pressure));
  await page.screenshot({ path: `${screenshotDir()}/${storeys}-storeys-result.png` });

  const line =
    `building entry: ${storeys} storeys, ${truth.fixtures.length} checked fixtures: ${c.entries} field entries, ${c.clicks} clicks ` +
    `(first version: 377 entries, 203 clicks for 4 storeys); verdict on screen ${shownAfterMs} ms after the last entry (Generate); ` +
    `critical ${critical.label} ${signed(critical.margin, truth.units.pressure)}; fixtures ${truth.verdict.allFixturesPass ? 'pass' : 'fail'}, ` +
    `velocities ${truth.verdict.allVelocitiesPass ? 'pass' : 'fail'}, static ${truth.verdict.allStaticPass ? 'pass' : 'fail'}`;
  console.log(line);
  fs.appendFileSync(`${screenshotDir()}/counts.txt`, `${line}\n`);
  // `npm run bench` (scripts/bench/entry.ts) reads the counts from here
  if (process.env.BENCH_ENTRY_OUT)
    fs.appendFileSync(
      process.env.BENCH_ENTRY_OUT,
      `${JSON.stringify({ storeys, fixtures: truth.fixtures.length, entries: c.entries, clicks: c.clicks, verdictAfterMs: shownAfterMs })}\n`,
    );
  expect(c.entries).toBeLessThanOrEqual(aims.entries);
  expect(c.clicks).toBeLessThanOrEqual(aims.clicks);
}

test('when a new user enters the 4-storey, 16-apartment building from an empty project, then it takes at most 60 entries and 60 clicks and the result is the true fail', async ({
  page,
}) => {
  await enterAndCheck(page, 4, { entries: 60, clicks: 60 });
});

test('when a new user enters the same building with 40 storeys, then it takes at most 80 entries and the result is the true fail', async ({ page }) => {
  await enterAndCheck(page, 40, { entries: 80, clicks: 60 });
});
