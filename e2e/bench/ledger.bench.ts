import fs from 'node:fs';
import { expect, test } from '@playwright/test';
import type { Page } from '@playwright/test';
import { generateBuilding } from '../../src/engine/testing/generateTree';
import { DEMO, signIn } from '../helpers';
import { EntryCounter, enterBuilding, INVENTED_BACKFLOW_POINTS, INVENTED_METER_POINTS } from '../building-entry';
import { longestScrollFrame, pageHeight, verdictAfterGenerate } from './tree-figures';

// Bench only (`npm run bench` runs it with HEADROOM_BENCH=1; the e2e suite never matches *.bench.ts).
// Edit-to-ledger time in the browser, in the walk's pipe step (the tree editor): the demo building
// and a generated 500-segment building, imported into a project of their own (the demo project is
// left as seeded); the pipe step's figures; and the verdict after the riser builder's Generate on
// the 40-storey building entered through the screens. Figures go to the JSON file
// BENCH_LEDGER_OUT; scripts/bench/client.ts makes the table's rows from it.

const run = Date.now().toString(36);
const EDITS = Number(process.env.BENCH_EDITS ?? 15);
const OUT = process.env.BENCH_LEDGER_OUT ?? 'e2e-output/bench/ledger.json';

/**
 * In the page: for each value, the time from setting the input and firing `input` to the ledger
 * panel's data-stamp changing (a new analysis rendered), then one animation frame. With
 * `unchanged`, the same event with the input's own value (React sees no change): the floor.
 */
async function timeEdits(page: Page, inputLabel: string, values: number[], unchanged: boolean): Promise<number[]> {
  return page.evaluate(
    async ({ label, values, unchanged }) => {
      const input = document.querySelector<HTMLInputElement>(`input[aria-label="${label}"]`);
      const panel = document.querySelector<HTMLElement>('[data-testid="ledger-panel"]');
      if (!input || !panel) throw new Error(`no input "${label}" or no ledger panel`);
      const setter = Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value')!.set!;
      const frame = () => new Promise((r) => requestAnimationFrame(() => r(null)));
      const times: number[] = [];
      for (const v of values) {
        await frame(); // start each measurement on a fresh frame
        const before = panel.dataset.stamp;
        const t0 = performance.now();
        if (unchanged) {
          setter.call(input, input.value);
          input.dispatchEvent(new Event('input', { bubbles: true }));
          await frame();
          if (panel.dataset.stamp !== before) throw new Error('an unchanged value re-ran the analysis');
        } else {
          const changed = new Promise<void>((resolve) => {
            const obs = new MutationObserver(() => {
              if (panel.dataset.stamp !== before) {
                obs.disconnect();
                resolve();
              }
            });
            obs.observe(panel, { attributes: true, attributeFilter: ['data-stamp'] });
          });
          setter.call(input, String(v));
          input.dispatchEvent(new Event('input', { bubbles: true }));
          await changed;
          await frame();
        }
        times.push(performance.now() - t0);
      }
      return times;
    },
    { label: inputLabel, values, unchanged },
  );
}

async function importSystem(page: Page, projectUrl: string, name: string, document: unknown) {
  await page.goto(projectUrl);
  await page.getByRole('button', { name: 'Import a system (JSON)' }).click();
  await page
    .getByLabel('System document (JSON)')
    .setInputFiles({ name: `${name}.json`, mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(document)) });
  await page.getByLabel('Name of the imported system').fill(name);
  await page.getByRole('button', { name: 'Import system' }).click();
  await expect(page).toHaveURL(/\/result$/);
}

test('bench: edit-to-ledger time in the browser, the demo building and a generated 500-segment building', async ({ page }) => {
  // 8 min: three imports, 4 × EDITS timed edits, and a 40-storey building entered through the
  // screens, on a busy 2-core machine (a choice with room)
  test.setTimeout(480_000);
  const problems: string[] = [];
  page.on('pageerror', (error) => problems.push(`uncaught: ${error.message}`));
  await signIn(page, DEMO.designer);

  // a project of the bench's own
  await page.getByRole('link', { name: 'New project' }).click();
  await page.getByLabel('Project name').fill(`Benchmark ${run}`);
  await page.getByLabel('Building address').fill('410 Quarry Lane, Wrenmoor (benchmark copy)');
  await page.getByRole('button', { name: 'Create project' }).click();
  await expect(page.getByRole('heading', { level: 1, name: `Benchmark ${run}` })).toBeVisible();
  const projectUrl = page.url();

  const demo = JSON.parse(fs.readFileSync('src/engine/examples/alder-finch-cold.json', 'utf8'));
  // 4 storeys of the generator's default building: 500 segments
  const big = generateBuilding({ storeys: 4 });
  const cases = [
    { name: 'demo building', document: demo, segment: demo.segments[0].label ?? demo.segments[0].id, segmentId: demo.segments[0].id },
    { name: 'generated 500-segment building', document: big, segment: 'riser-1', segmentId: 'riser-1' },
  ];
  const results = [];
  for (const c of cases) {
    await importSystem(page, projectUrl, `${c.name} ${run}`, c.document);
    // the walk's pipe step: the tree editor beside the live ledger
    await page.goto(page.url().replace(/\/result$/, '/risers'));
    await expect(page.getByTestId('tree-editor')).toBeVisible({ timeout: 60_000 });
    // a virtualised row shows its values as text until the pointer comes to it: the pointer rests on the edited row
    await page.getByTestId(`segment-${c.segmentId}`).hover();
    await expect(page.getByLabel(`${c.segment} length (ft)`)).toBeVisible();
    const segments = Number((await page.getByTestId('tree-counts').innerText()).match(/^(\d+) segment/)?.[1]);
    // lengths no segment starts with (13.37 ft and up, invented), so every edit is a change
    const lengths = Array.from({ length: EDITS }, (_, i) => 13.37 + i * 0.5);
    const floorMs = await timeEdits(page, `${c.segment} length (ft)`, lengths, true);
    const editsMs = await timeEdits(page, `${c.segment} length (ft)`, lengths, false);
    const engine = (await page.getByTestId('ledger-panel').innerText()).match(/\((\d+) ms\)/)?.[1];
    expect(editsMs).toHaveLength(EDITS);
    results.push({ name: c.name, segments, editsMs, floorMs, engineMs: engine === undefined ? null : Number(engine) });
  }
  // the pipe step (the tree editor): the demo's page height, and the generated 40-storey building's longest frame while its list scrolls
  await importSystem(page, projectUrl, `demo pipe step ${run}`, demo);
  await page.goto(page.url().replace(/\/result$/, '/risers'));
  await expect(page.getByTestId('tree-editor')).toBeVisible();
  const demoHeightPx = await pageHeight(page);
  const tower = generateBuilding({ storeys: 40 });
  await importSystem(page, projectUrl, `40-storey ${run}`, tower);
  await page.goto(page.url().replace(/\/result$/, '/risers'));
  await expect(page.getByTestId('tree-scroll')).toBeVisible({ timeout: 60_000 });
  const scrolls = [];
  // a first pass warms the page (the first render of each kind of row), then three measured passes
  await longestScrollFrame(page);
  for (let k = 0; k < 3; k++) scrolls.push((await longestScrollFrame(page)).longestMs);
  const pipeStep = { demoHeightPx, towerSegments: tower.segments.length, towerLongestFrameMs: scrolls };

  // the riser builder: the 40-storey, 320-apartment building of issue #14 entered through the
  // screens, then "Generate into draft" timed in the page until its verdict is drawn
  await page.goto('/');
  await enterBuilding(page, new EntryCounter(), `Generate ${run}`, {
    storeys: 40,
    staticLow: '60',
    staticHigh: '72',
    connectionElevation: '-5',
    meterPoints: INVENTED_METER_POINTS,
    backflowPoints: INVENTED_BACKFLOW_POINTS,
  });
  const generate = await verdictAfterGenerate(page);
  expect(problems).toEqual([]);
  fs.mkdirSync(OUT.replace(/\/[^/]*$/, '') || '.', { recursive: true });
  fs.writeFileSync(OUT, JSON.stringify({ cases: results, pipeStep, generate }, null, 2));
});
