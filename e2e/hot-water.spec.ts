import fs from 'node:fs';
import { expect, test } from '@playwright/test';
import type { Page } from '@playwright/test';
import { DEMO, signIn } from './helpers';
import { fresh, newProject } from './api';
import { withUnit } from '../src/shared/format/quantity';

// A hot-water system fed from a cold one, through the UI, in a fresh project (invented "Wrenmoor"
// names and figures): the hot system's supply is read from the cold system at the node feeding its
// heater, and follows a change to the cold system's supply.

async function shot(page: Page, name: string) {
  fs.mkdirSync('e2e-output/hot-water', { recursive: true });
  await page.screenshot({ path: `e2e-output/hot-water/${name}.png`, fullPage: true });
}

const saved = (page: Page) => expect(page.getByText('All changes saved')).toBeVisible();

async function newSystem(page: Page, projectPath: string, name: string, service: 'cold' | 'hot') {
  await page.goto(projectPath);
  await page.getByRole('button', { name: 'New system' }).click();
  await page.getByLabel('System name').fill(name);
  await page.getByLabel('Service').selectOption(service);
  await page.getByRole('button', { name: 'Create system and start the walk' }).click();
  await expect(page).toHaveURL(/\/revisions\/[^/]+\/supply$/);
  return page.url();
}

async function typeLowStatic(page: Page, value: string) {
  const low = page.getByLabel(/Static pressure, low/);
  await low.fill(value);
  await expect(low).toHaveValue(value);
}

test("when a hot system is fed from a cold one, then its supply is the cold system's pressure at the heater feed and follows a change to the cold supply", async ({
  page,
}) => {
  const problems: string[] = [];
  page.on('pageerror', (error) => problems.push(`uncaught: ${error.message}`));
  const project = await newProject([], 'Wrenmoor Bathhouse');
  await signIn(page, DEMO.designer);
  const coldName = `Bathhouse cold ${fresh()}`;

  // The cold system: a connection at 60 psi low, 70 psi high.
  const coldUrl = await newSystem(page, project.path, coldName, 'cold');
  await typeLowStatic(page, '60');
  await page.getByLabel(/Static pressure, high/).fill('70');
  await page.getByLabel('Where the pressure figures came from').fill('Wrenmoor Water Department letter (invented figure)');
  await saved(page);

  // The hot system, fed from the cold system's connection.
  const hotUrl = await newSystem(page, project.path, `Bathhouse hot ${fresh()}`, 'hot');
  await page.getByLabel('Cold-water system feeding the heater').selectOption({ label: coldName });
  await page.getByLabel('Node of the cold system that feeds the heater').selectOption({ label: 'Connection to the main' });
  await expect(page.getByTestId('fed-from-pressure')).toHaveText('60.00 psi');
  await expect(page.getByTestId('fed-from-supply')).toContainText(`Fed from ${coldName} at Connection to the main`);
  // The typed pressure fields give way to the cold system's figures: they cannot be typed over.
  await expect(page.getByLabel(/Static pressure, low/)).toHaveCount(0);
  await expect(page.getByTestId('fed-pressures-note')).toContainText('low 60.00 psi');
  await expect(page.getByTestId('source-at-design-flow')).toContainText('60.00 psi');
  await saved(page);
  await shot(page, '01-hot-fed-from-cold');

  // The cold supply drops to 52 psi.
  await page.goto(coldUrl);
  await typeLowStatic(page, '52');
  await saved(page);

  // The hot system follows it, on screen and in the live ledger.
  await page.goto(hotUrl);
  await expect(page.getByTestId('fed-from-pressure')).toHaveText('52.00 psi');
  await expect(page.getByTestId('source-at-design-flow')).toContainText('52.00 psi');
  await shot(page, '02-hot-follows-cold');

  // And the server holds the same: the stored draft's supply is the cold figure.
  const hotPath = new URL(hotUrl).pathname.replace(/\/supply$/, '');
  const revision = await project.designer.get<{ revision: { document: { source: { staticPressureLow: number } } } }>(`/api${hotPath}`);
  // The cold analysis holds Pa (SI inside); psi → Pa → psi returns 52 within rounding (relative 1e-12).
  expect(Math.abs(revision.revision.document.source.staticPressureLow - 52) / 52).toBeLessThan(1e-12);
  expect(problems).toEqual([]);
});

test('when a designer describes a recirculation loop on a fresh hot system, then the result step shows the loop flow, the pump flow and head and the return sizes, and names a loop it cannot compute', async ({
  page,
}) => {
  const problems: string[] = [];
  page.on('pageerror', (error) => problems.push(`uncaught: ${error.message}`));
  const project = await newProject([], 'Wrenmoor Laundry');
  await signIn(page, DEMO.designer);
  const hotUrl = await newSystem(page, project.path, `Laundry hot ${fresh()}`, 'hot');
  await page.goto(hotUrl.replace(/\/supply$/, '/result'));

  const loop = page.getByTestId('recirculation');
  await expect(loop).toContainText('No recirculation loop is described.');
  await page.getByRole('button', { name: 'Describe a recirculation loop' }).click();
  // The starting loop has no heat loss yet: a named error, and the loop is not computed.
  await expect(page.getByTestId('recirculation-error')).toContainText('has no heat loss');
  await expect(page.getByTestId('recirculation-error')).toContainText('recirculation.segments[0].heatLoss');

  // 20 Btu/h per ft over the starting loop's 2 × 50 ft, 10 °F drop (invented figures).
  // the save that carries this value (an earlier save of the starting loop may still be on its way)
  const savedLoop = page.waitForResponse(
    (r) => r.request().method() === 'PUT' && r.url().endsWith('/document') && (r.request().postData() ?? '').includes('"heatLossPerLength":20'),
  );
  await page.getByLabel('Heat loss per length of pipe (Btu/h per ft)').fill('20');
  await expect(page.getByTestId('recirculation-pump-flow')).toContainText('gpm');
  expect((await savedLoop).ok()).toBe(true);
  await saved(page);
  await shot(page, '03-recirculation');

  // The page shows what the server's analysis of the saved draft says.
  const path = new URL(hotUrl).pathname.replace(/\/supply$/, '');
  type Stored = {
    revision: {
      document: { recirculation?: unknown };
      analysis: {
        analysis: {
          recirculation?: {
            ok: boolean;
            pumpFlow: number;
            pumpHead: number;
            pumpHeadLength: number;
            heatLoss: number;
            pipes: { segmentId: string; size: string; sizeChosen: boolean }[];
          };
        };
      };
    };
  };
  const stored = await project.designer.get<Stored>(`/api${path}`);
  const r = stored.revision.analysis.analysis.recirculation;
  expect(r?.ok).toBe(true);
  if (!r?.ok) return;
  // 100 ft × 20 Btu/h per ft, through W and back (relative 1e-12: floating-point rounding only).
  expect(Math.abs(r.heatLoss - 2000) / 2000).toBeLessThan(1e-12);
  await expect(page.getByTestId('recirculation-heat-loss')).toHaveText(withUnit(r.heatLoss, 'Btu/h'));
  await expect(page.getByTestId('recirculation-pump-flow')).toHaveText(withUnit(r.pumpFlow, 'gpm', 'loop flow'));
  await expect(page.getByTestId('recirculation-pump-head')).toHaveText(`${withUnit(r.pumpHead, 'psi')} (${withUnit(r.pumpHeadLength, 'ft')} of water)`);
  for (const p of r.pipes) await expect(page.getByTestId(`recirculation-size-${p.segmentId}`)).toHaveText(`${p.size} (chosen)`);
  await expect(page.getByTestId('recirculation-sources')).toContainText('Rinnai design manual R-TRWH-E-02');
  console.log(`fresh loop: ${r.pumpFlow.toFixed(3)} gpm at ${r.pumpHead.toFixed(3)} psi; returns ${r.pipes.map((p) => p.size).join(', ')}`);

  // A drop of zero: named, and the rest of the result is still shown.
  const drop = page.getByLabel('Temperature drop allowed around the loop (°F)');
  await drop.fill('0');
  await expect(page.getByTestId('recirculation-error')).toContainText('recirculation.temperatureDrop');
  await expect(page.getByTestId('overall-verdict')).toContainText('Incomplete');
  await expect(page.getByTestId('overall-verdict')).toContainText('Recirculation loop');
  await drop.fill('10');
  await expect(page.getByTestId('recirculation-pump-flow')).toHaveText(withUnit(r.pumpFlow, 'gpm', 'loop flow'));
  await saved(page);
  expect(problems).toEqual([]);
});
