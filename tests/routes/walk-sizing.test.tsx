/**
 * Automatic sizing on the result step, through the walk's real routes: on a draft whose risers
 * were drawn too small, "Size the pipes" answers with the engine's sizing, nothing changes until
 * "Apply to draft", which is one change of the draft (saved as any edit), and "Undo sizing" takes
 * it back. The expected sizes come from the engine run here on the same document.
 */
import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { analyzeSystem, sizeSystem, SystemDocumentSchema } from '../../src/engine';
import type { SystemDocument } from '../../src/engine';
import { AUTOSAVE_DELAY_MS } from '../../src/features/walk/draft/use-draft';
import { apartmentBuildingDocument } from '../../src/engine/building/apartmentBuilding';
import { demoDocument, fakeApi } from './support/fake-api';
import type { FakeApi } from './support/fake-api';
import { renderWalk, stepHref } from './support/render-walk';

/** The demo with every riser segment at 1 in: several fixtures fail and the risers are too fast. */
function undersized(): SystemDocument {
  const doc = demoDocument();
  return { ...doc, segments: doc.segments.map((s) => (s.id.startsWith('riser-') ? { ...s, size: '1' } : s)) };
}

const SAVE_WAIT = { timeout: AUTOSAVE_DELAY_MS + 10_000 };
const CATCH_UP = { timeout: 20_000 };
const sizesOf = (doc: SystemDocument) => Object.fromEntries(doc.segments.map((s) => [s.id, s.size ?? null]));
const lastSaved = (world: FakeApi) => (world.saves().at(-1)!.body as { document: SystemDocument }).document;
const verdictText = () => screen.getByTestId('overall-verdict').textContent ?? '';

describe('automatic sizing on the result step', () => {
  it('when the designer sizes, applies and undoes, then the draft takes the sizes in one change and gives them back', async () => {
    const start = undersized();
    const before = analyzeSystem(start);
    expect(before.verdict.status).toBe('fail');
    const expected = sizeSystem(start);
    expect(expected.feasible).toBe(true);

    const world = fakeApi({ document: start });
    const { user } = await renderWalk(world, stepHref(world, 'result'));
    await screen.findByTestId('sizing-panel', {}, { timeout: 20_000 });
    expect(verdictText()).toMatch(/fail/);

    await user.click(screen.getByRole('button', { name: 'Size the pipes' }));
    const answer = await screen.findByTestId('sizing-answer', {}, CATCH_UP);
    expect(answer.getAttribute('data-feasible')).toBe('yes');
    const changed = expected.segments.filter((s) => s.before !== s.after);
    expect(screen.getByTestId('sizing-summary').textContent).toContain(`${changed.length} segments change size.`);
    // a riser row says what it becomes, as the engine chose
    const riser = changed.find((s) => s.segmentId.startsWith('riser-'))!;
    expect(screen.getByTestId(`sizing-after-${riser.segmentId}`).textContent).toContain(`${riser.before} → ${riser.after}`);
    // the hand check of the model codes' method is shown with the answer
    expect(screen.getByTestId('friction-budget').textContent).toContain(expected.frictionBudget!.label);
    // nothing has changed yet: no save, the verdict still fails
    expect(world.saves()).toHaveLength(0);
    expect(verdictText()).toMatch(/fail/);

    await user.click(screen.getByRole('button', { name: 'Apply to draft' }));
    await waitFor(() => expect(verdictText()).toMatch(/Every check passes/), CATCH_UP);
    expect(within(screen.getByTestId('sizing-applied')).getByText(`Applied: ${changed.length} sizes changed in the draft.`)).toBeTruthy();
    await waitFor(() => expect(world.saves()).toHaveLength(1), SAVE_WAIT);
    expect(sizesOf(lastSaved(world))).toEqual(sizesOf(expected.document!));
    // the draft records what the sizing met, and everything else but the sizes is as it was
    const saved = lastSaved(world);
    expect(saved.sizingBasis?.segmentsChanged).toBe(changed.length);
    expect(saved.sizingBasis?.scope).toBe('system');
    const strip = (doc: SystemDocument) => ({ ...doc, sizingBasis: undefined, segments: doc.segments.map((s) => ({ ...s, size: undefined })) });
    expect(JSON.parse(JSON.stringify(strip(saved)))).toEqual(JSON.parse(JSON.stringify(strip(start))));

    await user.click(screen.getByRole('button', { name: 'Undo sizing' }));
    await waitFor(() => expect(verdictText()).toMatch(/fail/), CATCH_UP);
    await waitFor(() => expect(world.saves()).toHaveLength(2), SAVE_WAIT);
    expect(sizesOf(lastSaved(world))).toEqual(sizesOf(start));
    // undo takes the record back with the sizes
    expect(lastSaved(world).sizingBasis).toEqual(start.sizingBasis);
    expect(world.unknown).toEqual([]);
  });

  it('when a segment is locked in the panel, then the lock is saved in the draft and the answer asks to size again', async () => {
    const world = fakeApi({ document: undersized() });
    const { user } = await renderWalk(world, stepHref(world, 'result'));
    await screen.findByTestId('sizing-panel', {}, { timeout: 20_000 });
    await user.click(screen.getByRole('button', { name: 'Size the pipes' }));
    await screen.findByTestId('sizing-answer', {}, CATCH_UP);
    await user.click(screen.getByLabelText('Lock the size of Building service, main to entry'));
    await screen.findByTestId('sizing-stale', {}, CATCH_UP);
    expect((screen.getByRole('button', { name: 'Apply to draft' }) as HTMLButtonElement).disabled).toBe(true);
    await waitFor(() => expect(world.saves()).toHaveLength(1), SAVE_WAIT);
    expect(lastSaved(world).segments.find((s) => s.id === 'service')!.sizeLocked).toBe(true);
    // sized again, the locked service keeps its size and says why
    await user.click(screen.getByRole('button', { name: 'Size the pipes' }));
    await waitFor(() => expect(screen.queryByTestId('sizing-stale')).toBeNull(), CATCH_UP);
    const row = await screen.findByTestId('sizing-row-service', {}, CATCH_UP);
    expect(row.textContent).toContain('Locked by the designer');
  });

  it('when a building of typical units is sized and applied, then each unit type segment is one row that applies to every placement, and the unit type takes the sizes', async () => {
    // invented example: 16 apartments of one type, on an invented 100 psi main where a sizing exists
    const built = apartmentBuildingDocument(4) as SystemDocument;
    const start: SystemDocument = { ...built, source: { ...built.source, staticPressureLow: 100, staticPressureHigh: 100 } };
    const expected = sizeSystem(start);
    expect(expected.feasible).toBe(true);
    const unitRows = expected.segments.filter((s) => s.unitType);
    const changedUnit = unitRows.filter((s) => s.before !== s.after);
    expect(changedUnit.length).toBeGreaterThan(0);
    const world = fakeApi({ document: start });
    const { user } = await renderWalk(world, stepHref(world, 'result'));
    await screen.findByTestId('sizing-panel', {}, { timeout: 20_000 });
    await user.click(screen.getByRole('button', { name: 'Size the pipes' }));
    await screen.findByTestId('sizing-answer', {}, CATCH_UP);
    // a changed unit type segment: its row names the unit type and says how many placements it applies to
    const row = changedUnit[0];
    const shown = screen.getByTestId(`sizing-row-${row.segmentId}`);
    expect(shown.textContent).toContain(`${start.unitTypes![0].name} · `);
    expect(screen.getByTestId(`sizing-applies-${row.segmentId}`).textContent).toBe('unit type segment: applies to 16 placements');
    expect(screen.getByTestId(`sizing-after-${row.segmentId}`).textContent).toContain(`${row.before} → ${row.after}`);
    // every unit segment was sized: nothing is left to say about the piping inside the units
    expect(screen.queryByTestId('sizing-unit-piping')).toBeNull();
    expect(world.saves()).toHaveLength(0);

    await user.click(screen.getByRole('button', { name: 'Apply to draft' }));
    await waitFor(() => expect(world.saves()).toHaveLength(1), SAVE_WAIT);
    const saved = lastSaved(world);
    expect(saved.unitTypes![0].segments.map((s) => s.size)).toEqual(expected.document!.unitTypes![0].segments.map((s) => s.size));
    expect(sizesOf(saved)).toEqual(sizesOf(expected.document!));
    expect(world.unknown).toEqual([]);
  });

  it('when a unit type segment is locked in the panel, then the unit type’s lock is saved in the draft, shows on its row after a reload, and sized again it keeps its size', async () => {
    // invented example: 16 apartments of one type, on an invented 100 psi main where a sizing exists
    const built = apartmentBuildingDocument(4) as SystemDocument;
    const start: SystemDocument = { ...built, source: { ...built.source, staticPressureLow: 100, staticPressureHigh: 100 } };
    const row = sizeSystem(start).segments.find((s) => s.unitType && s.before !== s.after)!;
    const { id: typeId, segmentId } = row.unitType!;
    const storedLock = (doc: SystemDocument) => doc.unitTypes!.find((t) => t.id === typeId)!.segments.find((s) => s.id === segmentId)!.sizeLocked;
    const world = fakeApi({ document: start });
    const first = await renderWalk(world, stepHref(world, 'result'));
    await screen.findByTestId('sizing-panel', {}, { timeout: 20_000 });
    await first.user.click(screen.getByRole('button', { name: 'Size the pipes' }));
    await screen.findByTestId('sizing-answer', {}, CATCH_UP);
    await first.user.click(screen.getByLabelText(`Lock the size of ${row.label}`));
    await screen.findByTestId('sizing-stale', {}, CATCH_UP);
    // one change of the draft, saved as any edit: the unit type's segment carries the lock, nothing else changed
    await waitFor(() => expect(world.saves()).toHaveLength(1), SAVE_WAIT);
    const saved = lastSaved(world);
    expect(storedLock(saved)).toBe(true);
    expect(saved.placements).toEqual(start.placements);
    expect(saved.segments.some((s) => s.sizeLocked)).toBe(false);
    first.unmount();

    // the walk opened again on the saved draft (as after a reload): sized, the row shows the stored lock
    const second = await renderWalk(world, stepHref(world, 'result'));
    await screen.findByTestId('sizing-panel', {}, { timeout: 20_000 });
    await second.user.click(screen.getByRole('button', { name: 'Size the pipes' }));
    const locked = await screen.findByTestId(`sizing-row-${row.segmentId}`, {}, CATCH_UP);
    expect(locked.textContent).toContain('Locked by the designer');
    expect(screen.getByTestId(`sizing-after-${row.segmentId}`).textContent).toContain(`${row.before} → ${row.before}`);
    expect((screen.getByLabelText(`Lock the size of ${row.label}`) as HTMLInputElement).checked).toBe(true);

    // unlocked: the key leaves the unit type, and the draft is the one first loaded (as the draft reads it: defaults written out)
    await second.user.click(screen.getByLabelText(`Lock the size of ${row.label}`));
    await waitFor(() => expect(world.saves()).toHaveLength(2), SAVE_WAIT);
    expect(storedLock(lastSaved(world))).toBeUndefined();
    expect(JSON.parse(JSON.stringify(lastSaved(world)))).toEqual(JSON.parse(JSON.stringify(SystemDocumentSchema.parse(start))));
    expect(world.unknown).toEqual([]);
  });
});
