/**
 * One number format for screen and paper: the demo's critical fixture (the invented "Alder & Finch",
 * src/engine/examples/alder-finch-cold.json) reads the same on the result step and in the issued
 * summary's model — its residual, its margin and the signed losses of its ledger, minus signs
 * included. Both sides format the engine's own analysis of the same document; no number is written here.
 */
import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { analyzeSystem, ledgerFor } from '../../src/engine';
import { MINUS } from '../../src/shared/format/quantity';
import { summaryVerdict } from '../../server/pdf/summaryContent';
import { fixtureLedgers } from '../../server/pdf/summaryTables';
import { demoDocument, fakeApi } from './support/fake-api';
import { renderWalk, stepHref } from './support/render-walk';

const CATCH_UP = { timeout: 15_000 };

describe('the same value prints the same string on the screen and on paper', () => {
  it('when the demo’s result step is open, then the critical fixture’s residual, margin and ledger losses read as the summary prints them', async () => {
    const doc = demoDocument();
    const a = analyzeSystem(doc);
    const u = a.units.pressure;
    const critical = a.fixtures.find((f) => f.id === a.criticalFixtureId)!;
    const world = fakeApi();
    await renderWalk(world, stepHref(world, 'result'));
    const row = await screen.findByTestId(`verdict-${critical.id}`, {}, CATCH_UP);

    // the screen: the verdict table's residual and margin cells, the live panel's margin and ledger
    const cells = within(row).getAllByRole('cell');
    const screenResidual = cells[1].textContent;
    const screenMargin = screen.getByTestId(`margin-${critical.id}`).textContent;
    expect(screen.getByTestId('critical-fixture').textContent).toBe(critical.label);
    const liveMargin = screen.getByTestId('live-margin').textContent?.replace(/\s+/g, ' ').trim();
    const ledgerRows = within(within(screen.getByTestId('ledger-panel')).getByTestId('ledger-table'))
      .getAllByRole('row')
      .slice(1);

    // the paper: the summary's verdict lines and the critical fixture's ledger (server/pdf models)
    const verdictLine = summaryVerdict(a, null).lines.find((l) => l.startsWith('Critical fixture'))!;
    const paperLedger = fixtureLedgers(a, doc).find((l) => l.fixtureId === critical.id)!;

    expect(verdictLine).toContain(`${critical.label}, residual ${screenResidual} ${u},`);
    expect(verdictLine).toContain(`margin ${screenMargin} ${u}.`);
    expect(paperLedger.residual).toBe(screenResidual);
    expect(paperLedger.margin).toBe(screenMargin);
    expect(liveMargin).toBe(`${paperLedger.margin} ${u}`);

    // the losses are negative: the same minus sign (U+2212) on both, never a hyphen
    const lines = ledgerFor(a, critical.id).lines;
    const paperBySegment = new Map(paperLedger.rows.map((r) => [r.segment, r]));
    let compared = 0;
    lines.forEach((line, i) => {
      if (line.kind !== 'friction' || !line.segmentId) return;
      const segment = a.segments.find((s) => s.id === line.segmentId)!;
      const paper = paperBySegment.get(segment.label ?? segment.id);
      if (!paper) return; // carried from an earlier ledger of the appendix
      const shownChange = within(ledgerRows[i]).getAllByRole('cell')[0].textContent;
      expect(shownChange, `friction of ${paper.segment}`).toBe(paper.friction);
      if (line.change < 0 && paper.friction !== '0.00') expect(shownChange?.startsWith(MINUS)).toBe(true);
      compared++;
    });
    expect(compared).toBeGreaterThan(0);
  }, 60_000);
});
