import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { ATTESTATION } from './support/attestation';
import { makeUser, projectWithRoles, signedIn, startHarness, type Harness } from './support/harness';
import { smallDocument } from './support/documents';

// The draft save's lean path (one statement for the write and its audit entry, the body read by
// the schema's generated reader, the role read with the user, the session's expiry written at most
// once a minute) keeps every answer and record of the save as it was. Invented data throughout.

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
  return { ...p, base, systemId: created.body.system.id as string, revision: created.body.revision };
}

const audits = (revisionId: string) => h.db('audit_log').where({ subject_id: revisionId }).orderBy('id');

describe('a draft save written in one statement', () => {
  it('when a draft is saved, then its audit entry names the actor, the project, the number and the new version', async () => {
    const { designer, designerUser, projectId, base, revision } = await withSystem();
    const res = await designer.send('PUT', `${base}/revisions/${revision.id}/document`, {
      document: smallDocument({ elbowCount: 3 }),
      version: revision.version,
    });
    expect(res.status).toBe(200);
    const saved = (await audits(revision.id)).filter((a) => a.action === 'revision.saved');
    expect(saved).toHaveLength(1);
    expect(saved[0]).toMatchObject({
      actor_id: designerUser.id,
      project_id: projectId,
      subject_type: 'revision',
      details: { number: revision.number, version: revision.version + 1 },
    });
  });

  it('when the revision is issued, then the save is refused as before (409, the revision named) and nothing is written or audited', async () => {
    const { designer, base, revision } = await withSystem();
    await designer.send('POST', `${base}/revisions/${revision.id}/issue`, { version: revision.version, attestation: ATTESTATION }).expect(200);
    const before = await h.db('revisions').where({ id: revision.id }).first('version', 'document', 'analysis');
    const auditsBefore = (await audits(revision.id)).length;
    const res = await designer.send('PUT', `${base}/revisions/${revision.id}/document`, {
      document: smallDocument({ elbowCount: 9 }),
      version: before.version,
    });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/Revision 1 is issued/);
    expect(await h.db('revisions').where({ id: revision.id }).first('version', 'document', 'analysis')).toEqual(before);
    expect(await audits(revision.id)).toHaveLength(auditsBefore);
  });

  it('when the revision or the system is not the path’s, then the answer is 404 naming which, and nothing is written', async () => {
    const { designer, base, projectId, revision } = await withSystem();
    const other = await withSystem();
    const body = { document: smallDocument({ elbowCount: 5 }), version: revision.version };
    // a revision of another project's system, under this system's path
    const wrongRevision = await designer.send('PUT', `${base}/revisions/${other.revision.id}/document`, body);
    expect(wrongRevision.status).toBe(404);
    expect(wrongRevision.body.error.message).toMatch(/revision/i);
    // a system of another project, under this project's path
    const wrongSystem = await designer.send('PUT', `/api/projects/${projectId}/systems/${other.systemId}/revisions/${other.revision.id}/document`, body);
    expect(wrongSystem.status).toBe(404);
    expect(wrongSystem.body.error.message).toMatch(/system/i);
    expect((await h.db('revisions').where({ id: other.revision.id }).first('version')).version).toBe(other.revision.version);
  });
});

describe('the body of a save', () => {
  it('when a string of the document holds an escaped NUL, then the save is refused naming the field, and nothing is written', async () => {
    const { designer, base, revision } = await withSystem();
    const document = smallDocument();
    document.name = 'Cold\u0000water';
    const res = await designer.send('PUT', `${base}/revisions/${revision.id}/document`, { document, version: revision.version });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields ?? {})).toContain('document.name');
    expect((await h.db('revisions').where({ id: revision.id }).first('version')).version).toBe(revision.version);
  });

  it('when the body has a key besides the document and the version, then it is refused naming it, as the schema does', async () => {
    const { designer, base, revision } = await withSystem();
    const res = await designer.send('PUT', `${base}/revisions/${revision.id}/document`, { document: smallDocument(), version: revision.version, extra: 1 });
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body.error.fields)).toMatch(/extra/);
  });
});

describe('the role read with the user', () => {
  it('when a member is removed from the project, then their next request to it is 404 (the role is read afresh each request)', async () => {
    const p = await projectWithRoles(h);
    const contractor = await signedIn(h, p.contractorUser);
    expect((await contractor.get(`/api/projects/${p.projectId}/systems`)).status).toBe(200);
    await h.db('project_members').where({ project_id: p.projectId, user_id: p.contractorUser.id }).delete();
    expect((await contractor.get(`/api/projects/${p.projectId}/systems`)).status).toBe(404);
  });

  it('when a contractor saves a designer’s draft, then it is 403 as before', async () => {
    const { contractorUser, base, revision } = await withSystem();
    const contractor = await signedIn(h, contractorUser);
    const res = await contractor.send('PUT', `${base}/revisions/${revision.id}/document`, { document: smallDocument(), version: revision.version });
    expect(res.status).toBe(403);
  });

  it('when the project id of the path is not a UUID, then the answer is 404 (nothing is looked up with it)', async () => {
    const user = await makeUser(h.db);
    const client = await signedIn(h, user);
    expect((await client.get(`/api/projects/not-a-uuid/systems`)).status).toBe(404);
    expect((await client.get(`/api/projects/${randomUUID()}/systems`)).status).toBe(404);
  });
});

describe('the session’s stored expiry', () => {
  it('when requests follow each other within a minute, then the stored expiry is written once while the cookie is renewed on each answer', async () => {
    const user = await makeUser(h.db);
    const client = await signedIn(h, user);
    const first = await client.get('/api/auth/me');
    expect(first.status).toBe(200);
    const sid = decodeURIComponent(/headroom\.sid=([^;]+)/.exec(String(first.headers['set-cookie']))![1])
      .replace(/^s:/, '')
      .split('.')[0];
    const stored = async () => new Date((await h.db('session').where({ sid }).first('expire')).expire).getTime();
    const once = await stored();
    for (let i = 0; i < 3; i++) {
      const res = await client.get('/api/auth/me');
      expect(res.status).toBe(200);
      expect(String(res.headers['set-cookie'])).toMatch(/headroom\.sid=/);
    }
    expect(await stored()).toBe(once);
  });
});
