/**
 * The walk's steps rendered through its real routes (issue #4: route-level tests of the steps).
 * Each page opens at its own address on the invented demo "Alder & Finch" (cold water, US units),
 * and what it shows is compared with the engine's own run on the same document, formatted the
 * way the screens format it (src/shared/format/quantity.ts) — never with a number written here.
 */
import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { analyzeSystem, UNIT_LABELS, verdictStatus } from '../../src/engine';
import type { Analysis, SystemDocument } from '../../src/engine';
import { CAUTIONS } from '../../src/features/walk/cautions';
import { num, signed } from '../../src/shared/format/quantity';
import { walkPaths } from '../../src/features/walk/paths';
import { WALK_STEPS } from '../../src/features/walk/steps';
import type { WalkStepId } from '../../src/features/walk/steps';
import { demoDocument, fakeApi } from './support/fake-api';
import type { FakeApi } from './support/fake-api';
import { expectedMarginText, field, renderWalk, shownMargin, stepHref } from './support/render-walk';

const doc = demoDocument();
const analysis = analyzeSystem(doc);
const u = UNIT_LABELS[doc.unitSystem];
const first = doc.segments[0];
const firstName = first.label || first.id;
const valueOf = (label: string) => field(label).value;

/** What each step shows of the demo: a field holding the document's value, and a figure the engine computed. */
const SHOWS: Record<WalkStepId, (a: Analysis, d: SystemDocument) => Promise<void>> = {
  supply: async (a, d) => {
    expect(valueOf(`Static pressure, low (${u.pressure})`)).toBe(String(d.source.staticPressureLow));
    expect(valueOf(`Static pressure, high (${u.pressure})`)).toBe(String(d.source.staticPressureHigh));
    expect(screen.getByTestId('source-at-design-flow').textContent).toContain(`${num(a.source.designFlow, u.flow)} ${u.flow}`);
  },
  devices: async (a, d) => {
    const device = d.devices[0];
    expect(valueOf('Device 1 name')).toBe(device.label);
    const loss = a.segments.flatMap((s) => s.devices).find((x) => x.deviceId === device.id);
    expect(loss).toBeDefined();
    expect(screen.getByTestId('device-loss-0').textContent).toContain(`Loss at the design flow: ${num(loss!.loss, u.pressure)} ${u.pressure}`);
  },
  risers: async (_a, d) => {
    expect(valueOf(`${firstName} length (${u.length})`)).toBe(String(d.segments[0].length));
    // Document version 2: the demo's nodes carry their elevations, so its segments have no typed rise (empty field).
    expect(valueOf(`${firstName} rise (${u.length})`)).toBe(d.segments[0].rise === undefined ? '' : String(d.segments[0].rise));
  },
  fittings: async (a, d) => {
    expect(valueOf(`${firstName}: fitting 1 count`)).toBe(String(d.segments[0].fittings[0].count));
    const result = a.segments.find((s) => s.id === first.id)!;
    expect(screen.getByTestId(`fitting-loss-${first.id}`).textContent).toContain(`Σ K = ${num(result.fittingsK, 'loss coefficient')}`);
  },
  elevation: async (a, d) => {
    // the demo's nodes sit on named floors: each shows its floor's elevation + its height, as the engine placed it
    const top = [...a.nodes].sort((x, y) => y.elevation - x.elevation)[0];
    const node = d.nodes.find((n) => n.id === top.id)!;
    const floor = d.floors.find((f) => f.id === node.floor);
    expect(floor).toBeDefined();
    expect(valueOf(`Elevation of ${node.label || node.id} (${u.elevation})`)).toBe(String(floor!.elevation + (node.heightAboveFloor ?? 0)));
    expect(screen.getByTestId(`on-floor-${node.id}`).textContent).toContain(`on ${floor!.name}`);
  },
  fixtures: async (a) => {
    const critical = a.fixtures.find((f) => f.id === a.criticalFixtureId)!;
    const summary = screen.getByTestId('critical-summary').textContent ?? '';
    expect(summary).toContain(critical.label);
    expect(summary).toContain(`margin ${signed(critical.margin, u.pressure)} ${u.pressure}`);
    expect(within(screen.getByTestId(`checked-${critical.id}`)).getByTestId('critical-marker')).toBeTruthy();
  },
  result: async (a) => {
    const rows = within(screen.getByTestId('verdict-table')).getAllByRole('row').slice(1);
    expect(rows).toHaveLength(a.fixtures.length);
    for (const f of a.fixtures) expect(screen.getByTestId(`margin-${f.id}`).textContent).toBe(signed(f.margin, u.pressure));
    // sorted by margin, the critical (smallest margin) first and marked
    expect(rows[0].getAttribute('data-testid')).toBe(`verdict-${a.criticalFixtureId}`);
    expect(rows[0].textContent).toContain('critical');
    // the words follow the engine's status; "Every check passes" only for a pass
    const status = verdictStatus(a);
    const overall = screen.getByTestId('overall-verdict');
    expect(overall.querySelector('[data-verdict]')?.getAttribute('data-verdict')).toBe(status);
    if (status === 'pass') expect(overall.textContent).toContain('Every check passes');
    else expect(overall.textContent).not.toContain('Every check passes');
    const cautions = screen.getByTestId('cautions').textContent ?? '';
    for (const c of CAUTIONS) expect(cautions).toContain(c);
    expect(screen.getByRole('heading', { name: `${a.warnings.length} ${a.warnings.length === 1 ? 'warning' : 'warnings'} in plain words` })).toBeTruthy();
    // a draft has no issued summary yet
    expect(screen.getByTestId('summary-draft-note')).toBeTruthy();
  },
};

/** The numbered step links (the list), not the table, diagram and overview links under it. */
function stepNavLinks() {
  return within(within(screen.getByRole('navigation', { name: 'Steps of the walk' })).getByRole('list')).getAllByRole('link');
}
const current = () => stepNavLinks().filter((a) => a.getAttribute('aria-current') === 'page');

describe('each step of the walk at its own address', () => {
  it.each(WALK_STEPS.map((s, i) => [s.id, s, i] as const))(
    'when %s is opened, then it shows its heading, the demo’s values, the current step and its neighbours',
    async (_id, step, i) => {
      const world = fakeApi();
      await renderWalk(world, stepHref(world, step.id));
      expect(await screen.findByRole('heading', { level: 2, name: step.label }, { timeout: 10_000 })).toBeTruthy();
      expect(screen.getByTestId(`step-${step.id}`)).toBeTruthy();
      await SHOWS[step.id](analysis, doc);

      // the live ledger is the engine's ledger to the critical fixture
      expect(shownMargin()).toBe(expectedMarginText(doc));

      // the step navigation marks this step, and only it
      const marked = current();
      expect(marked).toHaveLength(1);
      expect(marked[0].textContent).toContain(step.label);
      expect(marked[0].getAttribute('href')).toBe(stepHref(world, step.id));

      // previous and next go to the neighbouring steps' addresses
      const around = within(screen.getByRole('navigation', { name: 'Previous and next step' }));
      const prev = WALK_STEPS[i - 1];
      const next = WALK_STEPS[i + 1];
      if (prev) expect(around.getByRole('link', { name: `← ${prev.label}` }).getAttribute('href')).toBe(stepHref(world, prev.id));
      if (next) expect(around.getByRole('link', { name: `Next: ${next.label} →` }).getAttribute('href')).toBe(stepHref(world, next.id));
      expect(around.queryAllByRole('link')).toHaveLength((prev ? 1 : 0) + (next ? 1 : 0));
      expect(world.unknown).toEqual([]);
    },
  );

  it('when the previous and next links are followed, then the router lands on those steps', async () => {
    const world = fakeApi();
    const { user, router } = await renderWalk(world, stepHref(world, 'fittings'));
    const around = () => within(screen.getByRole('navigation', { name: 'Previous and next step' }));
    await user.click(await around().findByRole('link', { name: 'Next: Elevation →' }));
    expect(await screen.findByRole('heading', { level: 2, name: 'Elevation' })).toBeTruthy();
    expect(router.state.location.pathname).toBe(stepHref(world, 'elevation'));
    await user.click(around().getByRole('link', { name: '← Fittings' }));
    expect(await screen.findByRole('heading', { level: 2, name: 'Fittings' })).toBeTruthy();
    expect(router.state.location.pathname).toBe(stepHref(world, 'fittings'));
  });

  it('when the revision’s own address is opened, then it goes on to the first step', async () => {
    const world = fakeApi();
    const { router } = await renderWalk(world, walkPaths.revision.getHref(world.ids.projectId, world.ids.systemId, world.ids.revisionId));
    expect(await screen.findByRole('heading', { level: 2, name: WALK_STEPS[0].label })).toBeTruthy();
    expect(router.state.location.pathname).toBe(stepHref(world, WALK_STEPS[0].id));
  });

  it('when an unknown step is opened, then the not-found view shows and no step is marked current', async () => {
    const world = fakeApi();
    await renderWalk(world, stepHref(world, 'no-such-step'));
    const view = await screen.findByTestId('not-found');
    expect(within(view).getByRole('heading', { name: 'Not found' })).toBeTruthy();
    expect(current()).toHaveLength(0);
    expect(screen.queryByRole('navigation', { name: 'Previous and next step' })).toBeNull();
  });
});

describe('the segment table and the riser diagram', () => {
  const href = (world: FakeApi, page: 'table' | 'diagram') => walkPaths[page].getHref(world.ids.projectId, world.ids.systemId, world.ids.revisionId);

  it('when the segment table is opened, then every segment is a row with its length, the ledger is live and its link is current', async () => {
    const world = fakeApi();
    await renderWalk(world, href(world, 'table'));
    expect(await screen.findByRole('heading', { level: 2, name: 'Segment table' }, { timeout: 10_000 })).toBeTruthy();
    const body = screen.getByTestId('segment-table').querySelector('tbody')!;
    expect(within(body).getAllByRole('row')).toHaveLength(doc.segments.length);
    expect(screen.getByText(`${doc.segments.length} of ${doc.segments.length} segments shown.`)).toBeTruthy();
    expect(valueOf(`${firstName} length (${u.length})`)).toBe(String(first.length));
    const row = screen.getByTestId(`row-${first.id}`);
    const result = analysis.segments.find((s) => s.id === first.id)!;
    expect(row.textContent).toContain(num(result.designFlow, u.flow));
    expect(row.textContent).toContain(num(result.frictionLoss + result.fittingLoss, u.pressure));
    expect(shownMargin()).toBe(expectedMarginText(doc));
    expect(current()).toHaveLength(0);
    const table = within(screen.getByRole('navigation', { name: 'Steps of the walk' })).getByRole('link', { name: 'Segment table' });
    expect(table.getAttribute('aria-current')).toBe('page');
    expect(world.unknown).toEqual([]);
  });

  it('when the riser diagram is opened, then each checked fixture is drawn with the engine’s margin and verdict', async () => {
    const world = fakeApi();
    await renderWalk(world, href(world, 'diagram'));
    expect(await screen.findByRole('heading', { level: 2, name: 'Riser diagram' }, { timeout: 10_000 })).toBeTruthy();
    const svg = screen.getByTestId('riser-diagram');
    expect(svg.querySelector('title')?.textContent).toBe(`Riser diagram of ${doc.name}`);
    const passing = analysis.fixtures.filter((f) => f.pass).length;
    expect(svg.querySelector('desc')?.textContent).toContain(
      `${analysis.fixtures.length} checked fixtures, ${passing} pass and ${analysis.fixtures.length - passing} fail`,
    );
    for (const f of analysis.fixtures) {
      const label = screen.getByTestId(`diagram-fixture-${f.id}`).textContent ?? '';
      expect(label).toContain(`${f.label}: ${signed(f.margin, u.pressure)} ${u.pressure} ${f.pass ? 'pass' : 'FAIL'}`);
      expect(label.includes('(critical)')).toBe(f.id === analysis.criticalFixtureId);
    }
    const link = within(screen.getByRole('navigation', { name: 'Steps of the walk' })).getByRole('link', { name: 'Riser diagram' });
    expect(link.getAttribute('aria-current')).toBe('page');
    expect(current()).toHaveLength(0);
  });
});
