import { afterAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { analyzeSystem, applyFedFrom, SystemDocumentSchema, type SystemDocument } from '../../src/engine';
import { renderSummaryPdf } from '../../server/pdf/summaryPdf';
import { fedFromText } from '../../server/pdf/summaryContent';
import { withUnit } from '../../src/shared/format/quantity';

// The summary of a hot system fed from a cold one (no database): the invented "Alder & Finch" demo systems.

const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'headroom-hot-'));
afterAll(() => fs.rmSync(tmp, { recursive: true, force: true }));
const example = (name: string): SystemDocument =>
  SystemDocumentSchema.parse(JSON.parse(fs.readFileSync(new URL(`../../src/engine/examples/${name}.json`, import.meta.url), 'utf8')));
const HEADER = {
  projectName: 'Alder & Finch',
  address: '410 Quarry Lane, Wrenmoor',
  codeBasis: '',
  systemName: 'Domestic hot water',
  revisionNumber: 2,
  issuedAt: '2026-12-02T10:00:00.000Z',
  preparerName: 'Dana Reyes',
  preparerEmail: '',
  inputHash: 'x'.repeat(64),
  note: null,
};

function fedHot(): SystemDocument {
  const cold = example('alder-finch-cold');
  const hot = example('alder-finch-hot');
  hot.source.fedFrom = { systemId: 'cold-system', nodeId: 'heater-feed' };
  return applyFedFrom(hot, {
    systemId: 'cold-system',
    name: 'Domestic cold water',
    service: 'cold',
    revision: { number: 4, status: 'issued', analysis: { ok: true, analysis: analyzeSystem(cold) } },
  });
}

describe("the summary names a hot system's source", () => {
  it('when the demo hot system is fed from the demo cold system at its heater feed, then the PDF says from which system, node and revision, with the figures read there', async () => {
    const doc = fedHot();
    const r = doc.source.fedFrom!.resolution!;
    if (r.status !== 'resolved') throw new Error(`expected resolved, got ${JSON.stringify(r)}`);
    const { bytes } = await renderSummaryPdf({ header: HEADER, document: doc, analysis: analyzeSystem(doc) });
    const file = path.join(tmp, 'hot.pdf');
    fs.writeFileSync(file, bytes);
    const text = execFileSync('pdftotext', [file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
    expect(text).toContain('Hot water fed from');
    expect(text).toContain('the cold-water system "Domestic cold water"');
    expect(text).toContain('revision 4 (issued)');
    expect(text).toContain(`residual ${withUnit(r.residualPressure, 'psi')}`);
    console.log(fedFromText(doc, 'psi'));
  });

  it('when a document is not fed from a system, then no line is added; when unresolved, then the line says it was not read', () => {
    expect(fedFromText(example('alder-finch-hot'), 'psi')).toBeNull();
    const doc = example('alder-finch-hot');
    doc.source.fedFrom = { systemId: 'x', nodeId: 'y' };
    expect(fedFromText(applyFedFrom(doc, null), 'psi')).toMatch(/^NOT READ — The cold-water system this hot system is fed from is not in the project/);
  });
});

describe("the summary shows the hot system's recirculation loop", () => {
  it('when the demo hot system describes a loop up its riser and back, then the PDF prints the loop flow, the pump head and the return sizes, as the analysis has them', async () => {
    const doc = example('alder-finch-hot');
    // Invented loop: out along the hot distribution to the riser at level 2, back by a return to the heater.
    doc.recirculation = {
      segments: [
        { id: 'rc-out-1', label: 'Heater to mixing valve', from: 'heater', to: 'tmv-out', length: 12, material: 'copper-l', size: '2' },
        { id: 'rc-out-2', label: 'Distribution to riser base', from: 'tmv-out', to: 'riser-base', length: 35, material: 'copper-l', size: '2' },
        { id: 'rc-out-3', label: 'Riser to level 2', from: 'riser-base', to: 'hr2', length: 16, material: 'copper-l', size: '2-1/2' },
        { id: 'rc-ret-1', label: 'Return down to level 1', from: 'hr2', to: 'ret-base', length: 16, material: 'copper-l' },
        { id: 'rc-ret-2', label: 'Return to the heater', from: 'ret-base', to: 'heater', length: 50, material: 'copper-l' },
      ],
      heatLossPerLength: 25,
      temperatureDrop: 10,
    };
    const a = analyzeSystem(doc);
    const r = a.recirculation;
    if (!r?.ok) throw new Error(`expected a computed loop, got ${JSON.stringify(r)}`);
    const { bytes } = await renderSummaryPdf({ header: HEADER, document: doc, analysis: a });
    const file = path.join(tmp, 'hot-loop.pdf');
    fs.writeFileSync(file, bytes);
    const text = execFileSync('pdftotext', [file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
    expect(text).toContain('Hot-water recirculation');
    // pdftotext reads the label column before the values: each is looked for on its own.
    expect(text).toContain('Loop flow = pump flow');
    expect(text).toContain(withUnit(r.pumpFlow, 'gpm', 'loop flow'));
    expect(text).toContain(`${withUnit(r.pumpHead, 'psi')} (${withUnit(r.pumpHeadLength, 'ft')} of water)`);
    for (const p of r.pipes.filter((x) => x.sizeChosen)) expect(text).toContain(`${p.size} (chosen, return)`);
    expect(text).toContain('Rinnai design manual R-TRWH-E-02');
    console.log(
      `demo loop: ${r.pumpFlow.toFixed(2)} gpm at ${r.pumpHead.toFixed(2)} psi (${r.pumpHeadLength.toFixed(1)} ft); returns ${r.pipes
        .filter((x) => x.sizeChosen)
        .map((x) => x.size)
        .join(', ')}`,
    );
  });

  it('when the hot system describes no loop, then the summary has no recirculation part', async () => {
    const doc = example('alder-finch-hot');
    const { bytes } = await renderSummaryPdf({ header: HEADER, document: doc, analysis: analyzeSystem(doc) });
    const file = path.join(tmp, 'hot-no-loop.pdf');
    fs.writeFileSync(file, bytes);
    expect(execFileSync('pdftotext', [file, '-'], { encoding: 'utf8' })).not.toContain('Hot-water recirculation');
  });
});
