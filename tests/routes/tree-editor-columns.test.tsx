/**
 * The tree editor's editing columns are named as the segment's description names the key each
 * writes (src/engine/model/elements.ts): the header is the key's short name (or its label) with the
 * unit of its range in the document's unit system, a cell's accessible name is its row's name with
 * the same words, and the key's help is the header's title and each cell's description. Read here
 * from the description itself, apart from the editor's code: a header written by hand, or a
 * description whose words change without the screen, fails.
 */
import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { fieldUnit, type SystemDocument } from '../../src/engine';
import { convertDocumentUnits } from '../../src/engine/building/convertUnits';
import { SEGMENT } from '../../src/engine/model/elements';
import { treeRows } from '../../src/features/tree-editor/model';
import { columnKey, DESCRIBED_COLUMNS } from '../../src/features/tree-editor/columns';
import { demoDocument, fakeApi } from './support/fake-api';
import { field, renderWalk, stepHref } from './support/render-walk';

const LOADED = { timeout: 15_000 };

/** The segment keys the editor's columns write, as the description says (its `editor` lists). */
function writers(column: string): string[] {
  return Object.entries(SEGMENT.keys)
    .filter(([, d]) => d.editor?.includes(column))
    .map(([key]) => key);
}

describe('the tree editor’s column headers read the segment’s description', () => {
  it('when the description is read, then each editing column has one key written by it alone', () => {
    // `custom` is written by the material and size columns together: it names neither
    expect(writers('material').sort()).toEqual(['custom', 'material']);
    expect(DESCRIBED_COLUMNS.map((c) => columnKey(c))).toEqual(['label', 'material', 'size', 'length', 'rise', 'fittings']);
  });

  it.each(['US', 'SI'] as const)(
    'when the pipe step of the demo in %s units is opened, then each editing column’s header, its cells’ names and help are the description’s',
    async (sys) => {
      const demo = demoDocument();
      const doc = (sys === demo.unitSystem ? demo : convertDocumentUnits(demo, sys)) as SystemDocument;
      const world = fakeApi({ document: doc });
      await renderWalk(world, stepHref(world, 'risers'));
      const grid = await screen.findByTestId('tree-editor', {}, LOADED);
      const headers = [...grid.querySelectorAll('[role="columnheader"]')];
      const headerText = (h: Element) =>
        [...h.childNodes]
          .filter((n) => !(n instanceof HTMLElement && n.hidden))
          .map((n) => n.textContent)
          .join('');
      const first = treeRows(doc)[0];
      for (const column of DESCRIBED_COLUMNS) {
        const key = columnKey(column);
        const d = SEGMENT.keys[key];
        const unit = d.range ? fieldUnit(d.range, sys) : '';
        // the name column is headed by what its rows are (the element's name), its cells are "Open <segment>" buttons
        const words = column === 'name' ? 'Segment' : (d.short ?? d.label);
        const want = unit ? `${words} (${unit})` : words;
        const header = headers.find((h) => headerText(h) === want);
        expect(header, `${column} column headed "${want}"`).toBeTruthy();
        if (d.help) expect(header!.getAttribute('title')).toBe(d.help);
        if (column === 'material' || column === 'size' || column === 'length' || column === 'rise') {
          const inRow = words.charAt(0).toLowerCase() + words.slice(1);
          const cell = field(`${first.name} ${inRow}${unit ? ` (${unit})` : ''}`);
          const described = (cell.getAttribute('aria-describedby') ?? '').split(' ').filter(Boolean);
          if (d.help) expect(described.map((id) => document.getElementById(id)?.textContent)).toContain(d.help);
        }
      }
      // the words as the screen had them before they were read from the description
      const lengthUnit = sys === 'US' ? 'ft' : 'm';
      for (const want of ['Segment', 'Material', 'Size', `Length (${lengthUnit})`, `Rise (${lengthUnit})`, 'Fittings'])
        expect(headers.map(headerText)).toContain(want);
      expect(world.unknown).toEqual([]);
    },
    120_000,
  );
});
