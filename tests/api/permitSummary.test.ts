import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { PDFDocument, PDFName, PDFSignature } from 'pdf-lib';
import type { Analysis } from '../../src/engine';
import { ATTESTATION_STATEMENTS } from '../../src/shared/api/systems';
import { num } from '../../src/shared/format/quantity';
import { SIGNATURE_FIELD_NAME } from '../../server/pdf/summaryPdf';
import { projectWithRoles, startHarness, type Harness } from './support/harness';
import { demoDocument } from './support/smtpSink';

// The submission's identity and the preparer's attestation, through the API on the real database,
// read back from the issued PDF with poppler's pdftotext. Invented names and numbers only.

let h: Harness;
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'headroom-permit-'));
beforeAll(() => {
  h = startHarness();
});
afterAll(async () => {
  await h.close();
  fs.rmSync(tmp, { recursive: true, force: true });
});

function pdfText(bytes: Buffer): string {
  const file = path.join(tmp, `${randomUUID()}.pdf`);
  fs.writeFileSync(file, bytes);
  return execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
}
const flat = (s: string) => s.replace(/\s+/g, ' ');

const PERMIT = {
  permitNumber: 'WRN-PC-2026-0931',
  adoptedCode: 'upc-2018',
  localAmendments: 'Wrenmoor amendment 7 (invented)',
  preparerLicence: 'PE 51123',
  licenceJurisdiction: 'Wrenmoor (invented)',
};
const ATTEST = { name: 'Morgan Ashdown', licenceNumber: 'PE 51123', basis: 'supervised', confirmed: true };

async function draftWithPermit() {
  const p = await projectWithRoles(h);
  const patched = await p.designer.send('PATCH', `/api/projects/${p.projectId}`, { permit: PERMIT, version: p.project.version }).expect(200);
  expect(patched.body.project.permit).toEqual(PERMIT);
  const created = (
    await p.designer
      .send('POST', `/api/projects/${p.projectId}/systems`, { name: 'Domestic cold water', service: 'cold', document: demoDocument() })
      .expect(201)
  ).body;
  const base = `/api/projects/${p.projectId}/systems/${created.system.id}/revisions/${created.revision.id}`;
  return { ...p, base, revision: created.revision };
}

describe('the permit fields and the attestation in the issued summary', () => {
  it('when a revision is issued with the attestation, then it is recorded with the time and the PDF prints it, the permit on every page and an empty signature field', async () => {
    const { designer, base, revision } = await draftWithPermit();
    const before = Date.now();
    const issued = (await designer.send('POST', `${base}/issue`, { version: revision.version, attestation: ATTEST }).expect(200)).body.revision;
    expect(issued.attestation).toMatchObject({ name: ATTEST.name, licenceNumber: ATTEST.licenceNumber, statement: ATTESTATION_STATEMENTS.supervised });
    // recorded at issue, by the database's clock: a minute is a loose bound between its clock and the test's
    expect(Math.abs(new Date(issued.attestation.at).getTime() - before)).toBeLessThan(60_000);

    const bytes = (await designer.get(`${base}/summary.pdf`).responseType('blob').expect(200)).body as Buffer;
    const text = pdfText(bytes);
    const pages = text.split('\f').filter((p) => p.trim() !== '');
    expect(pages.length).toBeGreaterThan(3);
    for (const [i, page] of pages.entries()) {
      const f = flat(page);
      expect(f, `permit number on page ${i + 1}`).toContain(`Permit/plan check ${PERMIT.permitNumber}`);
      expect(f, `code on page ${i + 1}`).toContain('UPC 2018 + local amendments');
      expect(f, `licence on page ${i + 1}`).toContain(`Preparer licence ${PERMIT.preparerLicence}, ${PERMIT.licenceJurisdiction}`);
    }
    const all = flat(text);
    expect(all).toContain(`Code adopted Uniform Plumbing Code, 2018 edition; local amendments: ${PERMIT.localAmendments}`);
    expect(all).toContain(`“${ATTESTATION_STATEMENTS.supervised}”`);
    expect(all).toContain(`Confirmed at issue by ${ATTEST.name}, licence or registration no. ${ATTEST.licenceNumber}`);
    expect(all).toContain('Appendix: the pressure ledger of every checked fixture');
    // friction per segment: velocity, friction, friction per 100 ft and fitting loss side by side, from the analysis
    const analysis = issued.analysis.analysis as Analysis;
    for (const seg of analysis.segments) {
      const cells = [
        num(seg.velocity, 'ft/s'),
        num(seg.frictionLoss, 'psi'),
        num((seg.frictionLoss / seg.length) * 100, 'psi'),
        num(seg.fittingLoss, 'psi'),
      ].join(' ');
      expect(all, `friction of ${seg.label}`).toContain(cells);
    }

    // the empty AcroForm signature field, with its widget on the page of the preparer block
    const pdf = await PDFDocument.load(new Uint8Array(bytes));
    const fields = pdf.getForm().getFields();
    const sig = fields.find((f) => f.getName() === SIGNATURE_FIELD_NAME);
    expect(sig).toBeInstanceOf(PDFSignature);
    expect(sig!.acroField.dict.get(PDFName.of('FT'))).toEqual(PDFName.of('Sig'));
    // unsigned: no signature value yet
    expect(sig!.acroField.dict.get(PDFName.of('V'))).toBeUndefined();
    const pageWithField = pdf.getPages().findIndex((pg) => (pg.node.Annots()?.asArray() ?? []).some((ref) => ref === sig!.ref));
    expect(flat(pages[pageWithField])).toContain('Preparer and attestation');
  });

  it('when the issue body has no attestation, or an unconfirmed one, then nothing is issued and the fields are named', async () => {
    const { designer, base, revision } = await draftWithPermit();
    const none = await designer.send('POST', `${base}/issue`, { version: revision.version }).expect(400);
    expect(Object.keys(none.body.error.fields)).toContain('attestation');
    const unconfirmed = await designer
      .send('POST', `${base}/issue`, { version: revision.version, attestation: { ...ATTEST, confirmed: false, licenceNumber: ' ' } })
      .expect(400);
    expect(Object.keys(unconfirmed.body.error.fields).sort()).toEqual(['attestation.confirmed', 'attestation.licenceNumber']);
    const still = (await designer.get(`${base}`).expect(200)).body.revision;
    expect(still.status).toBe('draft');
    expect(still.attestation ?? null).toBeNull();
  });

  it("when an issued revision's attestation is changed in the database, then the database refuses it", async () => {
    const { designer, base, revision } = await draftWithPermit();
    const issued = (await designer.send('POST', `${base}/issue`, { version: revision.version, attestation: ATTEST }).expect(200)).body.revision;
    await expect(h.db('revisions').where({ id: issued.id }).update({ attestation_licence: 'PE 00000' })).rejects.toThrow(/attestation cannot change/);
    const row = await h.db('revisions').where({ id: issued.id }).first('attestation_licence');
    expect(row.attestation_licence).toBe(ATTEST.licenceNumber);
  });

  it('when the permit fields name a code Headroom does not offer, then the project is not changed and the field is named', async () => {
    const p = await projectWithRoles(h);
    const res = await p.designer
      .send('PATCH', `/api/projects/${p.projectId}`, { permit: { ...PERMIT, adoptedCode: 'ipc-1997' }, version: p.project.version })
      .expect(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['permit.adoptedCode']);
    const project = (await p.designer.get(`/api/projects/${p.projectId}`).expect(200)).body.project;
    expect(project.permit.permitNumber).toBe('');
    expect(project.version).toBe(p.project.version);
  });
});
