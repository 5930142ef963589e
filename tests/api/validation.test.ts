import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeUser, projectWithRoles, signedIn, startHarness, type Client, type Harness } from './support/harness';

/** Row counts of every table a write route can touch: a rejected request must change none. */
async function snapshot(h: Harness) {
  const tables = ['users', 'invitations', 'projects', 'project_members', 'audit_log'];
  const counts: Record<string, string> = {};
  for (const t of tables) counts[t] = String(((await h.db(t).count({ n: '*' }).first()) as { n: string }).n);
  const versions = await h.db('projects').select('id', 'version', 'name', 'notes').orderBy('id');
  return { counts, versions };
}

let h: Harness;
let designer: Client;
let admin: Client;
let projectId: string;
let memberId: string;
let userId: string;

beforeAll(async () => {
  h = startHarness();
  const p = await projectWithRoles(h);
  designer = p.designer;
  projectId = p.projectId;
  memberId = p.contractorUser.id;
  admin = await signedIn(h, await makeUser(h.db, { isAdmin: true }));
  userId = (await makeUser(h.db)).id;
});
afterAll(() => h.close());

interface Case {
  name: string;
  as: () => Client;
  method: string;
  url: () => string;
  body: unknown;
  fields: string[];
}

const CASES: Case[] = [
  {
    name: 'sign-in with a bad e-mail and no password',
    as: () => designer,
    method: 'POST',
    url: () => '/api/auth/sign-in',
    body: { email: 'not-an-email' },
    fields: ['email', 'password'],
  },
  {
    name: 'invitation with a short password',
    as: () => designer,
    method: 'POST',
    url: () => '/api/invitations/whatever',
    body: { password: 'short' },
    fields: ['password'],
  },
  {
    name: 'new user with a bad role and no name',
    as: () => admin,
    method: 'POST',
    url: () => '/api/users',
    body: { email: 'x@test.example', accountRole: 'plumber' },
    fields: ['name', 'accountRole'],
  },
  {
    name: 'user update with a string version and an unknown field',
    as: () => admin,
    method: 'PATCH',
    url: () => `/api/users/${userId}`,
    body: { version: '1', shoeSize: 9 },
    fields: ['version', '(body)'],
  },
  {
    name: 'user update on a malformed id',
    as: () => admin,
    method: 'PATCH',
    url: () => '/api/users/not-a-uuid',
    body: { name: 'X', version: 1 },
    fields: ['userId'],
  },
  {
    name: 'new project with an empty name and a bad unit system',
    as: () => designer,
    method: 'POST',
    url: () => '/api/projects',
    body: { name: '   ', unitSystem: 'imperial' },
    fields: ['name', 'unitSystem'],
  },
  { name: 'new project with a huge name', as: () => designer, method: 'POST', url: () => '/api/projects', body: { name: 'x'.repeat(5000) }, fields: ['name'] },
  {
    name: 'project update without a version',
    as: () => designer,
    method: 'PATCH',
    url: () => `/api/projects/${projectId}`,
    body: { name: 'Renamed' },
    fields: ['version'],
  },
  {
    name: 'project update with a negative version and a numeric name',
    as: () => designer,
    method: 'PATCH',
    url: () => `/api/projects/${projectId}`,
    body: { name: 42, version: -3 },
    fields: ['name', 'version'],
  },
  {
    name: 'add member with an unknown role',
    as: () => designer,
    method: 'POST',
    url: () => `/api/projects/${projectId}/members`,
    body: { email: 'a@test.example', role: 'owner' },
    fields: ['role'],
  },
  {
    name: 'change member role to nonsense',
    as: () => designer,
    method: 'PATCH',
    url: () => `/api/projects/${projectId}/members/${memberId}`,
    body: { role: 7 },
    fields: ['role'],
  },
];

describe('bad bodies on write routes', () => {
  for (const c of CASES) {
    it(`when ${c.name}, then 400 names ${c.fields.join(', ')} and nothing is written`, async () => {
      const before = await snapshot(h);
      const res = await c.as().send(c.method, c.url(), c.body);
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('VALIDATION_FAILED');
      for (const f of c.fields) expect(Object.keys(res.body.error.fields ?? {}), `field ${f}`).toContain(f);
      expect(await snapshot(h)).toEqual(before);
    });
  }

  it('when the body is not JSON at all, then 400 and no stack trace or SQL in the answer', async () => {
    const res = await designer.agent.post('/api/projects').set('x-csrf-token', designer.token).set('content-type', 'application/json').send('{"name": ');
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body)).not.toMatch(/at .*\.ts|select |insert /i);
  });
});
