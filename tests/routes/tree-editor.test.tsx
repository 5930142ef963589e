/**
 * The compact tree editor (issue #14) through the walk's real routes on the invented demo "Alder &
 * Finch": a length edited with the keyboard alone, a branch selected and changed in bulk, a branch
 * collapsed and expanded; and the same editor with the contractor's policy, whose locked cells are
 * shown read-only with their reason. Every figure is the engine's own on the same (edited) document.
 */
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { analyzeSystem, UNIT_LABELS } from '../../src/engine';
import type { SystemDocument } from '../../src/engine';
import { TreeEditor } from '../../src/features/tree-editor/components/tree-editor';
import { branchIds, setMaterial, treeRows } from '../../src/features/tree-editor/model';
import { CONTRACTOR_POLICY } from '../../src/features/tree-editor/policy';
import { CatalogResponse, indexCatalog } from '../../src/features/systems/api/get-catalog';
import { indexProjectCatalog } from '../../src/features/catalog/api/get-project-catalog';
import { AUTOSAVE_DELAY_MS } from '../../src/features/walk/draft/use-draft';
import { catalogRows } from '../../server/services/catalogRows';
import { demoDocument, fakeApi } from './support/fake-api';
import { expectedMarginText, field, renderWalk, shownMargin, stepHref } from './support/render-walk';

const demo = demoDocument();
const u = UNIT_LABELS[demo.unitSystem];
const CATCH_UP = { timeout: 15_000 };
const SAVE_WAIT = { timeout: AUTOSAVE_DELAY_MS + 10_000 };
const seg = (id: string) => demo.segments.find((s) => s.id === id)!;
const nameOf = (id: string) => seg(id).label || id;
const withLength = (doc: SystemDocument, id: string, length: number): SystemDocument => ({
  ...doc,
  segments: doc.segments.map((s) => (s.id === id ? { ...s, length } : s)),
});

describe('the tree editor in the walk’s pipe step', () => {
  it(
    'when a length is reached with the arrow keys, edited with Enter and typing, then cancelled with Escape, then the margin follows and comes back',
    { timeout: 120_000 },
    async () => {
      const world = fakeApi({ holdSaves: true });
      const { user } = await renderWalk(world, stepHref(world, 'risers'));
      await screen.findByTestId('step-risers', {}, CATCH_UP);
      const rows = treeRows(demo);
      // the first row whose length the critical margin feels (rows above a booster holding its outlet do not), and the row above it
      const k = rows.findIndex((r, i) => i > 0 && expectedMarginText(withLength(demo, r.id, seg(r.id).length + 40)) !== expectedMarginText(demo));
      expect(k).toBeGreaterThan(0);
      const [first, second] = [rows[k - 1], rows[k]];
      // start on the row above's material; two steps right is its length, one down the next row's length
      field(`${first.name} material`).focus();
      await user.keyboard('{ArrowRight}{ArrowRight}');
      expect(document.activeElement).toBe(field(`${first.name} length (${u.length})`));
      await user.keyboard('{ArrowDown}');
      const lengthBox = field(`${second.name} length (${u.length})`);
      expect(document.activeElement).toBe(lengthBox);
      // arrows do not change a select's value: the first row's material is as it was
      expect(field(`${first.name} material`).value).toBe(seg(first.id).material);

      const longer = seg(second.id).length + 40;
      await user.keyboard('{Enter}');
      await user.keyboard(String(longer));
      expect(lengthBox.value).toBe(String(longer));
      const edited = expectedMarginText(withLength(demo, second.id, longer));
      expect(edited).not.toBe(expectedMarginText(demo));
      await waitFor(() => expect(shownMargin()).toBe(edited), CATCH_UP);

      await user.keyboard('{Escape}');
      expect(lengthBox.value).toBe(String(seg(second.id).length));
      await waitFor(() => expect(shownMargin()).toBe(expectedMarginText(demo)), CATCH_UP);
      expect(world.unknown).toEqual([]);
    },
  );

  it(
    'when a branch is selected and given another material in bulk, then every segment of it changes, the margin follows and the save carries it',
    { timeout: 120_000 },
    async () => {
      const world = fakeApi();
      const { user } = await renderWalk(world, stepHref(world, 'risers'));
      await screen.findByTestId('step-risers', {}, CATCH_UP);
      const branch = branchIds(treeRows(demo), 'retail-1');
      expect(branch.length).toBeGreaterThan(1);
      // open the branch's first row, then select its whole branch
      await user.click(within(screen.getByTestId('segment-retail-1')).getByRole('button', { name: `Open ${nameOf('retail-1')}` }));
      await user.click(screen.getByRole('button', { name: `Select the branch of ${nameOf('retail-1')}` }));
      const bar = screen.getByTestId('bulk-bar');
      expect(within(bar).getByTestId('bulk-count').textContent).toContain(`${branch.length} selected`);
      await user.selectOptions(within(bar).getByLabelText('Material for the selection'), 'copper-k');
      await user.click(within(bar).getByRole('button', { name: 'Set material' }));

      const expected = setMaterial(demo, branch, 'copper-k');
      for (const id of branch) expect(field(`${nameOf(id)} material`).value).toBe('copper-k');
      // the sizes are kept where the new material has them
      for (const id of branch) expect(expected.segments.find((s) => s.id === id)!.size).toBe(seg(id).size);
      await waitFor(() => expect(shownMargin()).toBe(expectedMarginText(expected)), CATCH_UP);
      await waitFor(() => expect(world.saves().length).toBeGreaterThan(0), SAVE_WAIT);
      const saved = (world.saves().at(-1)!.body as { document: SystemDocument }).document;
      for (const id of branch) expect(saved.segments.find((s) => s.id === id)!.material).toBe('copper-k');
      // nothing outside the branch changed
      for (const s of demo.segments.filter((x) => !branch.includes(x.id))) expect(saved.segments.find((t) => t.id === s.id)!.material).toBe(s.material);
    },
  );

  it('when a branch is collapsed, then its segments leave the list with their count shown, and expanding brings them back', { timeout: 120_000 }, async () => {
    const world = fakeApi();
    const { user } = await renderWalk(world, stepHref(world, 'risers'));
    await screen.findByTestId('step-risers', {}, CATCH_UP);
    const rows = treeRows(demo);
    const floor2 = rows.find((r) => r.id === 'floor-2')!;
    const below = branchIds(rows, 'floor-2').slice(1);
    expect(below).toHaveLength(floor2.below);
    const toggle = within(screen.getByTestId('segment-floor-2')).getByRole('button', { name: `Collapse the branch of ${floor2.name} (${floor2.below} below)` });
    await user.click(toggle);
    for (const id of below) expect(screen.queryByTestId(`segment-${id}`)).toBeNull();
    expect(within(screen.getByTestId('segment-floor-2')).getByTestId('hidden-count').textContent).toBe(`+${floor2.below}`);
    expect(screen.getByTestId('tree-counts').textContent).toBe(`${rows.length} segments, ${rows.length - floor2.below} shown`);
    // the rest of the tree is still there
    expect(screen.getByTestId('segment-riser-3')).toBeTruthy();
    await user.click(
      within(screen.getByTestId('segment-floor-2')).getByRole('button', { name: `Expand the branch of ${floor2.name} (${floor2.below} below)` }),
    );
    for (const id of below) expect(screen.getByTestId(`segment-${id}`)).toBeTruthy();
  });
});

describe('a device from a row', () => {
  it(
    'when a device template is added on the open row’s segment, then the draft carries it on that segment and the margin is the engine’s with it',
    { timeout: 120_000 },
    async () => {
      const world = fakeApi();
      const { user } = await renderWalk(world, stepHref(world, 'risers'));
      await screen.findByTestId('step-risers', {}, CATCH_UP);
      const first = treeRows(demo)[0];
      const detail = screen.getByTestId(`segment-detail-${first.id}`);
      await user.click(within(detail).getByRole('button', { name: 'Add this device here' }));
      await waitFor(() => expect(world.saves().length).toBeGreaterThan(0), SAVE_WAIT);
      const saved = (world.saves().at(-1)!.body as { document: SystemDocument }).document;
      expect(saved.devices).toHaveLength(demo.devices.length + 1);
      const added = saved.devices.at(-1)!;
      expect(added.segmentId).toBe(first.id);
      expect(added.loss.kind).toBe('curve');
      expect(within(detail).getByTestId(`devices-on-${first.id}`).textContent).toContain(added.label);
      const withDevice = expectedMarginText(saved);
      expect(withDevice).not.toBe(expectedMarginText(demo));
      await waitFor(() => expect(shownMargin()).toBe(withDevice), CATCH_UP);
    },
  );
});

describe('the same editor with the contractor’s policy', () => {
  it('when a field change shows the tree, then material, size and length are editable and the rise is read-only with its reason; an edit reaches the document', async () => {
    const catalog = indexCatalog(
      CatalogResponse.parse({
        entries: catalogRows().map((r) => ({
          kind: r.kind,
          id: r.id,
          label: r.label,
          source: r.source,
          fromMemory: r.from_memory,
          data: JSON.parse(JSON.stringify(r.data)),
        })),
      }).entries,
    );
    const project = indexProjectCatalog([]);
    let doc = demo;
    const changes: SystemDocument[] = [];
    const onChange = (change: (d: SystemDocument) => SystemDocument) => {
      doc = change(doc);
      changes.push(doc);
    };
    const analysis = analyzeSystem(demo);
    const user = userEvent.setup();
    render(
      <TreeEditor
        label="Pipe"
        testIdPrefix="pipe"
        document={demo}
        analysis={analysis}
        baseline={{ document: demo, analysis }}
        policy={CONTRACTOR_POLICY}
        catalog={catalog}
        project={project}
        onChange={onChange}
        flagsOf={() => ({ fast: null, failing: null, missing: null })}
        initialActive={null}
      />,
    );
    const name = nameOf('dist-2');
    const rise = field(`${name} rise (${u.length})`);
    expect(rise.readOnly).toBe(true);
    expect(rise.getAttribute('title')).toBe(CONTRACTOR_POLICY.locked.rise);
    expect(rise.getAttribute('aria-description')).toBe(CONTRACTOR_POLICY.locked.rise);
    expect(field(`${name} material`).disabled).toBe(false);
    expect(field(`${name} size`).disabled).toBe(false);
    const length = field(`${name} length (${u.length})`);
    expect(length.readOnly).toBe(false);
    // a typed rise changes nothing: the cell is read-only
    await user.type(rise, '5');
    expect(changes).toHaveLength(0);
    await user.clear(length);
    await user.type(length, '42');
    expect(doc.segments.find((s) => s.id === 'dist-2')!.length).toBe(42);
    // the issued values are beside the new ones
    expect(screen.getByTestId('pipe-dist-2').textContent).toContain('Issued:');
  });
});
