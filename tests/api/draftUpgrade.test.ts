import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { readSystemDocument, safeAnalyzeSystem, SystemDocumentSchemaV1 } from '../../src/engine';
import { up as upgradeDrafts } from '../../migrations/20261202100100_upgrade_draft_documents';
import { analyse } from '../../server/services/systems';
import { projectWithRoles, startHarness, type Harness } from './support/harness';
import { smallDocument } from './support/documents';

// The migration of stored drafts to document version 2. Invented data: the small two-storey test system.

let h: Harness;
beforeAll(() => {
  h = startHarness();
});
afterAll(() => h.close());

/**
 * A version 1 document as the flat-elevation bug left it: rises typed on the pipes (2 ft, 10 ft)
 * but every node still at the source's elevation, so version 1 analysed a flat building.
 */
function flatV1Document() {
  const doc = smallDocument();
  for (const n of doc.nodes) n.elevation = 0;
  const rises: Record<string, number> = { service: 2, riser: 10 };
  return SystemDocumentSchemaV1.parse({ ...doc, schemaVersion: 1, segments: doc.segments.map((s) => ({ ...s, rise: rises[s.id] })) });
}

/** A system with revision 1 issued and revision 2 a draft, both stored as version 1 documents (as before the upgrade). */
async function storedV1System() {
  const p = await projectWithRoles(h);
  const user = await h.db('users').where({ email: p.designerUser.email }).first('id');
  const [system] = await h.db('systems').insert({ project_id: p.projectId, name: 'Cold water', service: 'cold', created_by: user.id }).returning('*');
  const document = { ...flatV1Document(), id: randomUUID() };
  const analysis = analyse(document);
  expect(analysis.ok).toBe(true);
  const [issued] = await h
    .db('revisions')
    .insert({
      system_id: system.id,
      number: 1,
      status: 'issued',
      document: JSON.stringify(document),
      analysis: JSON.stringify(analysis),
      engine_version: 'v1-era',
      created_by: user.id,
      issued_by: user.id,
      issued_at: h.db.fn.now(),
      input_hash: 'a'.repeat(64),
    })
    .returning('*');
  const [draft] = await h
    .db('revisions')
    .insert({
      system_id: system.id,
      number: 2,
      status: 'draft',
      document: JSON.stringify(document),
      analysis: JSON.stringify(analysis),
      engine_version: 'v1-era',
      created_by: user.id,
    })
    .returning('*');
  return { ...p, system, issued, draft, document, base: `/api/projects/${p.projectId}/systems/${system.id}` };
}

describe('stored drafts move to document version 2; issued revisions never change', () => {
  it('when the migration runs, then a version 1 draft follows its typed rises, is analysed again and bumps its version, and the issued revision is untouched', async () => {
    const { issued, draft, document } = await storedV1System();
    await upgradeDrafts(h.db);

    const after = await h.db('revisions').where({ id: draft.id }).first();
    expect(after.document.schemaVersion).toBe(2);
    expect(after.version).toBe(draft.version + 1);
    const expected = readSystemDocument(document, { riseConflict: 'follow-rises' });
    if (!expected.success) throw expected.error;
    expect(after.document).toEqual(JSON.parse(JSON.stringify(expected.data)));
    // follow-rises: the upper lavatory now sits 12 ft up (2 + 10), as the designer typed
    const engine = safeAnalyzeSystem(expected.data);
    if (!engine.ok) throw engine.error;
    expect(after.analysis).toEqual({ ok: true, analysis: JSON.parse(JSON.stringify(engine.analysis)) });
    const lav2 = engine.analysis.fixtures.find((f) => f.id === 'lav-2')!;
    expect(lav2.elevation).toBe(12);
    const flat = (issued.analysis as { analysis: { fixtures: { id: string; elevation: number; margin: number }[] } }).analysis.fixtures.find(
      (f) => f.id === 'lav-2',
    )!;
    expect(flat.elevation).toBe(0);
    expect(lav2.margin).toBeLessThan(flat.margin); // the climb the flat document hid

    const issuedAfter = await h.db('revisions').where({ id: issued.id }).first();
    expect(issuedAfter.document).toEqual(issued.document);
    expect(issuedAfter.analysis).toEqual(issued.analysis);
    expect(issuedAfter.version).toBe(issued.version);
    expect(issuedAfter.engine_version).toBe('v1-era');

    const audit = await h.db('audit_log').where({ subject_id: draft.id, action: 'revision.upgraded' });
    expect(audit).toHaveLength(1);
    expect(audit[0].details).toMatchObject({ from: 1, to: 2, riseConflict: 'follow-rises', risesFollowed: expect.arrayContaining(['service', 'riser']) });
  });

  it('when the migration runs twice, then the second run changes nothing', async () => {
    const { draft } = await storedV1System();
    await upgradeDrafts(h.db);
    const once = await h.db('revisions').where({ id: draft.id }).first();
    await upgradeDrafts(h.db);
    const twice = await h.db('revisions').where({ id: draft.id }).first();
    expect(twice.version).toBe(once.version);
    expect(twice.document).toEqual(once.document);
  });

  it('when the summary of an issued version 1 revision is made, then it is ready and its stored version 1 document stays as stored', async () => {
    const { designer, base, issued } = await storedV1System();
    const summary = (await designer.get(`${base}/revisions/${issued.id}/summary`).expect(200)).body.summary;
    expect(summary.status).toBe('ready');
    const stored = await h.db('revisions').where({ id: issued.id }).first();
    expect(stored.document.schemaVersion).toBe(1);
  });
});
