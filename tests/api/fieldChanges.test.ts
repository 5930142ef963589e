import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analyzeSystem, SystemDocumentSchema, type Analysis, type EngineWarning } from '../../src/engine';
import { num } from '../../src/shared/format/quantity';
import { makeUser, signedIn, startHarness, type Harness } from './support/harness';
import { edited, fieldChangeWorld, pdfPlainText, startFieldChange } from './support/fieldChangeFixtures';
import { ATTESTATION } from './support/attestation';

let h: Harness;
beforeAll(() => {
  h = startHarness();
});
afterAll(() => h.close());

type Doc = ReturnType<typeof SystemDocumentSchema.parse>;
const engine = (d: unknown): Analysis => analyzeSystem(SystemDocumentSchema.parse(d));

/** A substitution a contractor may make: ten more elbows on the service, the riser in 1 in PEX and 4 ft longer, another meter. */
function substitution(issued: Doc): Doc {
  return edited(issued, (d) => {
    d.segments[0].fittings = [{ typeId: 'elbow-90-standard', count: 12 }];
    d.segments[1].material = 'pex-sdr9';
    d.segments[1].size = '1';
    d.segments[1].length = 18;
    d.devices[0].loss = { kind: 'fixed', loss: 4.5 };
  });
}

describe('field changes: what a contractor may change', () => {
  it('when a contractor changes the supply, the criteria, a checked fixture or the water temperature, then the server refuses it with 403 naming each field, and the draft is unchanged', async () => {
    const w = await fieldChangeWorld(h);
    const { fieldChange, url } = await startFieldChange(w.contractor, w.fcBase, w.revisionId);
    const tampered = edited(fieldChange.document as Doc, (d) => {
      d.source.staticPressureLow = 80;
      d.criteria = { maxStaticPressure: 95 };
      d.nodes[2].checkedFixtures[0].minFlowPressure = 2;
      d.nodes[1].fixtureGroups[0].count = 3;
      d.waterTemperature = 50;
    });
    const res = await w.contractor.send('PATCH', url, { document: tampered, version: fieldChange.version });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('FORBIDDEN');
    expect(Object.keys(res.body.error.fields).sort()).toEqual([
      'document.criteria',
      'document.nodes.l1.fixtureGroups',
      'document.nodes.l2.checkedFixtures.lav-2.minFlowPressure',
      'document.source.staticPressureLow',
      'document.waterTemperature',
    ]);
    expect(res.body.error.message).toContain('source.staticPressureLow');
    const stored = (await w.contractor.get(url).expect(200)).body.fieldChange;
    expect(stored.version).toBe(fieldChange.version);
    expect(stored.document).toEqual(w.issuedDocument);
  });

  it('when a contractor moves a segment, changes its rise, or adds or removes one, then the server refuses each', async () => {
    const w = await fieldChangeWorld(h);
    const { fieldChange, url } = await startFieldChange(w.contractor, w.fcBase, w.revisionId);
    const base = fieldChange.document as Doc;
    const cases: [Doc, string[]][] = [
      [edited(base, (d) => void (d.segments[1].from = 'main')), ['document.segments.riser.from']],
      [edited(base, (d) => void (d.segments[1].rise = 30)), ['document.segments.riser.rise']],
      [edited(base, (d) => void d.segments.pop()), ['document.segments.riser']],
      [edited(base, (d) => void d.segments.push({ ...d.segments[1], id: 'extra' })), ['document.segments.extra']],
    ];
    for (const [document, fields] of cases) {
      const res = await w.contractor.send('PATCH', url, { document, version: fieldChange.version });
      expect(res.status, fields[0]).toBe(403);
      expect(Object.keys(res.body.error.fields)).toEqual(fields);
    }
    expect((await h.db('field_changes').where({ id: fieldChange.id }).first()).version).toBe(fieldChange.version);
  });

  it('when a contractor changes fittings, material, size, length and a device, then it is saved, analysed by the server, and the changes are listed in words', async () => {
    const w = await fieldChangeWorld(h);
    const { fieldChange, url } = await startFieldChange(w.contractor, w.fcBase, w.revisionId);
    const document = substitution(fieldChange.document as Doc);
    const res = await w.contractor.send('PATCH', url, { document, title: 'PEX riser, press elbows', version: fieldChange.version }).expect(200);
    const saved = res.body.fieldChange;
    expect(saved.version).toBe(fieldChange.version + 1);
    expect(saved.title).toBe('PEX riser, press elbows');
    expect(saved.document).toEqual(SystemDocumentSchema.parse(document));
    expect(saved.analysis).toEqual({ ok: true, analysis: JSON.parse(JSON.stringify(engine(document))) });
    const byId = Object.fromEntries(saved.changes.map((c: { elementId: string; fields: { field: string }[] }) => [c.elementId, c.fields.map((f) => f.field)]));
    expect(byId).toEqual({ service: ['fittings'], riser: ['material', 'size', 'length'], meter: ['loss'] });
    const riser = saved.changes.find((c: { elementId: string }) => c.elementId === 'riser');
    expect(riser.fields[0]).toEqual({ field: 'material', before: 'Copper tube, Type L', after: 'PEX tubing, SDR 9 (copper tube size)' });
    expect(riser.fields[2]).toEqual({ field: 'length', before: '14.0 ft', after: '18.0 ft' });
  });

  it('when a designer, an inspector or another contractor of the project tries to start or edit the field change, then 403 and nothing changes', async () => {
    const w = await fieldChangeWorld(h);
    const inspector = await signedIn(h, w.inspectorUser);
    expect((await w.designer.send('POST', w.fcBase, { revisionId: w.revisionId, title: 'Designer' })).status).toBe(403);
    expect((await inspector.send('POST', w.fcBase, { revisionId: w.revisionId, title: 'Inspector' })).status).toBe(403);
    const { fieldChange, url } = await startFieldChange(w.contractor, w.fcBase, w.revisionId);
    const other = await makeUser(h.db, { accountRole: 'contractor' });
    await w.designer.send('POST', `/api/projects/${w.projectId}/members`, { email: other.email, role: 'contractor' }).expect(201);
    const otherClient = await signedIn(h, other);
    const document = substitution(fieldChange.document as Doc);
    const res = await otherClient.send('PATCH', url, { document, version: fieldChange.version });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/Only the contractor who started/);
    expect((await w.designer.send('PATCH', url, { document, version: fieldChange.version })).status).toBe(403);
    expect((await otherClient.send('POST', `${url}/propose`, { version: fieldChange.version })).status).toBe(403);
    expect((await w.contractor.get(url).expect(200)).body.fieldChange.version).toBe(fieldChange.version);
  });
});

describe('field changes: the side by side', () => {
  it('when the side by side is asked for, then every margin, difference, segment loss and new warning equals two independent engine runs', async () => {
    const w = await fieldChangeWorld(h);
    const { fieldChange, url } = await startFieldChange(w.contractor, w.fcBase, w.revisionId);
    const document = substitution(fieldChange.document as Doc);
    await w.contractor.send('PATCH', url, { document, version: fieldChange.version }).expect(200);
    const cmp = (await w.designer.get(`${url}/comparison`).expect(200)).body;

    // the same engine on the same documents: the numbers are the same bits, so they are compared exactly
    const a = engine(w.issuedDocument);
    const b = engine(document);
    expect(cmp.fixtures.map((f: { id: string }) => f.id).sort()).toEqual(a.fixtures.map((f) => f.id).sort());
    for (const f of cmp.fixtures) {
      const x = a.fixtures.find((y) => y.id === f.id)!;
      const y = b.fixtures.find((z) => z.id === f.id)!;
      expect(f.issuedMargin).toBe(x.margin);
      expect(f.newMargin).toBe(y.margin);
      expect(f.difference).toBe(y.margin - x.margin);
      expect(f.newPass).toBe(y.pass);
    }
    // ten more elbows on the shared service line lower the margin of the fixture it feeds first
    expect(cmp.fixtures.find((f: { id: string }) => f.id === 'lav-1').difference).toBeLessThan(0);

    expect(cmp.segments.map((s: { id: string }) => s.id)).toEqual(['service', 'riser']);
    for (const s of cmp.segments) {
      const x = a.segments.find((y) => y.id === s.id)!;
      const y = b.segments.find((z) => z.id === s.id)!;
      expect(s.issued.loss).toBe(x.frictionLoss + x.fittingLoss);
      expect(s.proposed.loss).toBe(y.frictionLoss + y.fittingLoss);
      expect(s.lossDifference).toBe(y.frictionLoss + y.fittingLoss - (x.frictionLoss + x.fittingLoss));
      expect(s.velocityDifference).toBe(y.velocity - x.velocity);
    }
    expect(cmp.devices).toEqual([expect.objectContaining({ id: 'meter', change: 'changed', issuedLoss: 3, newLoss: 4.5, lossDifference: 1.5 })]);

    const keys = (ws: EngineWarning[]) => new Set(ws.flatMap((x) => (x.elementIds ?? [x.elementId]).map((id) => `${x.code}|${x.elementType}|${id}`)));
    const [ka, kb] = [keys(a.warnings), keys(b.warnings)];
    const key = (x: { code: string; elementType: string; elementId: string | null }) => `${x.code}|${x.elementType}|${x.elementId}`;
    expect(cmp.newWarnings.map(key).sort()).toEqual([...kb].filter((k) => !ka.has(k)).sort());
    expect(cmp.resolvedWarnings.map(key).sort()).toEqual([...ka].filter((k) => !kb.has(k)).sort());

    const before = a.fixtures.find((f) => f.id === a.criticalFixtureId)!;
    const after = b.fixtures.find((f) => f.id === b.criticalFixtureId)!;
    expect(after.margin).toBeLessThan(before.margin);
    expect(cmp.verdict).toMatchObject({
      pass: true,
      criticalFixtureId: b.criticalFixtureId,
      issuedSmallestMargin: before.margin,
      newSmallestMargin: after.margin,
    });
    expect(cmp.verdict.sentence).toBe(
      `Still passes; the smallest margin falls from ${num(before.margin, 'psi')} psi to ${num(after.margin, 'psi')} psi at ${after.label}.`,
    );
    expect(cmp.units.pressure).toBe('psi');
  });

  it('when a substituted device takes more pressure than the margin, then the verdict says where it fails and by how much', async () => {
    const w = await fieldChangeWorld(h);
    const { fieldChange, url } = await startFieldChange(w.contractor, w.fcBase, w.revisionId);
    // a strainer with a fixed 45 psi loss on the riser: more than lav-2's issued margin (invented figure)
    const document = edited(
      fieldChange.document as Doc,
      (d) => void d.devices.push({ id: 'strainer', kind: 'strainer', label: 'Riser strainer', segmentId: 'riser', loss: { kind: 'fixed', loss: 45 } }),
    );
    await w.contractor.send('PATCH', url, { document, version: fieldChange.version }).expect(200);
    const cmp = (await w.contractor.get(`${url}/comparison`).expect(200)).body;
    const b = engine(document);
    const failing = b.fixtures.filter((f) => !f.pass);
    expect(failing.map((f) => f.id)).toEqual(['lav-2']);
    expect(cmp.verdict.pass).toBe(false);
    expect(cmp.verdict.sentence).toBe(`Fails at ${failing[0].label} by ${num(-failing[0].margin, 'psi')} psi.`);
    expect(cmp.fixtures.find((f: { id: string }) => f.id === 'lav-2').newPass).toBe(false);
    expect(cmp.devices).toEqual([expect.objectContaining({ id: 'strainer', change: 'added', issuedLoss: null, newLoss: 45 })]);
    expect(cmp.newWarnings.map((x: { code: string; elementId: string }) => `${x.code}|${x.elementId}`)).toContain('residual-below-minimum|lav-2');
  });
});

describe('field changes: proposed, accepted, declined', () => {
  it('when a proposed field change is accepted, then a new draft revision holds exactly its document, records it, both sides are e-mailed, every step is audited, and the issued summary lists the change', async () => {
    const w = await fieldChangeWorld(h);
    const { fieldChange, url } = await startFieldChange(w.contractor, w.fcBase, w.revisionId);
    const saved = (await w.contractor.send('PATCH', url, { document: substitution(fieldChange.document as Doc), version: fieldChange.version }).expect(200))
      .body.fieldChange;
    const proposed = (await w.contractor.send('POST', `${url}/propose`, { version: saved.version }).expect(200)).body.fieldChange;
    expect(proposed.status).toBe('proposed');
    expect(proposed.proposedAt).not.toBeNull();

    const toDesigner = await h.db('outbox').where({ field_change_id: fieldChange.id, kind: 'field-change', to_address: w.designerUser.email });
    expect(toDesigner).toHaveLength(1);
    expect(toDesigner[0].subject).toContain(`field change ${fieldChange.number}`);
    expect(toDesigner[0].text_body).toContain('Still passes');
    expect(toDesigner[0].text_body).toContain(`/projects/${w.projectId}/systems/${w.systemId}/field-changes/${fieldChange.id}`);

    const accepted = (await w.designer.send('POST', `${url}/accept`, { version: proposed.version, comment: 'Accepted; issue with the next set.' }).expect(200))
      .body;
    expect(accepted.fieldChange.status).toBe('accepted');
    expect(accepted.revision).toMatchObject({ number: 2, status: 'draft' });
    expect(accepted.fieldChange.acceptedRevision).toEqual({ id: accepted.revision.id, number: 2 });
    expect(accepted.revision.document).toEqual(saved.document);
    const row = await h.db('revisions').where({ id: accepted.revision.id }).first();
    expect(row.field_change_id).toBe(fieldChange.id);
    expect(row.document).toEqual(saved.document);

    const toContractor = await h.db('outbox').where({ field_change_id: fieldChange.id, to_address: w.contractorUser.email });
    expect(toContractor).toHaveLength(1);
    expect(toContractor[0].subject).toMatch(/^Field change accepted/);
    expect(toContractor[0].text_body).toContain('revision 2');

    const audit = await h.db('audit_log').where({ project_id: w.projectId }).whereIn('subject_id', [fieldChange.id, accepted.revision.id]).orderBy('id');
    expect(audit.map((a: { action: string }) => a.action)).toEqual([
      'field-change.created',
      'field-change.saved',
      'field-change.proposed',
      'field-change.accepted',
      'revision.drafted',
    ]);

    // the designer issues it; the summary says where the revision came from
    await w.designer
      .send('POST', `/api/projects/${w.projectId}/systems/${w.systemId}/revisions/${accepted.revision.id}/issue`, {
        version: accepted.revision.version,
        attestation: ATTESTATION,
      })
      .expect(200);
    const pdf = (
      await w.designer.get(`/api/projects/${w.projectId}/systems/${w.systemId}/revisions/${accepted.revision.id}/summary.pdf`).responseType('blob').expect(200)
    ).body as Buffer;
    const text = pdfPlainText(pdf);
    expect(text).toContain('Field change in this revision');
    expect(text).toContain(`${fieldChange.number}: Press-connect fittings on the service line (on revision 1)`);
    const contractorName = (await h.db('users').where({ id: w.contractorUser.id }).first()).name;
    expect(text).toMatch(
      new RegExp(`Proposed by ${contractorName} <${w.contractorUser.email.replace(/[.]/g, '\\.')}>, \\d{4}-\\d\\d-\\d\\d \\d\\d:\\d\\d UTC`),
    );
    expect(text).toMatch(/Accepted by Test [^<]+<[^>]+>, \d{4}-\d\d-\d\d \d\d:\d\d UTC/);
    expect(text).toContain('material: Copper tube, Type L');
    expect(text).toContain('PEX tubing, SDR 9');
    expect(text).toContain('length: 14.0 ft');

    // the first summary (revision 1) did not come from a field change and says nothing of one
    const first = (
      await w.designer.get(`/api/projects/${w.projectId}/systems/${w.systemId}/revisions/${w.revisionId}/summary.pdf`).responseType('blob').expect(200)
    ).body as Buffer;
    expect(pdfPlainText(first)).not.toContain('Field change in this revision');
  });

  it('when a field change is declined, then a reason is required, the contractor is told it, and nothing more can happen to it', async () => {
    const w = await fieldChangeWorld(h);
    const { fieldChange, url } = await startFieldChange(w.contractor, w.fcBase, w.revisionId);
    const saved = (await w.contractor.send('PATCH', url, { document: substitution(fieldChange.document as Doc), version: fieldChange.version }).expect(200))
      .body.fieldChange;
    const proposed = (await w.contractor.send('POST', `${url}/propose`, { version: saved.version }).expect(200)).body.fieldChange;

    const noReason = await w.designer.send('POST', `${url}/decline`, { version: proposed.version, reason: '  ' });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fields.reason).toMatch(/why/);
    expect((await w.designer.send('POST', `${url}/decline`, { version: proposed.version })).status).toBe(400);

    const declined = (
      await w.designer
        .send('POST', `${url}/decline`, { version: proposed.version, reason: 'The PEX riser needs a listed transition at the copper tee.' })
        .expect(200)
    ).body.fieldChange;
    expect(declined).toMatchObject({ status: 'declined', declineReason: 'The PEX riser needs a listed transition at the copper tee.', acceptedRevision: null });
    const mail = await h.db('outbox').where({ field_change_id: fieldChange.id, to_address: w.contractorUser.email }).first();
    expect(mail.subject).toMatch(/^Field change declined/);
    expect(mail.text_body).toContain('The PEX riser needs a listed transition at the copper tee.');

    for (const [method, path, body] of [
      ['POST', `${url}/accept`, { version: declined.version }],
      ['POST', `${url}/decline`, { version: declined.version, reason: 'Again' }],
    ] as const) {
      const res = await w.designer.send(method, path, body);
      expect(res.status).toBe(409);
      expect(res.body.error.message).toMatch(/declined; it is decided already/);
    }
    expect((await w.contractor.send('POST', `${url}/propose`, { version: declined.version })).status).toBe(409);
    expect((await w.contractor.send('PATCH', url, { title: 'Edited after', version: declined.version })).status).toBe(409);
    expect(await h.db('revisions').where({ system_id: w.systemId })).toHaveLength(1);
    expect((await h.db('audit_log').where({ subject_id: fieldChange.id, action: 'field-change.declined' })).length).toBe(1);
  });

  it('when steps come out of order or at a stale version, then 409 and the state is kept', async () => {
    const w = await fieldChangeWorld(h);
    const { fieldChange, url } = await startFieldChange(w.contractor, w.fcBase, w.revisionId);
    // a draft cannot be accepted or declined, and an unchanged copy cannot be proposed
    expect((await w.designer.send('POST', `${url}/accept`, { version: fieldChange.version })).body.error.message).toMatch(
      /is a draft; its contractor proposes it/,
    );
    expect((await w.designer.send('POST', `${url}/decline`, { version: fieldChange.version, reason: 'No' })).status).toBe(409);
    const same = await w.contractor.send('POST', `${url}/propose`, { version: fieldChange.version });
    expect(same.status).toBe(409);
    expect(same.body.error.message).toMatch(/same as the issued revision/);

    const saved = (await w.contractor.send('PATCH', url, { document: substitution(fieldChange.document as Doc), version: fieldChange.version }).expect(200))
      .body.fieldChange;
    const stale = await w.contractor.send('PATCH', url, { title: 'Stale tab', version: fieldChange.version });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('STALE_VERSION');
    expect((await w.contractor.send('POST', `${url}/propose`, { version: fieldChange.version })).body.error.code).toBe('STALE_VERSION');
    const proposed = (await w.contractor.send('POST', `${url}/propose`, { version: saved.version }).expect(200)).body.fieldChange;
    expect((await w.contractor.send('POST', `${url}/propose`, { version: proposed.version })).status).toBe(409);
    expect((await w.contractor.send('PATCH', url, { title: 'After proposing', version: proposed.version })).status).toBe(409);
    expect((await w.designer.send('POST', `${url}/accept`, { version: saved.version })).body.error.code).toBe('STALE_VERSION');
    const now = (await w.contractor.get(url).expect(200)).body.fieldChange;
    expect(now).toMatchObject({ status: 'proposed', version: proposed.version, title: fieldChange.title });
  });

  it('when the revision a field change was made on is superseded, then it cannot be accepted (409 naming the current revision) and no new field change starts on it', async () => {
    const w = await fieldChangeWorld(h);
    const { fieldChange, url } = await startFieldChange(w.contractor, w.fcBase, w.revisionId);
    const saved = (await w.contractor.send('PATCH', url, { document: substitution(fieldChange.document as Doc), version: fieldChange.version }).expect(200))
      .body.fieldChange;
    const proposed = (await w.contractor.send('POST', `${url}/propose`, { version: saved.version }).expect(200)).body.fieldChange;
    const sys = `/api/projects/${w.projectId}/systems/${w.systemId}`;
    const draft = (await w.designer.send('POST', `${sys}/revisions`, { fromRevisionId: w.revisionId }).expect(201)).body.revision;
    await w.designer.send('POST', `${sys}/revisions/${draft.id}/issue`, { version: draft.version, attestation: ATTESTATION }).expect(200);

    const listed = (await w.designer.get(w.fcBase).expect(200)).body.fieldChanges;
    expect(listed[0]).toMatchObject({ id: fieldChange.id, baseIsCurrent: false, baseRevision: { number: 1, status: 'superseded' } });
    const res = await w.designer.send('POST', `${url}/accept`, { version: proposed.version });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toBe(
      `Field change ${fieldChange.number} was made on revision 1, which is no longer the current issued revision (revision 2 is). It cannot be accepted; start a new field change on the current issued revision.`,
    );
    expect(await h.db('revisions').where({ system_id: w.systemId })).toHaveLength(2);
    const again = await w.contractor.send('POST', w.fcBase, { revisionId: w.revisionId, title: 'On the old one' });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/superseded; a field change starts on the current issued revision \(revision 2\)/);
  });

  it('when the project lists its field changes by status, then the proposed one is there for its designers', async () => {
    const w = await fieldChangeWorld(h);
    const { fieldChange, url } = await startFieldChange(w.contractor, w.fcBase, w.revisionId);
    await startFieldChange(w.contractor, w.fcBase, w.revisionId, 'A second, still a draft');
    const saved = (await w.contractor.send('PATCH', url, { document: substitution(fieldChange.document as Doc), version: fieldChange.version }).expect(200))
      .body.fieldChange;
    await w.contractor.send('POST', `${url}/propose`, { version: saved.version }).expect(200);
    const proposed = (await w.designer.get(`/api/projects/${w.projectId}/field-changes?status=proposed`).expect(200)).body.fieldChanges;
    expect(proposed.map((f: { id: string }) => f.id)).toEqual([fieldChange.id]);
    const all = (await w.designer.get(`/api/projects/${w.projectId}/field-changes`).expect(200)).body.fieldChanges;
    expect(all).toHaveLength(2);
    expect(all.map((f: { number: number }) => f.number).sort()).toEqual([1, 2]);
  });
});
