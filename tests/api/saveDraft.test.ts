import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { ENGINE_VERSION, analyzeSystem, SystemDocumentSchema, verdictStatus } from '../../src/engine';
import { RevisionSummary, SaveDocumentResponse } from '../../src/shared/api/systems';
import { ANALYSIS_FORMAT, DRAFT_ANALYSIS_FORMAT, analyse, toStoredAnalysis } from '../../server/services/storedAnalysis';
import { projectWithRoles, startHarness, type Harness } from './support/harness';
import { smallDocument } from './support/documents';
import { ATTESTATION } from './support/attestation';
import format0 from '../unit/fixtures/stored-analysis-format0.json';
import smallHouse from '../../src/engine/examples/small-house.json';

// The draft save answers the revision's summary; a draft stores its verdict only (its analysis is
// computed from its document when read), an issued revision its analysis in the versioned compact
// form; both are read back whole through the revision's GET. Invented data throughout.

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

describe('the draft save answers what the client needs', () => {
  it('when a draft is saved, then the answer is the revision summary with its new version and the verdict of the saved document, and no document or analysis', async () => {
    const { designer, base, revision } = await withSystem();
    const document = smallDocument({ elbowCount: 7 });
    const res = await designer.send('PUT', `${base}/revisions/${revision.id}/document`, { document, version: revision.version }).expect(200);
    console.log(`save answer: ${Buffer.byteLength(res.text)} bytes`);
    const answer = SaveDocumentResponse.parse(res.body);
    expect(Object.keys(res.body)).toEqual(['revision']);
    expect(Object.keys(res.body.revision).sort()).toEqual(Object.keys(RevisionSummary.shape).sort());
    expect(res.body.revision).not.toHaveProperty('document');
    expect(res.body.revision).not.toHaveProperty('analysis');
    expect(answer.revision).toMatchObject({
      id: revision.id,
      number: revision.number,
      status: 'draft',
      version: revision.version + 1,
      issuedAt: null,
      issuedBy: null,
    });
    // the verdict is the engine's on the document just saved
    const engine = analyzeSystem(SystemDocumentSchema.parse(document));
    const critical = engine.fixtures.find((f) => f.id === engine.criticalFixtureId)!;
    expect(answer.revision.verdict).toEqual({
      ok: true,
      status: verdictStatus(engine),
      allPass: verdictStatus(engine) === 'pass',
      criticalFixtureId: engine.criticalFixtureId,
      criticalMargin: critical.margin,
      warningCount: engine.warnings.length,
      errorMessage: null,
    });
    // the summary is the one the system's page lists
    const detail = await designer.get(base).expect(200);
    expect(detail.body.revisions[0]).toEqual(res.body.revision);
  });

  it('when a saved document cannot be computed, then the answer says so in the verdict and the draft is still saved', async () => {
    const { designer, base, revision } = await withSystem();
    const document = smallDocument();
    document.segments[0].from = 'no-such-node';
    const res = await designer.send('PUT', `${base}/revisions/${revision.id}/document`, { document, version: revision.version }).expect(200);
    expect(res.body.revision.verdict).toMatchObject({ ok: false, status: null, warningCount: 0 });
    expect(res.body.revision.verdict.errorMessage).toMatch(/no-such-node|node/i);
    const stored = await designer.get(`${base}/revisions/${revision.id}`).expect(200);
    expect(stored.body.revision.version).toBe(res.body.revision.version);
    expect(stored.body.revision.analysis.ok).toBe(false);
  });
});

describe('the stored analysis as a versioned contract', () => {
  it('when a draft is saved, then the row holds its verdict only, and the GET answers the whole analysis of its document with the engine version', async () => {
    const { designer, base, revision } = await withSystem();
    const document = smallDocument({ elbowCount: 4 });
    const saved = await designer.send('PUT', `${base}/revisions/${revision.id}/document`, { document, version: revision.version }).expect(200);
    const row = await h.db('revisions').where({ id: revision.id }).first('analysis', 'engine_version');
    expect(row.analysis).toEqual({ analysisFormat: DRAFT_ANALYSIS_FORMAT, engineVersion: ENGINE_VERSION, verdict: saved.body.revision.verdict });
    expect(row.engine_version).toBe(ENGINE_VERSION);
    console.log(`stored analysis of a draft: ${Buffer.byteLength(JSON.stringify(row.analysis))} bytes`);
    const got = await designer.get(`${base}/revisions/${revision.id}`).expect(200);
    const engine = analyzeSystem(SystemDocumentSchema.parse(got.body.revision.document));
    expect(got.body.revision.analysis).toEqual({ ok: true, analysis: JSON.parse(JSON.stringify(engine)) });
    expect(got.body.revision.engineVersion).toBe(ENGINE_VERSION);
    expect(got.body.revision.verdict).toEqual(saved.body.revision.verdict);
    // read again (from the cache of computed analyses): the same answer
    const again = await designer.get(`${base}/revisions/${revision.id}`).expect(200);
    expect(again.body.revision.analysis).toEqual(got.body.revision.analysis);
  });

  it('when a draft holds its verdict only, then the database refuses to issue it without its whole analysis', async () => {
    const { revision } = await withSystem();
    const row = await h.db('revisions').where({ id: revision.id }).first('analysis');
    expect(row.analysis).toMatchObject({ analysisFormat: DRAFT_ANALYSIS_FORMAT, verdict: { status: 'pass' } });
    await expect(h.db('revisions').where({ id: revision.id }).update({ status: 'issued' })).rejects.toThrow(
      /holds its verdict only; it is issued with its whole analysis/,
    );
    expect((await h.db('revisions').where({ id: revision.id }).first('status')).status).toBe('draft');
  });

  it('when a draft in the current format is issued, then the database’s issue rules read it and the issued revision keeps it', async () => {
    const { designer, base, revision } = await withSystem();
    const before = await designer.get(`${base}/revisions/${revision.id}`).expect(200);
    expect(before.body.revision.verdict.status).toBe('pass');
    const issued = await designer.send('POST', `${base}/revisions/${revision.id}/issue`, { version: revision.version, attestation: ATTESTATION }).expect(200);
    expect(issued.body.revision).toMatchObject({ status: 'issued', engineVersion: ENGINE_VERSION });
    const row = await h.db('revisions').where({ id: revision.id }).first('analysis');
    expect(row.analysis.analysisFormat).toBe(ANALYSIS_FORMAT);
    expect(issued.body.revision.analysis).toEqual(before.body.revision.analysis);
  });

  it('when the database refuses to issue an incomplete analysis, then it finds the verdict inside the current format too', async () => {
    const { revision } = await withSystem();
    const row = await h.db('revisions').where({ id: revision.id }).first('document');
    // the whole analysis in the issued form, its verdict made incomplete
    const incomplete = JSON.parse(JSON.stringify(toStoredAnalysis(analyse(row.document), ENGINE_VERSION)));
    incomplete.result.analysis.verdict.status = 'incomplete';
    await h
      .db('revisions')
      .where({ id: revision.id })
      .update({ analysis: JSON.stringify(incomplete) });
    await expect(h.db('revisions').where({ id: revision.id }).update({ status: 'issued' })).rejects.toThrow(/incomplete; it cannot be issued/);
  });

  it('when an issued revision was stored before formats existed, then it is shown exactly as issued, with the engine version it was made with', async () => {
    const p = await projectWithRoles(h);
    const user = await h.db('users').where({ email: p.designerUser.email }).first('id');
    const [system] = await h.db('systems').insert({ project_id: p.projectId, name: 'Small house', service: 'cold', created_by: user.id }).returning('*');
    // written as the code before formats wrote it: the fixture's analysis, at the top of the column
    const [issued] = await h
      .db('revisions')
      .insert({
        system_id: system.id,
        number: 1,
        status: 'issued',
        document: JSON.stringify({ ...smallHouse, id: randomUUID() }),
        analysis: JSON.stringify(format0.computed.stored),
        engine_version: format0.engineVersion,
        created_by: user.id,
        issued_by: user.id,
        issued_at: h.db.fn.now(),
        input_hash: 'b'.repeat(64),
      })
      .returning('id');
    const got = await p.designer.get(`/api/projects/${p.projectId}/systems/${system.id}/revisions/${issued.id}`).expect(200);
    expect(got.body.revision.analysis).toEqual(format0.computed.stored);
    expect(got.body.revision.engineVersion).toBe(format0.engineVersion);
    const stored = format0.computed.stored.analysis;
    const critical = stored.fixtures.find((f) => f.id === stored.criticalFixtureId)!;
    expect(got.body.revision.verdict).toMatchObject({ ok: true, status: stored.verdict.status, criticalMargin: critical.margin });
    // and the row itself is never rewritten by reading it
    const row = await h.db('revisions').where({ id: issued.id }).first('analysis');
    expect(row.analysis).toEqual(format0.computed.stored);
  });
});
