/**
 * Issue 13 finding 2, as a rule over the route table: every API route that takes more than one id
 * (in its path, or a revision id in its body or query) checks that each id belongs to the one
 * before it. The test reads the routes the app registered; a route with two or more ids and no
 * row below fails the first test, so a new route cannot ship without this check.
 *
 * The world: one designer, contractor and inspector, members of two projects A and B with the
 * same roles, and in each project the same things (an issued system with a field change and an
 * attachment, a draft, a review, a failed message, a member of that project only, a catalog
 * entry). For each route and each id after the first, the request is sent with every id from A
 * but that one from B: it must be refused — 404 for a path id (nothing of B's is revealed), a
 * 4xx for a body or query id — and the same request with every id from A must not be 404 (so
 * the refusal is about the foreign id, not a broken request).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { Client, makeUser, signedIn, startHarness, type Harness } from './support/harness';
import { smallDocument } from './support/documents';
import { tinyPdf, upload } from './support/fieldChangeFixtures';
import { ATTESTATION } from './support/attestation';

type Role = 'designer' | 'contractor' | 'inspector';
type Ids = Record<string, string>;
interface Row {
  as: Role;
  /** ids read from the body or the query (after the path's) */
  extraIds?: string[];
  body?: (ids: Ids) => unknown;
  query?: (ids: Ids) => string;
  upload?: true;
}

const b = (f: (ids: Ids) => unknown) => f;
const ROWS: Record<string, Row> = {
  'PATCH /api/projects/:projectId/members/:userId': { as: 'designer', body: b(() => ({ role: 'inspector' })) },
  'DELETE /api/projects/:projectId/members/:userId': { as: 'designer' },
  'GET /api/projects/:projectId/systems/:systemId': { as: 'designer' },
  'GET /api/projects/:projectId/systems/:systemId/compare': {
    as: 'designer',
    extraIds: ['revisionId', 'draftId'],
    query: (i) => `?a=${i.revisionId}&b=${i.draftId}`,
  },
  'POST /api/projects/:projectId/systems/:systemId/revisions': { as: 'designer', extraIds: ['revisionId'], body: (i) => ({ fromRevisionId: i.revisionId }) },
  'GET /api/projects/:projectId/systems/:systemId/revisions/:revisionId': { as: 'designer' },
  'PUT /api/projects/:projectId/systems/:systemId/revisions/:revisionId/document': { as: 'designer', body: () => ({ document: smallDocument(), version: 1 }) },
  'POST /api/projects/:projectId/systems/:systemId/revisions/:revisionId/issue': { as: 'designer', body: () => ({ version: 1, attestation: ATTESTATION }) },
  'GET /api/projects/:projectId/systems/:systemId/revisions/:revisionId/summary': { as: 'designer' },
  'GET /api/projects/:projectId/systems/:systemId/revisions/:revisionId/summary.pdf': { as: 'designer' },
  'POST /api/projects/:projectId/systems/:systemId/revisions/:revisionId/summary/retry': { as: 'designer' },
  'POST /api/projects/:projectId/systems/:systemId/revisions/:revisionId/summary/send': {
    as: 'designer',
    extraIds: ['inspectorId'],
    body: (i) => ({ inspectorIds: [i.inspectorId] }),
  },
  'GET /api/projects/:projectId/systems/:systemId/revisions/:revisionId/messages': { as: 'designer' },
  'GET /api/projects/:projectId/systems/:systemId/revisions/:revisionId/export/:table.csv': { as: 'designer' },
  'GET /api/projects/:projectId/systems/:systemId/revisions/:revisionId/export.xlsx': { as: 'designer' },
  'GET /api/projects/:projectId/systems/:systemId/revisions/:revisionId/reviews': { as: 'designer' },
  'POST /api/projects/:projectId/messages/:messageId/retry': { as: 'designer' },
  'PATCH /api/projects/:projectId/reviews/:reviewId': { as: 'inspector', body: () => ({ decision: 'accepted', version: 1 }) },
  'PUT /api/projects/:projectId/reviews/:reviewId/comments/:commentId/reply': { as: 'designer', body: () => ({ reply: 'Answered in the next revision.' }) },
  'GET /api/projects/:projectId/systems/:systemId/revisions/:revisionId/answers': { as: 'designer' },
  'GET /api/projects/:projectId/reviews/:reviewId/acceptance.pdf': { as: 'designer' },
  'POST /api/projects/:projectId/submissions': {
    as: 'designer',
    extraIds: ['systemId', 'inspectorId'],
    body: (i) => ({ systemIds: [i.systemId], inspectorIds: [i.inspectorId] }),
  },
  'PATCH /api/projects/:projectId/catalog/entries/:kind/:entryId': {
    as: 'designer',
    body: () => ({ label: `Renamed ${randomUUID().slice(0, 4)}`, version: 1 }),
  },
  'DELETE /api/projects/:projectId/catalog/entries/:kind/:entryId': { as: 'designer' },
  'GET /api/projects/:projectId/systems/:systemId/field-changes': { as: 'contractor' },
  'POST /api/projects/:projectId/systems/:systemId/field-changes': {
    as: 'contractor',
    extraIds: ['revisionId'],
    body: (i) => ({ revisionId: i.revisionId, title: 'Press fittings' }),
  },
  'GET /api/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId': { as: 'contractor' },
  'PATCH /api/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId': { as: 'contractor', body: () => ({ title: 'Renamed', version: 1 }) },
  'GET /api/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId/comparison': { as: 'contractor' },
  'POST /api/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId/propose': { as: 'contractor', body: () => ({ version: 1 }) },
  'POST /api/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId/accept': { as: 'designer', body: () => ({ version: 1 }) },
  'POST /api/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId/decline': {
    as: 'designer',
    body: () => ({ version: 1, reason: 'Not this one' }),
  },
  'POST /api/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId/attachments': { as: 'contractor', upload: true },
  'GET /api/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId/attachments/:attachmentId': { as: 'contractor' },
  'DELETE /api/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId/attachments/:attachmentId': { as: 'contractor' },
};

/** Path parameters that are not ids of a record (a catalog kind, an attachment's position in a message, an export's table). */
const NOT_IDS = new Set(['kind', 'index', 'token', 'table']);
const paramsOf = (path: string) => [...path.matchAll(/:(\w+)/g)].map((m) => m[1]).filter((p) => !NOT_IDS.has(p));
/** Routes outside any project (the development mail sink: one id, administrators only) are left out. */
const inScope = (path: string) => path.startsWith('/api/projects/:projectId/');

let h: Harness;
const clients = {} as Record<Role, Client>;
const world = {} as Record<'A' | 'B', Ids>;

async function makeProject(designer: Client, users: Record<Role, { id: string; email: string }>): Promise<Ids> {
  const projectId: string = (await designer.send('POST', '/api/projects', { name: `Nested ${randomUUID().slice(0, 6)}` }).expect(201)).body.project.id;
  for (const role of ['contractor', 'inspector'] as const)
    await designer.send('POST', `/api/projects/${projectId}/members`, { email: users[role].email, role }).expect(201);
  // people who are members of this project only
  const only = await makeUser(h.db, { accountRole: 'contractor' });
  await designer.send('POST', `/api/projects/${projectId}/members`, { email: only.email, role: 'contractor' }).expect(201);
  const onlyInspector = await makeUser(h.db, { accountRole: 'inspector' });
  await designer.send('POST', `/api/projects/${projectId}/members`, { email: onlyInspector.email, role: 'inspector' }).expect(201);
  const created = (
    await designer.send('POST', `/api/projects/${projectId}/systems`, { name: 'Nested', service: 'cold', document: smallDocument() }).expect(201)
  ).body;
  const systemId: string = created.system.id;
  const revisionId: string = created.revision.id;
  const sys = `/api/projects/${projectId}/systems/${systemId}`;
  await designer.send('POST', `${sys}/revisions/${revisionId}/issue`, { version: 1, attestation: ATTESTATION }).expect(200);
  const draftId: string = (await designer.send('POST', `${sys}/revisions`, { fromRevisionId: revisionId }).expect(201)).body.revision.id;
  const fc = (await clients.contractor.send('POST', `${sys}/field-changes`, { revisionId, title: 'Nested substitution' }).expect(201)).body.fieldChange;
  const attachment = (await upload(clients.contractor, `${sys}/field-changes/${fc.id}`, tinyPdf(), 'sheet.pdf', 'application/pdf').expect(201)).body.attachment;
  const [review] = await h.db('reviews').insert({ project_id: projectId, revision_id: revisionId, reviewer_id: users.inspector.id }).returning('id');
  // the review accepted with one comment: it has a comment id and an acceptance record
  const accepted = (
    await clients.inspector
      .send('PATCH', `/api/projects/${projectId}/reviews/${review.id}`, {
        decision: 'accepted',
        items: [{ itemType: 'general', comment: 'Nested comment' }],
        version: 1,
      })
      .expect(200)
  ).body.review;
  const [message] = await h
    .db('outbox')
    .insert({
      kind: 'summary',
      project_id: projectId,
      revision_id: revisionId,
      to_address: 'nested@test.example',
      subject: 'Nested',
      text_body: 'Nested',
      status: 'failed',
      attempts: 3,
      max_attempts: 3,
      last_error: 'nested',
    })
    .returning('id');
  const entryId: string = (
    await designer
      .send('POST', `/api/projects/${projectId}/catalog/entries`, { kind: 'fitting-type', label: 'Nested entry', source: 'Invented sheet', data: { k: 0.5 } })
      .expect(201)
  ).body.entry.id;
  return {
    projectId,
    systemId,
    revisionId,
    draftId,
    fieldChangeId: fc.id,
    attachmentId: attachment.id,
    reviewId: review.id,
    commentId: accepted.items[0].id,
    messageId: message.id,
    userId: only.id,
    entryId,
    kind: 'fitting-type',
    table: 'fixtures',
    inspectorId: onlyInspector.id,
  };
}

/** The request of `key` with `ids`; the path's parameters and the row's body or query are filled from them. */
function send(key: string, ids: Ids) {
  const [method, path] = key.split(' ');
  const row = ROWS[key];
  const url = path.replace(/:(\w+)/g, (_, p: string) => ids[p]) + (row.query?.(ids) ?? '');
  const client = clients[row.as];
  if (row.upload) return upload(client, url.replace(/\/attachments$/, ''), tinyPdf(), 'nested.pdf', 'application/pdf');
  if (method === 'GET') return client.get(url);
  const body = row.body?.(ids);
  return client.send(method, url, body);
}

beforeAll(async () => {
  h = startHarness();
  const users = {
    designer: await makeUser(h.db, { accountRole: 'designer' }),
    contractor: await makeUser(h.db, { accountRole: 'contractor' }),
    inspector: await makeUser(h.db, { accountRole: 'inspector' }),
  };
  for (const role of ['designer', 'contractor', 'inspector'] as const) clients[role] = await signedIn(h, users[role]);
  world.A = await makeProject(clients.designer, users);
  world.B = await makeProject(clients.designer, users);
}, 120_000);
afterAll(() => h?.close());

/** Routes with two or more ids, reads first and removals last (a removal would make later controls 404). */
function multiIdRoutes(): string[] {
  const order = (m: string) => (m === 'GET' ? 0 : m === 'DELETE' ? 2 : 1);
  return h.headroom.apiRoutes
    .filter((r) => inScope(r.path))
    .map((r) => `${r.method} ${r.path}`)
    .filter((key) => paramsOf(key.split(' ')[1]).length + (ROWS[key]?.extraIds?.length ?? 0) >= 2)
    .sort((a, b) => order(a.split(' ')[0]) - order(b.split(' ')[0]));
}

describe('every id in a request belongs to the one before it', () => {
  it('when the app registers a route with two or more ids, then this test has a row for it', () => {
    const routes = multiIdRoutes();
    expect(routes.length).toBeGreaterThan(20);
    expect(
      routes.filter((k) => !ROWS[k]),
      'add a row to ROWS in tests/api/nestedIds.test.ts',
    ).toEqual([]);
  });

  it('when one id comes from another project, then every such route refuses it, and the same request with its own ids is found', async () => {
    const problems: string[] = [];
    for (const key of multiIdRoutes()) {
      if (!ROWS[key]) continue;
      const path = key.split(' ')[1];
      const pathIds = paramsOf(path).slice(1);
      for (const id of [...pathIds, ...(ROWS[key].extraIds ?? [])]) {
        const mixed = await send(key, { ...world.A, [id]: world.B[id] });
        const fromBody = !pathIds.includes(id);
        const refused = fromBody ? mixed.status >= 400 && mixed.status < 500 && mixed.status !== 401 : mixed.status === 404;
        if (!refused) problems.push(`${key} with ${id} of another project: ${mixed.status} ${JSON.stringify(mixed.body).slice(0, 160)}`);
      }
      const own = await send(key, world.A);
      if (own.status === 404 || own.status >= 500)
        problems.push(`${key} with its own ids: ${own.status} ${JSON.stringify(own.body).slice(0, 160)} (the world of this test is wrong)`);
    }
    expect(problems).toEqual([]);
  }, 180_000);
});
