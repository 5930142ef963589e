import { afterAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { analyzeSystem, SystemDocumentSchema, verdictStatus, type SystemDocument } from '../../src/engine';
import { FIXTURE_TYPES } from '../../src/engine/catalog/fixtures';
import { MATERIALS } from '../../src/engine/catalog/materials';
import { FITTING_TYPES } from '../../src/engine/fittings/types';
import { NOT_VERIFIED } from '../../src/engine/catalog/notVerified';
import { renderSummaryPdf } from '../../server/pdf/summaryPdf';
import { catalogSourcesUsed, IncompleteSummaryError, summaryVerdict, warningWhere } from '../../server/pdf/summaryContent';
import { smallDocument } from './support/documents';

// The summary's content decided apart from drawing (no database). Invented systems only: the
// "Alder & Finch" demo and the small two-storey test system.

const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'headroom-content-'));
afterAll(() => fs.rmSync(tmp, { recursive: true, force: true }));

const demo = (): SystemDocument =>
  SystemDocumentSchema.parse(JSON.parse(fs.readFileSync(new URL('../../src/engine/examples/alder-finch-cold.json', import.meta.url), 'utf8')));
/** The demo with its supply cut to 25/30 psi and no flow test: fixtures beyond the booster's reach fall short. */
function weakSupply(): SystemDocument {
  const doc = demo();
  doc.source.staticPressureLow = 25;
  doc.source.staticPressureHigh = 30;
  delete doc.source.flowTest;
  return doc;
}
const ACK = { statement: 'Issued for the permit review; the booster is resized before occupancy.', by: 'Dana Reyes', at: '2026-12-02T10:00:00.000Z' };
const HEADER = {
  projectName: 'Alder & Finch',
  address: '410 Quarry Lane, Wrenmoor',
  codeBasis: '',
  systemName: 'Domestic cold water',
  revisionNumber: 3,
  issuedAt: '2026-12-02T10:00:00.000Z',
  preparerName: 'Dana Reyes',
  preparerEmail: '',
  inputHash: 'x'.repeat(64),
  note: null,
};

function pdfText(bytes: Uint8Array, args: string[] = []): string {
  const file = path.join(tmp, `${Math.random().toString(36).slice(2)}.pdf`);
  fs.writeFileSync(file, bytes);
  return execFileSync('pdftotext', [...args, file, '-'], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
}

describe('the verdict the summary states', () => {
  it('when the demo passes, then the headline is PASS and says every check is met, with no acknowledgement', () => {
    const a = analyzeSystem(demo());
    expect(verdictStatus(a)).toBe('pass');
    const v = summaryVerdict(a, null);
    expect(v).toMatchObject({ status: 'pass', word: 'PASS', headline: 'PASS: every check is met', acknowledgement: null });
  });

  it('when the revision fails, then the headline is FAIL with the number of checks not met, never "every check is met", and carries the acknowledgement', () => {
    const a = analyzeSystem(weakSupply());
    expect(verdictStatus(a)).toBe('fail');
    const v = summaryVerdict(a, ACK);
    expect(v.word).toBe('FAIL');
    expect(a.verdict.failures).toBeGreaterThan(1);
    expect(v.headline).toBe(`FAIL: ${a.verdict.failures} checks are not met`);
    expect([v.headline, ...v.lines].join(' ')).not.toContain('every check is met');
    expect(v.acknowledgement).toContain(`“${ACK.statement}”`);
    expect(v.acknowledgement).toContain(ACK.by);
    const short = a.fixtures.filter((f) => !f.pass).length;
    expect(v.lines[0]).toBe(`${short} of ${a.fixtures.length} checked fixtures fall short of their minimum flow pressure.`);
    expect(summaryVerdict(a, null).acknowledgement).toMatch(/no acknowledgement of the failure was recorded/);
  });

  it('when the analysis is incomplete, then there is no verdict to print', () => {
    const doc = SystemDocumentSchema.parse(smallDocument());
    for (const n of doc.nodes) n.checkedFixtures = [];
    const a = analyzeSystem(doc);
    expect(verdictStatus(a)).toBe('incomplete');
    expect(() => summaryVerdict(a, ACK)).toThrow(IncompleteSummaryError);
  });
});

describe('sources printed from the data used', () => {
  it('when the demo is summarised, then each catalog entry it uses is listed once with its own source words, and the unverified ones carry the note', () => {
    const doc = demo();
    const a = analyzeSystem(doc);
    const rows = catalogSourcesUsed(doc, a.criteria.fittingMethod);
    const materials = new Set(doc.segments.map((s) => s.material).filter(Boolean));
    const fittings = new Set(doc.segments.flatMap((s) => (s.fittings ?? []).filter((f) => !f.custom).map((f) => f.typeId)));
    const fixtures = new Set(
      doc.nodes.flatMap((n) => [
        ...(n.fixtureGroups ?? []).filter((g) => !g.custom).map((g) => g.fixtureTypeId),
        ...(n.checkedFixtures ?? []).map((c) => c.fixtureTypeId),
      ]),
    );
    expect(
      rows
        .filter((r) => r.kind === 'Pipe material')
        .map((r) => r.item)
        .sort(),
    ).toEqual([...materials].map((id) => MATERIALS[id as keyof typeof MATERIALS].label).sort());
    expect(rows.filter((r) => r.kind === 'Fitting type').length).toBe(fittings.size);
    expect(rows.filter((r) => r.kind === 'Fixture type').length).toBe(fixtures.size);
    for (const id of fixtures) {
      const row = rows.find((r) => r.kind === 'Fixture type' && r.item === FIXTURE_TYPES[id].label)!;
      expect(row.source.startsWith(FIXTURE_TYPES[id].source)).toBe(true);
      expect(row.verified).toBe(FIXTURE_TYPES[id].verified);
    }
    for (const id of materials) {
      const m = MATERIALS[id as keyof typeof MATERIALS];
      const row = rows.find((r) => r.item === m.label)!;
      for (const s of [m.dimensionSource, m.roughnessSource, m.hazenWilliamsSource]) expect(row.source).toContain(s);
    }
    for (const r of rows) {
      expect(r.source.includes(NOT_VERIFIED), `${r.kind} ${r.item}`).toBe(!r.verified);
      expect(r.source).not.toMatch(/from memory/i);
    }
    // the demo uses at least one unverified entry, so the check above covers both branches
    expect(rows.some((r) => !r.verified)).toBe(true);
    expect(rows.some((r) => r.verified)).toBe(true);
  });

  it('when fittings are listed, then only the source lines of the loss method used are printed', () => {
    const doc = demo();
    const method = analyzeSystem(doc).criteria.fittingMethod;
    const rows = catalogSourcesUsed(doc, method).filter((r) => r.kind === 'Fitting type');
    const others = ['crane', 'hooper-2k', 'darby-3k', 'equivalent-length'].filter((m) => m !== method);
    for (const r of rows) {
      const entry = Object.values(FITTING_TYPES).find((f) => f.label === r.item)!;
      const own = entry.sources.filter((line) => line.startsWith(`${method}:`));
      if (own.length === 0) {
        // no data for the method used (the PEX fittings publish only equivalent lengths): the
        // analysis falls back, and the lines of the data it fell back to are the ones printed
        for (const line of entry.sources) expect(r.source).toContain(line);
        continue;
      }
      for (const m of others) expect(r.source, r.item).not.toContain(`${m}:`);
      for (const line of own) expect(r.source).toContain(line);
    }
  });
});

describe('names, not internal ids', () => {
  it("when the demo's warnings are placed, then each names a typed label, never an element's internal id", () => {
    const doc = demo();
    const a = analyzeSystem(doc);
    expect(a.warnings.length).toBeGreaterThan(0);
    const ids = new Set([...doc.segments.map((s) => s.id), ...doc.nodes.map((n) => n.id), ...doc.devices.map((d) => d.id), ...a.fixtures.map((f) => f.id)]);
    for (const w of a.warnings) {
      const where = warningWhere(w, a, doc);
      expect(ids.has(where), `${w.code} → ${where}`).toBe(false);
      for (const id of w.elementIds ?? (w.elementId ? [w.elementId] : [])) expect(where.split(/[,:] /)).not.toContain(id);
    }
  });

  it('when a warning carries an elementLabel, then that label is where it applies', () => {
    const doc = demo();
    const a = analyzeSystem(doc);
    const w = { ...a.warnings[0], elementIds: undefined, elementLabel: 'Riser R2 between level 3 and level 4' };
    expect(warningWhere(w, a, doc)).toBe('Riser R2 between level 3 and level 4');
  });
});

describe('the drawn summary', () => {
  it('when a failing revision is drawn, then its first line is the FAIL headline and the acknowledgement follows', async () => {
    const doc = weakSupply();
    const a = analyzeSystem(doc);
    const { bytes } = await renderSummaryPdf({ header: HEADER, document: doc, analysis: a, failureAcknowledgement: ACK });
    const plain = pdfText(bytes);
    expect(
      plain
        .split('\n')
        .find((l) => l.trim())!
        .trim(),
    ).toMatch(/^FAIL · Alder & Finch/);
    const flat = pdfText(bytes, ['-layout']).replace(/\s+/g, ' ');
    expect(flat).toContain(`FAIL: ${a.verdict.failures} checks are not met`);
    expect(flat).toContain(ACK.statement);
    expect(flat).not.toContain('every check is met');
  });

  it('when a name holds characters the font cannot show, then the summary says which, by code point', async () => {
    const doc = demo();
    const { bytes } = await renderSummaryPdf({ header: { ...HEADER, projectName: 'Alder & Finch 赤松' }, document: doc, analysis: analyzeSystem(doc) });
    const flat = pdfText(bytes, ['-layout']).replace(/\s+/g, ' ');
    expect(flat).toContain('Characters not shown');
    expect(flat).toContain('U+8D64');
    expect(flat).toContain('U+677E');
  });

  it('when every name is in the font, then no characters-not-shown note is printed', async () => {
    const doc = demo();
    const { bytes } = await renderSummaryPdf({ header: HEADER, document: doc, analysis: analyzeSystem(doc) });
    expect(pdfText(bytes)).not.toContain('Characters not shown');
  });
});

describe('the pressure zones in the printed summary', () => {
  it('when the demo (a booster and PRVs) is summarised, then the PDF has a zones section naming every zone with its verdict in words', async () => {
    const doc = demo();
    const a = analyzeSystem(doc);
    const { bytes } = await renderSummaryPdf({ header: HEADER, document: doc, analysis: a });
    const flat = pdfText(bytes, ['-raw']).replace(/\s+/g, ' ');
    expect(flat).toContain('Pressure zones');
    const zones = a.zones!;
    expect(zones.length).toBeGreaterThan(1);
    // table cells wrap: compare words, not the line breaks pdftotext chose
    for (const z of zones) for (const word of z.name.split(' ').filter((w) => w.length > 3)) expect(flat).toContain(word);
    expect(flat).toContain(`Passes: ${zones[1].checkedFixtures} fixtures`);
    // the riser diagram marks each boundary in words
    expect(flat).toContain('Zone 2 starts');
  });

  it('when a system has no PRV or booster, then the summary says the whole system is one zone', async () => {
    const doc = SystemDocumentSchema.parse(smallDocument());
    doc.devices = doc.devices.filter((d) => d.kind !== 'prv' && d.kind !== 'booster-pump');
    const a = analyzeSystem(doc);
    expect(verdictStatus(a)).not.toBe('incomplete');
    const { bytes } = await renderSummaryPdf({ header: HEADER, document: doc, analysis: a, failureAcknowledgement: ACK });
    const flat = pdfText(bytes, ['-raw']).replace(/\s+/g, ' ');
    expect(flat).toContain('the whole system is one zone');
  });
});
