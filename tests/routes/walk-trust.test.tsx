/**
 * Trust in what the walk shows and keeps (issue #11, client side): the live verdict bar, number
 * fields that never turn a typed value into another number nor save one outside its range, a
 * pending edit saved before leaving the walk, a removal that names what goes and can be undone,
 * and an incomplete revision that cannot be issued. Every figure is the engine's own on the same
 * (edited) document, formatted as the screens format it — never a number written here.
 */
import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { analyzeSystem, UNIT_LABELS, verdictStatus } from '../../src/engine';
import type { SystemDocument } from '../../src/engine';
import { AUTOSAVE_DELAY_MS } from '../../src/features/walk/draft/use-draft';
import { signed } from '../../src/shared/format/quantity';
import { rangeText } from '../../src/features/walk/lib/limits';
import { walkPaths } from '../../src/features/walk/paths';
import { SaveDocumentBody } from '../../src/shared/api/systems';
import { demoDocument, fakeApi } from './support/fake-api';
import type { FakeApi } from './support/fake-api';
import { expectedMarginText, field, renderWalk, shownMargin, stepHref } from './support/render-walk';

const demo = demoDocument();
const u = UNIT_LABELS[demo.unitSystem];
const service = demo.segments[0];
const serviceName = service.label || service.id;
const lengthLabel = `${serviceName} length (${u.length})`;
const SAVE_WAIT = { timeout: AUTOSAVE_DELAY_MS + 10_000 };
const CATCH_UP = { timeout: 15_000 };
const withServiceLength = (doc: SystemDocument, length: number): SystemDocument => ({
  ...doc,
  segments: doc.segments.map((s, i) => (i === 0 ? { ...s, length } : s)),
});
const sent = (world: FakeApi, i: number) => SaveDocumentBody.parse(world.saves()[i].body);
const tableHref = (world: FakeApi) => walkPaths.table.getHref(world.ids.projectId, world.ids.systemId, world.ids.revisionId);
const saveText = () => screen.getByTestId('save-state').textContent ?? '';

/** The whole value at once, as a paste or Playwright's fill does (typing digit by digit passes through other numbers). */
async function paste(user: Awaited<ReturnType<typeof renderWalk>>['user'], label: string, value: string) {
  const input = field(label);
  await user.clear(input);
  await user.click(input);
  await user.paste(value);
}

async function retype(user: Awaited<ReturnType<typeof renderWalk>>['user'], label: string, value: string) {
  const input = field(label);
  await user.clear(input);
  await user.type(input, value);
}

describe('the live verdict bar', () => {
  it('when a step is open, then the bar shows the engine’s verdict, the critical fixture by name and its margin with the unit', async () => {
    const world = fakeApi();
    await renderWalk(world, stepHref(world, 'devices'));
    await screen.findByTestId('step-devices', {}, CATCH_UP);
    const a = analyzeSystem(demo);
    const critical = a.fixtures.find((f) => f.id === a.criticalFixtureId)!;
    const bar = screen.getByTestId('verdict-bar');
    expect(bar.getAttribute('data-status')).toBe(verdictStatus(a));
    expect(within(bar).getByTestId('bar-critical').textContent).toBe(critical.label);
    expect(within(bar).getByTestId('bar-margin').textContent).toBe(`${signed(critical.margin, u.pressure)} ${u.pressure}`);
    // the bar is pinned at the top of the window, the ledger panel no longer stretches its column
    expect(bar.className).toContain('sticky');
    expect(screen.getByTestId('ledger-panel').className).toContain('self-start');
  });
});

describe('number fields', () => {
  it('when "5,5" is typed, then it is refused with the point version offered (never read as 55), and "5.5" is saved as 5.5', async () => {
    const world = fakeApi();
    const { user } = await renderWalk(world, tableHref(world));
    await screen.findByTestId('segment-table', {}, CATCH_UP);
    const before = expectedMarginText(demo);
    await paste(user, lengthLabel, '5,5');
    await waitFor(() => expect(screen.getByTestId(`row-${service.id}`).textContent).toContain('Use a decimal point: write 5.5'), CATCH_UP);
    expect(shownMargin()).toBe(before);
    await waitFor(() => expect(saveText()).toContain('1 value not saved'), CATCH_UP);

    await paste(user, lengthLabel, '5.5');
    await waitFor(() => expect(shownMargin()).toBe(expectedMarginText(withServiceLength(demo, 5.5))), CATCH_UP);
    await waitFor(() => expect(world.saves()).toHaveLength(1), SAVE_WAIT);
    expect(sent(world, 0).document.segments[0].length).toBe(5.5);
    expect(saveText()).not.toContain('not saved:');
  });

  it('when a value outside its range or a non-number is typed, then the field says so, the draft keeps the last good value and nothing is saved', async () => {
    const world = fakeApi();
    const { user } = await renderWalk(world, tableHref(world));
    await screen.findByTestId('segment-table', {}, CATCH_UP);
    const before = expectedMarginText(demo);

    await paste(user, lengthLabel, '1e9');
    const message = `Out of range: ${rangeText('length', demo.unitSystem)}`;
    expect(message).toContain('length 0–5,000 ft');
    await waitFor(() => expect(screen.getByTestId(`row-${service.id}`).textContent).toContain(message), CATCH_UP);
    // the analysis runs in the same render as an edit: a value that reached the draft would show here
    expect(shownMargin()).toBe(before);
    await waitFor(() => expect(saveText()).toContain('1 value not saved'), CATCH_UP);
    expect(saveText()).toContain(message);
    expect(saveText()).not.toContain('All changes saved');

    await paste(user, lengthLabel, 'abc');
    await waitFor(() => expect(screen.getByTestId(`row-${service.id}`).textContent).toContain('Enter a number'), CATCH_UP);
    expect(saveText()).toContain('1 value not saved');
    // an autosave would have gone out by now: none did, and the server keeps the demo's length
    await new Promise((r) => setTimeout(r, AUTOSAVE_DELAY_MS + 1_000));
    expect(world.saves()).toHaveLength(0);
    expect(world.server.document.segments[0].length).toBe(service.length);
  });
});

describe('nothing lost', () => {
  it('when an edit is followed at once by a link out of the walk, then the edit is saved before the page changes', async () => {
    const world = fakeApi();
    const { user, router } = await renderWalk(world, tableHref(world));
    await screen.findByTestId('segment-table', {}, CATCH_UP);
    const longer = service.length * 3;
    await retype(user, lengthLabel, String(longer));
    // no wait for the autosave: the overview link is followed straight away
    await user.click(screen.getByRole('link', { name: 'System overview and revisions' }));
    await waitFor(() => expect(world.saves()).toHaveLength(1), CATCH_UP);
    expect(sent(world, 0).document.segments[0].length).toBe(longer);
    await waitFor(() => expect(router.state.location.pathname).toBe(walkPaths.system.getHref(world.ids.projectId, world.ids.systemId)), CATCH_UP);
    expect(world.server.document.segments[0].length).toBe(longer);
  });

  it('when a segment is removed, then the question names what goes with it, and Undo brings all of it back', { timeout: 150_000 }, async () => {
    const world = fakeApi();
    const { user } = await renderWalk(world, stepHref(world, 'risers'));
    await screen.findByTestId('step-risers', {}, CATCH_UP);
    // a leaf segment whose end node has checked fixtures: removing it takes them with it
    const target = demo.segments.find(
      (s) => !demo.segments.some((t) => t.from === s.to) && (demo.nodes.find((n) => n.id === s.to)?.checkedFixtures.length ?? 0) > 0,
    )!;
    const node = demo.nodes.find((n) => n.id === target.to)!;
    const name = target.label || target.id;
    // the tree editor: the row's details (where Remove is) open under it when it is opened
    await user.click(within(screen.getByTestId(`segment-${target.id}`)).getByRole('button', { name: `Open ${name}` }));
    await user.click(within(screen.getByTestId(`segment-${target.id}`)).getByRole('button', { name: `Remove ${name}…` }));
    const question = screen.getByTestId('confirm-remove');
    for (const f of node.checkedFixtures) expect(question.textContent).toContain(f.label);
    expect(world.saves()).toHaveLength(0);

    await user.click(within(question).getByRole('button', { name: 'Yes, remove' }));
    await waitFor(() => expect(screen.queryByTestId(`segment-${target.id}`)).toBeNull(), CATCH_UP);
    expect(screen.getByTestId('undo-remove').textContent).toContain(name);

    await user.click(within(screen.getByTestId('undo-remove')).getByRole('button', { name: 'Undo' }));
    await waitFor(() => expect(screen.queryByTestId(`segment-${target.id}`)).not.toBeNull(), CATCH_UP);
    await waitFor(() => expect(shownMargin()).toBe(expectedMarginText(demo)), CATCH_UP);
    // whatever was saved meanwhile, the last save holds the segment and its node's checked fixtures again
    await waitFor(() => expect(world.server.document.segments.some((s) => s.id === target.id)).toBe(true), SAVE_WAIT);
    await waitFor(() => expect(screen.getByTestId('save-state').getAttribute('data-state')).toBe('saved'), SAVE_WAIT);
    const last = world.server.document;
    expect(last.nodes.find((n) => n.id === node.id)?.checkedFixtures.map((f) => f.id)).toEqual(node.checkedFixtures.map((f) => f.id));
  });
});

describe('issuing', () => {
  it('when the draft is incomplete (no checked fixture), then the result says Incomplete with the reason and its step, and Issue is disabled', async () => {
    const doc: SystemDocument = { ...demoDocument(), nodes: demoDocument().nodes.map((n) => ({ ...n, checkedFixtures: [] })) };
    const a = analyzeSystem(doc);
    expect(verdictStatus(a)).toBe('incomplete');
    const world = fakeApi({ document: doc });
    await renderWalk(world, stepHref(world, 'result'));
    await screen.findByTestId('step-result', {}, CATCH_UP);
    const overall = screen.getByTestId('overall-verdict');
    expect(overall.querySelector('[data-verdict]')?.getAttribute('data-verdict')).toBe('incomplete');
    expect(overall.textContent).not.toContain('Every check passes');
    const reasons = within(overall).getByTestId('incomplete-reasons');
    for (const r of a.verdict.incomplete) expect(reasons.textContent).toContain(r.message);
    const fix = within(reasons).getAllByRole('link', { name: 'Fix at Remote fixture' })[0];
    expect(fix.getAttribute('href')).toBe(stepHref(world, 'fixtures'));
    expect((screen.getByRole('button', { name: 'Issue revision…' }) as HTMLButtonElement).disabled).toBe(true);
    expect(screen.getByTestId('issue-blocked').textContent).toContain(a.verdict.incomplete[0].message);
    // never green on the bar either
    expect(screen.getByTestId('verdict-bar').getAttribute('data-status')).toBe('incomplete');
  });

  it('when Issue is pressed on a complete draft, then it asks once before anything is sent', async () => {
    const world = fakeApi();
    const { user } = await renderWalk(world, stepHref(world, 'result'));
    await screen.findByTestId('step-result', {}, CATCH_UP);
    await user.click(screen.getByRole('button', { name: 'Issue revision…' }));
    const confirm = screen.getByRole('group', { name: 'Confirm issuing' });
    // no issue without the preparer's attestation: name, licence number and the confirmed statement
    const yes = within(confirm).getByRole('button', { name: /^Yes, issue/ }) as HTMLButtonElement;
    expect(yes.disabled).toBe(true);
    await user.type(within(confirm).getByLabelText('Your name, as on your licence'), 'Dana Whitlow');
    await user.type(within(confirm).getByLabelText('Licence or registration number'), 'PE 40417');
    expect(yes.disabled).toBe(true);
    await user.click(within(confirm).getByLabelText(/^I confirm:/));
    expect(yes.disabled).toBe(false);
    expect(world.calls.filter((c) => c.method === 'POST' && c.url.includes('/issue'))).toHaveLength(0);
    await user.click(within(confirm).getByRole('button', { name: 'Not now' }));
    expect(screen.queryByRole('group', { name: 'Confirm issuing' })).toBeNull();
  });
});
