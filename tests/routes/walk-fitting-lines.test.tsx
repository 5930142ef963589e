/**
 * The fittings step on a copper segment: its soldered elbows and couplings can be changed to another
 * fitting line (push-to-connect brass, published at 3/4 only), keeping the tee, and the change is
 * what the draft saves. On a PEX segment still carrying metal fittings, only the PEX lines published
 * at its size are offered, and each other line is named with the sizes it has. A small invented
 * system, not the demo (which has no 3/4 copper).
 */
import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { SystemDocumentSchema, type SystemDocument } from '../../src/engine/model/schema';
import { AUTOSAVE_DELAY_MS } from '../../src/features/walk/draft/use-draft';
import { PEX_LINES } from '../../src/engine/fittings';
import { oneSegment } from '../engine/support/docs';
import { fakeApi } from './support/fake-api';
import { renderWalk, stepHref } from './support/render-walk';

const SAVE_WAIT = { timeout: AUTOSAVE_DELAY_MS + 8_000 };

function copperDoc(size: string, material = 'copper-l'): SystemDocument {
  const input = oneSegment();
  input.segments[0].material = material;
  input.segments[0].size = size;
  input.segments[0].fittings = [
    { typeId: 'elbow-90-standard', count: 2 },
    { typeId: 'tee-run', count: 1 },
    { typeId: 'coupling', count: 3 },
  ];
  return SystemDocumentSchema.parse(input) as SystemDocument;
}

describe('a copper segment’s fitting line', () => {
  it('when the push-fit line is chosen on a 3/4 copper segment, then its elbows and couplings change, the tee stays, and that is saved', async () => {
    const world = fakeApi({ document: copperDoc('3/4') });
    const { user } = await renderWalk(world, stepHref(world, 'fittings'));
    await screen.findByTestId('step-fittings', {}, { timeout: 10_000 });
    // the first row is open when the step opens
    const panel = await screen.findByTestId('copper-line-s1', {}, { timeout: 10_000 });
    const choice = within(panel).getByRole<HTMLSelectElement>('combobox', { name: 's1: copper fitting line' });
    expect(choice.selectedOptions[0].textContent).toMatch(/^Push-to-connect fitting \(lead-free brass\), 3\/4 in/);
    await user.click(within(panel).getByRole('button', { name: 'Use this line’s fittings on s1' }));
    await waitFor(() => expect(world.saves().length).toBeGreaterThan(0), SAVE_WAIT);
    const saved = (world.saves().at(-1)!.body as { document: SystemDocument }).document;
    expect(saved.segments[0].fittings.map((f) => [f.typeId, f.count])).toEqual([
      ['push-brass-elbow-90', 2],
      ['tee-run', 1],
      ['push-brass-coupling', 3],
    ]);
  });

  it('when the copper segment is 1 in, a size the line was not published for, then no line is offered', async () => {
    const world = fakeApi({ document: copperDoc('1') });
    await renderWalk(world, stepHref(world, 'fittings'));
    await screen.findByTestId('step-fittings', {}, { timeout: 10_000 });
    await screen.findByRole('combobox', { name: 's1: fitting 1 type' }, { timeout: 10_000 });
    expect(screen.queryByTestId('copper-line-s1')).toBeNull();
  });
});

describe('a PEX segment still carrying metal fittings', () => {
  // The PEX lines' published sizes (fittings/types.ts, the maker's equivalent-length table): the insert
  // lines 1/2–1 in, the press lines 1/2–2 in. 1-1/4 is a PEX SDR 9 size only the press lines cover.
  const line = (id: string) => PEX_LINES.find((l) => l.id === id)!;

  it('when the PEX segment is 1-1/4 in, then only the press lines are offered, the insert lines are named as not published there, and the choice is saved', async () => {
    const world = fakeApi({ document: copperDoc('1-1/4', 'pex-sdr9') });
    const { user } = await renderWalk(world, stepHref(world, 'fittings'));
    await screen.findByTestId('step-fittings', {}, { timeout: 10_000 });
    const panel = await screen.findByTestId('pex-substitute-s1', {}, { timeout: 10_000 });
    const choice = within(panel).getByRole<HTMLSelectElement>('combobox', { name: 's1: PEX fitting line' });
    expect([...choice.options].map((o) => o.value)).toEqual(['press-bronze', 'press-polymer']);
    const missing = within(panel).getByRole('list', { name: 'PEX fitting lines not offered for s1' });
    expect(
      within(missing)
        .getAllByRole('listitem')
        .map((li) => li.textContent),
    ).toEqual([
      `${line('insert-brass').label}: no published data at 1-1/4 in (published 1/2–1 in)`,
      `${line('insert-polymer').label}: no published data at 1-1/4 in (published 1/2–1 in)`,
    ]);
    await user.selectOptions(choice, 'press-polymer');
    await user.click(within(panel).getByRole('button', { name: 'Use these PEX fittings on s1' }));
    await waitFor(() => expect(world.saves().length).toBeGreaterThan(0), SAVE_WAIT);
    const saved = (world.saves().at(-1)!.body as { document: SystemDocument }).document;
    expect(saved.segments[0].fittings.map((f) => [f.typeId, f.count])).toEqual([
      ['pex-press-polymer-elbow-90', 2],
      ['pex-press-polymer-tee-run', 1],
      ['pex-press-polymer-coupling', 3],
    ]);
  });

  it('when the PEX segment is 3/8 in, a size no line was published for, then no line is offered and each is named as not published there', async () => {
    const world = fakeApi({ document: copperDoc('3/8', 'pex-sdr9') });
    await renderWalk(world, stepHref(world, 'fittings'));
    await screen.findByTestId('step-fittings', {}, { timeout: 10_000 });
    const panel = await screen.findByTestId('pex-substitute-s1', {}, { timeout: 10_000 });
    expect(within(panel).queryByRole('combobox')).toBeNull();
    expect(panel.textContent).toContain('No PEX fitting line has published data at 3/8 in');
    const missing = within(panel).getByRole('list', { name: 'PEX fitting lines not offered for s1' });
    expect(within(missing).getAllByRole('listitem')).toHaveLength(PEX_LINES.length);
  });
});
