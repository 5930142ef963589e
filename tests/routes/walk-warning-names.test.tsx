/**
 * Warnings on screen name what they are about by the labels the designer typed, never by internal
 * ids (the demo's devices and segments have ids such as "prv-heater" and labels in plain words).
 */
import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { analyzeSystem } from '../../src/engine';
import { demoDocument, fakeApi } from './support/fake-api';
import { renderWalk, stepHref } from './support/render-walk';

describe('warnings in plain words', () => {
  it('when the result step lists the demo’s warnings, then each names its element by label and no internal id is shown', async () => {
    const world = fakeApi();
    await renderWalk(world, stepHref(world, 'result'));
    const lists = await screen.findAllByTestId('warning-list', {}, { timeout: 20_000 });
    const text = lists.map((l) => l.textContent ?? '').join('\n');
    const analysis = analyzeSystem(demoDocument());
    const labelled = analysis.warnings.filter((w) => w.elementLabel && !(w.elementIds && w.elementIds.length > 1));
    expect(labelled.length).toBeGreaterThan(0);
    for (const w of labelled) expect(text).toContain(w.elementLabel!);
    // ids that differ from their labels never appear
    for (const w of labelled) {
      if (w.elementId && w.elementId !== w.elementLabel && /^[a-z0-9]+(-[a-z0-9]+)+$/.test(w.elementId))
        expect(text).not.toMatch(new RegExp(`(^|\\s)${w.elementId}(\\s|,|$)`));
    }
  }, 120_000);
});
