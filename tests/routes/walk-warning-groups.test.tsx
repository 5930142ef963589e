/**
 * A warning repeated on many elements is one item on screen naming them, as the PDF summary lists
 * it (groupWarnings): the demo's PEX fittings raise one "another method was used" caution per
 * fitting, and the designer sees one caution per fitting kind with its count and its segments.
 */
import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { analyzeSystem } from '../../src/engine';
import { demoDocument, fakeApi } from './support/fake-api';
import { renderWalk, stepHref } from './support/render-walk';

describe('repeated warnings grouped on screen', () => {
  it('when the result step lists the demo’s warnings, then each repeated caution appears once with its count and names every segment', async () => {
    const world = fakeApi();
    await renderWalk(world, stepHref(world, 'result'));
    const lists = await screen.findAllByTestId('warning-list', {}, { timeout: 20_000 });
    const list = lists.at(-1)!;
    const analysis = analyzeSystem(demoDocument());
    const fallbacks = analysis.warnings.filter((w) => w.code === 'fitting-method-fallback');
    // the demo carries the repetition this is about: more fallback warnings than fitting kinds
    const details = new Map<string, string[]>();
    for (const w of fallbacks) details.set(w.detail ?? '', [...(details.get(w.detail ?? '') ?? []), w.elementLabel ?? '']);
    expect(fallbacks.length).toBeGreaterThan(details.size);
    const items = list.querySelectorAll<HTMLElement>('li[data-code="fitting-method-fallback"]');
    expect(items).toHaveLength(details.size);
    const shown = [...items].map((li) => ({ count: Number(li.dataset.count), text: li.textContent ?? '', li }));
    for (const [detail, labels] of details) {
      const item = shown.find((s) => s.text.includes(detail));
      expect(item, detail).toBeDefined();
      expect(item!.count).toBe(labels.length);
      if (labels.length > 1) {
        expect(item!.text).toContain(`${labels.length} places`);
        // the full list behind the disclosure names every segment, in the engine's order
        const names = within(item!.li)
          .getAllByRole('listitem')
          .map((n) => n.textContent);
        expect(names).toEqual(labels);
      }
    }
    // one item per group in the whole list: fewer items than warnings
    expect(list.querySelectorAll(':scope > li').length).toBeLessThan(analysis.warnings.length);
  }, 120_000);
});
