import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import { ledgerFor, type Analysis } from '../../src/engine';
import { ATTESTATION } from './support/attestation';
import { projectWithRoles, signedIn, startHarness, type Harness } from './support/harness';
import { demoDocument } from './support/smtpSink';

// The result for the engineer's report through the API on the real database: the CSV files read
// back with Papa Parse and the workbook opened with exceljs hold the analysis's own numbers (the
// screen shows the same analysis). The demo building is invented.

let h: Harness;
beforeAll(() => {
  h = startHarness();
});
afterAll(async () => {
  await h.close();
});

/** A binary body collected whole (supertest leaves unknown types unparsed). */
const binary = (res: import('superagent').Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

async function issuedDemo() {
  const p = await projectWithRoles(h);
  const created = (
    await p.designer
      .send('POST', `/api/projects/${p.projectId}/systems`, { name: 'Domestic cold water', service: 'cold', document: demoDocument() })
      .expect(201)
  ).body;
  const base = `/api/projects/${p.projectId}/systems/${created.system.id}/revisions/${created.revision.id}`;
  const issued = (await p.designer.send('POST', `${base}/issue`, { version: created.revision.version, attestation: ATTESTATION }).expect(200)).body.revision;
  const analysis = ((await p.designer.get(base).expect(200)).body.revision.analysis as { ok: true; analysis: Analysis }).analysis;
  return { ...p, base, issued, analysis };
}

/** The CSV's table under its verdict line and the blank line after it. */
function csvTable(text: string) {
  const [verdictLine, blank, ...rest] = text.split('\r\n');
  const verdict = Papa.parse<string[]>(verdictLine).data[0][0];
  return { verdict, blank, table: Papa.parse<Record<string, string>>(rest.join('\r\n'), { header: true, skipEmptyLines: true }) };
}

describe('exports of the result for the engineer’s report', () => {
  it('when the segment, fixture and ledger CSVs of an issued revision are read back, then each holds the analysis’s numbers, the verdict first, and the names typed', async () => {
    const { designer, base, analysis } = await issuedDemo();
    const segRes = await designer.get(`${base}/export/segments.csv`).expect(200);
    expect(segRes.headers['content-type']).toMatch(/^text\/csv/);
    expect(segRes.headers['content-disposition']).toMatch(/attachment; filename="Domestic cold water rev 1 segments\.csv"/);
    const seg = csvTable(segRes.text);
    expect(seg.verdict).toMatch(/^Domestic cold water, revision 1 \(issued\): PASS; engine /);
    expect(seg.blank).toBe('');
    expect(seg.table.errors).toEqual([]);
    expect(seg.table.data).toHaveLength(analysis.segments.length);
    const u = analysis.units;
    for (const [i, s] of analysis.segments.entries()) {
      const row = seg.table.data[i];
      // written with JavaScript's shortest round-trip form: read back exactly
      expect(Number(row[`Design flow (${u.flow})`])).toBe(s.designFlow);
      expect(Number(row[`Friction loss (${u.pressure})`])).toBe(s.frictionLoss);
      expect(Number(row[`Fitting loss (${u.pressure})`])).toBe(s.fittingLoss);
      expect(Number(row[`Velocity (${u.velocity})`])).toBe(s.velocity);
    }
    // the user's names, never a generated id
    expect(seg.table.data.map((r) => r.Segment).join(' ')).not.toMatch(/[0-9a-f]{8}-[0-9a-f]{4}-/);

    const fix = csvTable((await designer.get(`${base}/export/fixtures.csv`).expect(200)).text);
    expect(fix.table.data).toHaveLength(analysis.fixtures.length);
    for (const [i, f] of analysis.fixtures.entries()) {
      expect(fix.table.data[i].Fixture).toBe(f.label);
      expect(Number(fix.table.data[i][`Margin (${u.pressure})`])).toBe(f.margin);
      expect(fix.table.data[i].Critical).toBe(f.id === analysis.criticalFixtureId ? 'critical' : '');
    }

    const led = csvTable((await designer.get(`${base}/export/ledgers.csv`).expect(200)).text);
    const lines = analysis.fixtures.reduce((n, f) => n + ledgerFor(analysis, f.id).lines.length, 0);
    expect(led.table.data).toHaveLength(lines);
    const critical = analysis.fixtures.find((f) => f.id === analysis.criticalFixtureId)!;
    const last = led.table.data.filter((r) => r.Fixture === critical.label).at(-1)!;
    // the ledger ends at the fixture's residual pressure
    expect(Number(last[`Pressure after (${u.pressure})`])).toBeCloseTo(critical.residual, 9);
  });

  it('when the workbook is opened with the spreadsheet package, then it has the three sheets with the same numbers, and the contractor and inspector may read it too', async () => {
    const { designer, contractorUser, inspectorUser, base, analysis } = await issuedDemo();
    const res = await designer.get(`${base}/export.xlsx`).buffer(true).parse(binary).expect(200);
    expect(res.headers['content-type']).toBe('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet');
    const book = new ExcelJS.Workbook();
    await book.xlsx.load(res.body as unknown as ArrayBuffer);
    expect(book.worksheets.map((w) => w.name)).toEqual(['Segments', 'Checked fixtures', 'Pressure ledgers']);
    const fixtures = book.getWorksheet('Checked fixtures')!;
    expect(String(fixtures.getRow(1).getCell(1).value)).toMatch(/: PASS; engine /);
    const headings = (fixtures.getRow(3).values as unknown[]).slice(1).map(String);
    const marginCol = headings.indexOf(`Margin (${analysis.units.pressure})`) + 1;
    expect(marginCol).toBeGreaterThan(0);
    for (const [i, f] of analysis.fixtures.entries()) {
      expect(fixtures.getRow(4 + i).getCell(1).value).toBe(f.label);
      expect(fixtures.getRow(4 + i).getCell(marginCol).value).toBe(f.margin);
    }
    expect(book.getWorksheet('Segments')!.rowCount).toBe(3 + analysis.segments.length);

    for (const user of [contractorUser, inspectorUser]) {
      const client = await signedIn(h, user);
      await client.get(`${base}/export/fixtures.csv`).expect(200);
    }
  });

  it('when a table that does not exist is asked for, then 400 names it; when the draft cannot be computed, then 409 says so and nothing is made', async () => {
    const { designer, projectId } = await issuedDemo();
    const created = (await designer.send('POST', `/api/projects/${projectId}/systems`, { name: 'Annex', service: 'cold' }).expect(201)).body;
    const base = `/api/projects/${projectId}/systems/${created.system.id}/revisions/${created.revision.id}`;
    const bad = await designer.get(`${base}/export/pumps.csv`).expect(400);
    expect(bad.body.error.fields.table).toMatch(/segments, fixtures or ledgers/);
    const stored = (await designer.get(base).expect(200)).body.revision.analysis as { ok: boolean };
    if (!stored.ok) {
      const refused = await designer.get(`${base}/export/segments.csv`).expect(409);
      expect(refused.body.error.message).toMatch(/cannot be computed.*nothing to export/);
    } else {
      // an empty new system computes to Incomplete: the export says so on its first line
      expect((await designer.get(`${base}/export/segments.csv`).expect(200)).text).toMatch(/INCOMPLETE — not a check/);
    }
  });
});
