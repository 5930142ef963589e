import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analyzeSystem, SystemDocumentSchema } from '../../src/engine';
import { projectWithRoles, signedIn, startHarness, type Harness } from './support/harness';
import { smallDocument } from './support/documents';
import { ATTESTATION } from './support/attestation';

let h: Harness;
beforeAll(() => {
  h = startHarness();
});
afterAll(() => h.close());

async function withSystem() {
  const p = await projectWithRoles(h);
  const created = await p.designer
    .send('POST', `/api/projects/${p.projectId}/systems`, { name: 'Cold water', service: 'cold', document: smallDocument() })
    .expect(201);
  const base = `/api/projects/${p.projectId}/systems/${created.body.system.id}`;
  return { ...p, base, system: created.body.system, revision: created.body.revision };
}

describe('systems and revisions', () => {
  it('when a system is created without a document, then revision 1 is a draft whose source has no pressure yet', async () => {
    const { designer, projectId } = await projectWithRoles(h);
    const res = await designer.send('POST', `/api/projects/${projectId}/systems`, { name: 'Hot water', service: 'hot' }).expect(201);
    expect(res.body.revision).toMatchObject({ number: 1, status: 'draft', version: 1 });
    expect(res.body.revision.document.source.staticPressureLow).toBe(0);
    expect(res.body.revision.document.waterTemperature).toBe(140);
  });

  it('when a draft is saved, then the stored analysis equals the engine run on the stored document', async () => {
    const { designer, base, revision } = await withSystem();
    const document = smallDocument({ elbowCount: 6 });
    const saved = await designer.send('PUT', `${base}/revisions/${revision.id}/document`, { document, version: revision.version }).expect(200);
    expect(saved.body.revision.version).toBe(revision.version + 1);
    const stored = await designer.get(`${base}/revisions/${revision.id}`).expect(200);
    const engine = analyzeSystem(SystemDocumentSchema.parse(stored.body.revision.document));
    expect(stored.body.revision.analysis).toEqual({ ok: true, analysis: JSON.parse(JSON.stringify(engine)) });
    expect(stored.body.revision.document.segments[0].fittings[0].count).toBe(6);
  });

  it('when two tabs save one draft at the same version, then the second gets 409 and the first is kept', async () => {
    const { designer, base, revision } = await withSystem();
    const first = await designer.send('PUT', `${base}/revisions/${revision.id}/document`, {
      document: smallDocument({ elbowCount: 3 }),
      version: revision.version,
    });
    const second = await designer.send('PUT', `${base}/revisions/${revision.id}/document`, {
      document: smallDocument({ elbowCount: 9 }),
      version: revision.version,
    });
    expect(first.status).toBe(200);
    expect(second.status).toBe(409);
    expect(second.body.error.code).toBe('STALE_VERSION');
    const stored = await designer.get(`${base}/revisions/${revision.id}`).expect(200);
    expect(stored.body.revision.document.segments[0].fittings[0].count).toBe(3);
  });

  it('when a saved document breaks the format, then 400 names the document field and nothing changes', async () => {
    const { designer, base, revision } = await withSystem();
    const bad = smallDocument();
    (bad.segments[0] as { length: unknown }).length = -5;
    const res = await designer.send('PUT', `${base}/revisions/${revision.id}/document`, { document: bad, version: revision.version });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toContain('document.segments.0.length');
    const stored = await designer.get(`${base}/revisions/${revision.id}`).expect(200);
    expect(stored.body.revision.version).toBe(revision.version);
  });

  it('when a revision is issued, then it refuses every change, a new draft starts from it, and the next issue supersedes it', async () => {
    const { designer, base, revision, contractorUser } = await withSystem();
    const issued = await designer.send('POST', `${base}/revisions/${revision.id}/issue`, { version: revision.version, attestation: ATTESTATION }).expect(200);
    expect(issued.body.revision.status).toBe('issued');
    expect(issued.body.revision.inputHash).toMatch(/^[0-9a-f]{64}$/);
    const edit = await designer.send('PUT', `${base}/revisions/${revision.id}/document`, { document: smallDocument(), version: issued.body.revision.version });
    expect(edit.status).toBe(409);
    await expect(
      h
        .db('revisions')
        .where({ id: revision.id })
        .update({ document: JSON.stringify({ tampered: true }) }),
    ).rejects.toThrow(/cannot change/);

    const contractor = await signedIn(h, contractorUser);
    expect((await contractor.send('POST', `${base}/revisions`, { fromRevisionId: revision.id })).status).toBe(403);

    const draft = await designer.send('POST', `${base}/revisions`, { fromRevisionId: revision.id }).expect(201);
    expect(draft.body.revision).toMatchObject({ number: 2, status: 'draft' });
    expect((await designer.send('POST', `${base}/revisions`, { fromRevisionId: revision.id })).status).toBe(409);
    await designer
      .send('POST', `${base}/revisions/${draft.body.revision.id}/issue`, { version: draft.body.revision.version, attestation: ATTESTATION })
      .expect(200);
    const list = (await designer.get(base).expect(200)).body.revisions;
    expect(list.map((r: { number: number; status: string }) => `${r.number}:${r.status}`)).toEqual(['2:issued', '1:superseded']);
  });

  it('when two revisions are compared, then each fixture margin difference equals two independent engine runs', async () => {
    const { designer, base, revision } = await withSystem();
    await designer.send('POST', `${base}/revisions/${revision.id}/issue`, { version: revision.version, attestation: ATTESTATION }).expect(200);
    const draft = (await designer.send('POST', `${base}/revisions`, { fromRevisionId: revision.id }).expect(201)).body.revision;
    const changed = smallDocument({ elbowCount: 12 });
    await designer.send('PUT', `${base}/revisions/${draft.id}/document`, { document: changed, version: draft.version }).expect(200);
    const cmp = await designer.get(`${base}/compare?a=${revision.id}&b=${draft.id}`).expect(200);
    const a = analyzeSystem(SystemDocumentSchema.parse(revision.document));
    const b = analyzeSystem(SystemDocumentSchema.parse(changed));
    for (const f of cmp.body.fixtures) {
      const ma = a.fixtures.find((x) => x.id === f.id)!.margin;
      const mb = b.fixtures.find((x) => x.id === f.id)!.margin;
      expect(f.delta).toBe(mb - ma);
      expect(f.delta).toBeLessThan(0); // ten more elbows on the shared service line lower every margin
    }
    expect(cmp.body.segments).toContainEqual({ id: 'service', change: 'changed', fields: ['fittings'] });
  });

  it('when an inspector or contractor tries to save a draft, then 403 and nothing changes', async () => {
    const { base, revision, inspectorUser } = await withSystem();
    const inspector = await signedIn(h, inspectorUser);
    const res = await inspector.send('PUT', `${base}/revisions/${revision.id}/document`, {
      document: smallDocument({ elbowCount: 1 }),
      version: revision.version,
    });
    expect(res.status).toBe(403);
    const stored = await inspector.get(`${base}/revisions/${revision.id}`).expect(200);
    expect(stored.body.revision.version).toBe(revision.version);
  });
});
