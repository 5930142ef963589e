import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { createHash, randomUUID } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { analyzeSystem, ledgerFor, SystemDocumentSchema, type Analysis } from '../../src/engine';
import { generateBuilding } from '../../src/engine/testing/generateTree';
import { renderSummaryPdf } from '../../server/pdf/summaryPdf';
import { MARGIN } from '../../server/pdf/layout';
import { num, signed } from '../../src/shared/format/quantity';
import { SUMMARY_CAUTIONS } from '../../src/shared/api/summaries';
import { makeUser, projectWithRoles, signedIn, startHarness, type Harness } from './support/harness';
import { demoDocument, issuedSystem } from './support/smtpSink';

let h: Harness;
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'headroom-pdf-'));
beforeAll(() => {
  h = startHarness();
});
afterAll(async () => {
  await h.close();
  fs.rmSync(tmp, { recursive: true, force: true });
});

/** poppler-utils' pdftotext (Debian package poppler-utils); "-" writes to stdout. */
function pdfText(bytes: Buffer, args: string[] = []): string {
  const file = path.join(tmp, `${randomUUID()}.pdf`);
  fs.writeFileSync(file, bytes);
  return execFileSync('pdftotext', [...args, file, '-'], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
}
/** pdftotext wraps and spaces lines as it likes: compare with runs of white space made single. */
const flat = (s: string) => s.replace(/\s+/g, ' ');

/**
 * 200 segments: the generated building (2 storeys × 4 apartments = 250 segments) without 50 of
 * its fixture branches that serve no checked fixture (a tree stays a tree when leaves go).
 */
function twoHundredSegments() {
  const doc = generateBuilding({ storeys: 2, apartmentsPerStorey: 4 });
  const checkedNodes = new Set(doc.nodes.filter((n) => (n.checkedFixtures ?? []).length > 0).map((n) => n.id));
  const drop = new Set(
    doc.segments
      .filter((s) => s.id.startsWith('fb-') && !checkedNodes.has(s.to))
      .slice(0, doc.segments.length - 200)
      .map((s) => s.id),
  );
  const dropNodes = new Set(doc.segments.filter((s) => drop.has(s.id)).map((s) => s.to));
  return { ...doc, id: randomUUID(), segments: doc.segments.filter((s) => !drop.has(s.id)), nodes: doc.nodes.filter((n) => !dropNodes.has(n.id)) };
}

async function issuedWithProject(document: unknown) {
  const p = await projectWithRoles(h);
  const project = (await p.designer.get(`/api/projects/${p.projectId}`).expect(200)).body.project;
  await p.designer
    .send('PATCH', `/api/projects/${p.projectId}`, { codeBasis: 'Wrenmoor plumbing code (invented), 2024 edition', version: project.version })
    .expect(200);
  const s = await issuedSystem(p.designer, p.projectId, document);
  return { ...p, ...s };
}

describe('the issued summary PDF', () => {
  it('when a revision is issued, then its summary is ready and the PDF holds the project, the revision, every margin, the critical ledger and the cautions', async () => {
    const { designer, base, revision, project } = await issuedWithProject(demoDocument());
    const summary = (await designer.get(`${base}/summary`).expect(200)).body.summary;
    expect(summary.status).toBe('ready');
    expect(summary.sha256).toMatch(/^[0-9a-f]{64}$/);

    const res = await designer
      .get(`${base}/summary.pdf`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const bytes = res.body as Buffer;
    expect(createHash('sha256').update(bytes).digest('hex')).toBe(summary.sha256);

    const text = flat(pdfText(bytes, ['-layout']));
    expect(text).toContain(project.name);
    expect(text).toContain('12 Kiln Row, Wrenmoor');
    expect(text).toContain('Wrenmoor plumbing code (invented), 2024 edition');
    expect(text).toContain(`Revision ${revision.number}`);
    expect(text).toContain(revision.inputHash);
    const analysis = revision.analysis.analysis as Analysis;
    const u = analysis.units.pressure;
    for (const f of analysis.fixtures) expect(text, `margin of ${f.id}`).toContain(`${f.label}${f.id === analysis.criticalFixtureId ? ' (critical)' : ''}`);
    // every margin as printed in the fixture table (same formatting as the PDF: server/pdf/format.ts)
    const marginCells = text.match(/[+-]?\d+\.\d{2}(?= (pass|FAIL))/g) ?? [];
    expect(marginCells.sort()).toEqual(analysis.fixtures.map((f) => signed(f.margin, u)).sort());
    // the critical fixture's ledger, line by line
    const ledger = ledgerFor(analysis, analysis.criticalFixtureId!);
    for (const line of ledger.lines) {
      const cells =
        line.kind === 'start'
          ? `${line.step} ${line.label} ${num(line.pressureAfter, u)}`
          : `${line.step} ${line.label} ${signed(line.change, u)} ${num(line.pressureAfter, u)}`;
      expect(text, `ledger line ${line.step}`).toContain(cells);
    }
    expect(text).toContain(`Margin (pass) ${signed(ledger.margin, u)}`);
    for (const caution of SUMMARY_CAUTIONS) expect(text).toContain(flat(caution));
    // every page says which page of how many it is
    const pages = summary.pageCount as number;
    for (let i = 1; i <= pages; i++) expect(text).toContain(`Page ${i} of ${pages}`);
  });

  it('when the PDF is inspected, then Work Sans is embedded as a subset', async () => {
    const { designer, base } = await issuedWithProject(demoDocument());
    const res = await designer.get(`${base}/summary.pdf`).responseType('blob').expect(200);
    const file = path.join(tmp, 'fonts.pdf');
    fs.writeFileSync(file, res.body as Buffer);
    const fonts = execFileSync('pdffonts', [file], { encoding: 'utf8' }).split('\n').slice(2).filter(Boolean);
    expect(fonts.length).toBe(2);
    for (const line of fonts) {
      // columns: name type encoding emb sub uni object-id
      expect(line).toMatch(/^[A-Z]{6}\+WorkSans-(Regular|SemiBold)\s.*\byes\s+yes\s+yes\b/);
    }
  });

  it('when a 200-segment system is issued, then the PDF runs to several pages, repeats the segment header and keeps every word inside the margins', async () => {
    const document = twoHundredSegments();
    expect(document.segments.length).toBe(200);
    const { designer, base } = await issuedWithProject(document);
    const summary = (await designer.get(`${base}/summary`).expect(200)).body.summary;
    expect(summary.status).toBe('ready');
    expect(summary.pageCount).toBeGreaterThan(5);
    const bytes = (await designer.get(`${base}/summary.pdf`).responseType('blob').expect(200)).body as Buffer;

    const plain = pdfText(bytes);
    // the segment table goes over pages: its title repeats with "(continued)" above a repeated header
    expect((plain.match(/Segments \(continued\)/g) ?? []).length).toBeGreaterThanOrEqual(3);
    for (const s of document.segments) expect(plain, s.id).toContain(s.id);

    const bbox = pdfText(bytes, ['-bbox']);
    const pagesXml = bbox.split('<page ').slice(1);
    expect(pagesXml.length).toBe(summary.pageCount);
    let words = 0;
    for (const pageXml of pagesXml) {
      const [, w, hgt] = pageXml.match(/width="([\d.]+)" height="([\d.]+)"/)!.map(Number);
      for (const m of pageXml.matchAll(/<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)<\/word>/g)) {
        const [xMin, yMin, xMax, yMax] = m.slice(1, 5).map(Number);
        words++;
        // 0.5 pt: pdftotext rounds glyph boxes (its output has 6 decimals, the font's bounding box is wider than the advance)
        expect(xMin, `"${m[5]}" left edge`).toBeGreaterThanOrEqual(MARGIN.side - 0.5);
        expect(xMax, `"${m[5]}" right edge`).toBeLessThanOrEqual(w - MARGIN.side + 0.5);
        expect(yMin, `"${m[5]}" top`).toBeGreaterThanOrEqual(MARGIN.headerBaseline - 12);
        expect(yMax, `"${m[5]}" bottom`).toBeLessThanOrEqual(hgt - MARGIN.footerBaseline + 4);
      }
    }
    expect(words).toBeGreaterThan(2000);
  });

  it('when an issued PDF is downloaded again later, then its bytes are the same, the database refuses a change, and making it again from the same inputs gives the same bytes', async () => {
    const { designer, base, revisionId, revision, contractorUser, inspectorUser } = await issuedWithProject(demoDocument());
    const first = (await designer.get(`${base}/summary.pdf`).responseType('blob').expect(200)).body as Buffer;
    const contractor = await signedIn(h, contractorUser);
    const inspector = await signedIn(h, inspectorUser);
    const second = (await contractor.get(`${base}/summary.pdf`).responseType('blob').expect(200)).body as Buffer;
    const third = (await inspector.get(`${base}/summary.pdf`).responseType('blob').expect(200)).body as Buffer;
    expect(second.equals(first)).toBe(true);
    expect(third.equals(first)).toBe(true);
    await expect(
      h
        .db('summaries')
        .where({ revision_id: revisionId })
        .update({ pdf: Buffer.from('tampered') }),
    ).rejects.toThrow(/cannot change/);

    const row = await h.db('summaries').where({ revision_id: revisionId }).first('header');
    const att = revision.attestation;
    const attestation = { name: att.name, licenceNumber: att.licenceNumber, statement: att.statement, at: att.at };
    const again = await renderSummaryPdf({
      header: row.header,
      document: SystemDocumentSchema.parse(revision.document),
      analysis: revision.analysis.analysis,
      attestation,
    });
    expect(Buffer.from(again.bytes).equals(first)).toBe(true);
    // a designer cannot make an issued summary again
    expect((await designer.send('POST', `${base}/summary/retry`)).status).toBe(409);
  });

  it('when a draft has not been issued, then it has no summary; a non-member is told nothing', async () => {
    const p = await projectWithRoles(h);
    const created = (
      await p.designer.send('POST', `/api/projects/${p.projectId}/systems`, { name: 'Draft only', service: 'cold', document: demoDocument() }).expect(201)
    ).body;
    const base = `/api/projects/${p.projectId}/systems/${created.system.id}/revisions/${created.revision.id}`;
    expect((await p.designer.get(`${base}/summary`)).status).toBe(404);
    expect((await p.designer.get(`${base}/summary.pdf`)).status).toBe(404);
    const issued = await issuedSystem(p.designer, p.projectId, demoDocument(), 'Issued');
    const outsider = await signedIn(h, await makeUser(h.db, { accountRole: 'inspector' }));
    expect((await outsider.get(`${issued.base}/summary.pdf`)).status).toBe(404);
  });

  it('when the summary row of an issued revision is missing or pending (a crash after issuing), then the first request makes it', async () => {
    const { designer, base, revisionId } = await issuedWithProject(demoDocument());
    await h.db('summaries').where({ revision_id: revisionId }).delete();
    const summary = (await designer.get(`${base}/summary`).expect(200)).body.summary;
    expect(summary.status).toBe('ready');
    expect(summary.pageCount).toBeGreaterThan(1);
  });

  it('renders the demo summary to PNG for a person to look at (e2e-output/pdf)', async () => {
    const { designer, base } = await issuedWithProject(demoDocument());
    const bytes = (await designer.get(`${base}/summary.pdf`).responseType('blob').expect(200)).body as Buffer;
    const out = path.resolve('e2e-output/pdf');
    fs.mkdirSync(out, { recursive: true });
    fs.writeFileSync(path.join(out, 'demo-summary.pdf'), bytes);
    execFileSync('pdftoppm', ['-r', '80', '-png', path.join(out, 'demo-summary.pdf'), path.join(out, 'demo-summary')]);
    const pngs = fs.readdirSync(out).filter((f) => f.startsWith('demo-summary') && f.endsWith('.png'));
    expect(pngs.length).toBeGreaterThan(1);
  });
});

describe('the summary of an analysis computed here', () => {
  it('when the same document is rendered twice, then the two PDFs are byte-identical (its speed is measured by npm run bench, not here)', async () => {
    const doc = SystemDocumentSchema.parse(twoHundredSegments());
    const analysis = analyzeSystem(doc);
    const header = {
      projectName: 'Twice',
      address: '',
      codeBasis: '',
      systemName: 'Generated',
      revisionNumber: 1,
      issuedAt: '2026-12-01T00:00:00.000Z',
      preparerName: 'Test',
      preparerEmail: '',
      inputHash: '0'.repeat(64),
      note: null,
    };
    const a = Buffer.from((await renderSummaryPdf({ header, document: doc, analysis })).bytes);
    const b = Buffer.from((await renderSummaryPdf({ header, document: doc, analysis })).bytes);
    expect(a.length).toBeGreaterThan(10_000);
    expect(a.equals(b)).toBe(true);
  });
});
