import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeUser, projectWithRoles, signedIn, startHarness, type Harness } from './support/harness';

let h: Harness;
beforeAll(() => {
  h = startHarness();
});
afterAll(() => h.close());

describe('optimistic concurrency on projects', () => {
  it('when two updates carry the same version, then one gets 200, the other 409, and the first is what is stored', async () => {
    const { designer, projectId, project } = await projectWithRoles(h);
    const first = await designer.send('PATCH', `/api/projects/${projectId}`, { notes: 'first edit', version: project.version });
    const second = await designer.send('PATCH', `/api/projects/${projectId}`, { notes: 'second edit', version: project.version });
    expect(first.status).toBe(200);
    expect(second.status).toBe(409);
    expect(second.body.error.code).toBe('STALE_VERSION');
    const stored = await designer.get(`/api/projects/${projectId}`).expect(200);
    expect(stored.body.project.notes).toBe('first edit');
    expect(stored.body.project.version).toBe(project.version + 1);
  });

  it('when updates race in parallel on one version, then exactly one succeeds', async () => {
    const { designer, projectId, project } = await projectWithRoles(h);
    const results = await Promise.all(
      Array.from({ length: 8 }, (_, i) => designer.send('PATCH', `/api/projects/${projectId}`, { notes: `racer ${i}`, version: project.version })),
    );
    expect(results.filter((r) => r.status === 200)).toHaveLength(1);
    expect(results.filter((r) => r.status === 409)).toHaveLength(7);
  });
});

describe('projects and members', () => {
  it('when a designer creates a project, then they are its designer and it is listed for them only', async () => {
    const a = await makeUser(h.db);
    const b = await makeUser(h.db);
    const ca = await signedIn(h, a);
    const cb = await signedIn(h, b);
    const created = await ca.send('POST', '/api/projects', { name: 'Kiln Row Terrace', address: '3 Kiln Row, Wrenmoor', unitSystem: 'SI' }).expect(201);
    expect(created.body.project).toMatchObject({ name: 'Kiln Row Terrace', unitSystem: 'SI', myRole: 'designer', archived: false, version: 1 });
    expect((await ca.get('/api/projects')).body.projects.map((p: { id: string }) => p.id)).toContain(created.body.project.id);
    expect((await cb.get('/api/projects')).body.projects.map((p: { id: string }) => p.id)).not.toContain(created.body.project.id);
    const hidden = await cb.get(`/api/projects/${created.body.project.id}`);
    expect(hidden.status).toBe(404);
    const missing = await cb.get(`/api/projects/00000000-0000-4000-8000-000000000000`);
    expect(missing.body).toEqual(hidden.body);
  });

  it('when a contractor is added, then they see the project with their role, and lose it when removed', async () => {
    const { designer, projectId, contractorUser } = await projectWithRoles(h);
    const contractor = await signedIn(h, contractorUser);
    const seen = await contractor.get(`/api/projects/${projectId}`).expect(200);
    expect(seen.body.project.myRole).toBe('contractor');
    expect(seen.body.members.map((m: { role: string }) => m.role).sort()).toEqual(['contractor', 'designer', 'inspector']);
    await designer.send('DELETE', `/api/projects/${projectId}/members/${contractorUser.id}`).expect(204);
    await contractor.get(`/api/projects/${projectId}`).expect(404);
  });

  it('when a member is added twice or an unknown e-mail is added, then 409 and 404 with the field named', async () => {
    const { designer, projectId, contractorUser } = await projectWithRoles(h);
    const dup = await designer.send('POST', `/api/projects/${projectId}/members`, { email: contractorUser.email, role: 'inspector' });
    expect(dup.status).toBe(409);
    expect(dup.body.error.fields.email).toBeDefined();
    const unknown = await designer.send('POST', `/api/projects/${projectId}/members`, { email: 'nobody-at-all@test.example', role: 'inspector' });
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.code).toBe('USER_NOT_FOUND');
  });

  it('when the last designer would be removed or demoted, then 409 LAST_DESIGNER and the role stays', async () => {
    const { designer, projectId, designerUser } = await projectWithRoles(h);
    const demote = await designer.send('PATCH', `/api/projects/${projectId}/members/${designerUser.id}`, { role: 'contractor' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.code).toBe('LAST_DESIGNER');
    const remove = await designer.send('DELETE', `/api/projects/${projectId}/members/${designerUser.id}`);
    expect(remove.status).toBe(409);
    const members = (await designer.get(`/api/projects/${projectId}/members`)).body.members;
    expect(members.find((m: { userId: string }) => m.userId === designerUser.id).role).toBe('designer');
  });

  it('when a project is archived, then it stays readable and is flagged archived', async () => {
    const { designer, projectId, project } = await projectWithRoles(h);
    const res = await designer.send('PATCH', `/api/projects/${projectId}`, { archived: true, version: project.version }).expect(200);
    expect(res.body.project.archived).toBe(true);
    const list = (await designer.get('/api/projects')).body.projects;
    expect(list.find((p: { id: string }) => p.id === projectId).archived).toBe(true);
  });

  it('when an administrator disables a user, then that user’s open session stops working', async () => {
    const user = await makeUser(h.db);
    const session = await signedIn(h, user);
    await session.get('/api/auth/me').expect(200);
    const admin = await signedIn(h, await makeUser(h.db, { isAdmin: true }));
    await admin.send('PATCH', `/api/users/${user.id}`, { disabled: true, version: 1 }).expect(200);
    await session.get('/api/auth/me').expect(401);
  });

  it('when a change is made, then the audit log records who did what', async () => {
    const { designer, projectId, project, designerUser } = await projectWithRoles(h);
    await designer.send('PATCH', `/api/projects/${projectId}`, { name: 'Renamed for the log', version: project.version }).expect(200);
    const rows = await h.db('audit_log').where({ project_id: projectId }).orderBy('id');
    expect(rows.map((r) => r.action)).toEqual(['project.created', 'member.added', 'member.added', 'project.updated']);
    expect(rows[3].actor_id).toBe(designerUser.id);
    expect(rows[3].details).toMatchObject({ name: 'Renamed for the log' });
  });
});
