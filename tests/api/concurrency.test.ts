/**
 * Optimistic locking under real concurrency: many saves of one draft at one version, sent at the
 * same moment over separate connections, on a real PostgreSQL.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeUser, startHarness, type Harness } from './support/harness';
import { smallDocument } from './support/documents';
import { listen, UrlClient, want } from './support/hardening';

let h: Harness;
let server: Awaited<ReturnType<typeof listen>>;
let designer: UrlClient;

beforeAll(async () => {
  h = startHarness();
  server = await listen(h);
  designer = await new UrlClient(server.url).signIn((await makeUser(h.db, { accountRole: 'designer' })).email);
});
afterAll(async () => {
  await server?.close();
  await h?.close();
});

async function draft() {
  const project = (await want(designer.send('POST', '/api/projects', { name: 'Concurrency' }), 201)).body.project;
  const created = (await want(designer.send('POST', `/api/projects/${project.id}/systems`, { name: 'Cold', service: 'cold', document: smallDocument() }), 201))
    .body;
  return { path: `/api/projects/${project.id}/systems/${created.system.id}/revisions/${created.revision.id}`, revisionId: created.revision.id as string };
}

describe('parallel saves of one draft', () => {
  it('when 20 saves of one draft at one version arrive together, then exactly one gets 200, nineteen get 409, and the stored document is the winner’s', async () => {
    const { path, revisionId } = await draft();
    // each save differs (its elbow count), so the stored document tells whose save won
    const bodies = Array.from({ length: 20 }, (_, i) => ({ document: { ...smallDocument({ elbowCount: i + 1 }), id: `doc-${i}` }, version: 1 }));
    // separate clients: separate connections, so the requests really overlap at the database
    const clients = await Promise.all(
      bodies.map(async () => {
        const c = new UrlClient(server.url);
        for (const [k, v] of designer.cookies) c.cookies.set(k, v);
        c.token = designer.token;
        return c;
      }),
    );
    const answers = await Promise.all(bodies.map((b, i) => clients[i].send('PUT', `${path}/document`, b)));
    const statuses = answers.map((a) => a.status);
    expect(statuses.filter((s) => s === 200)).toHaveLength(1);
    expect(statuses.filter((s) => s === 409)).toHaveLength(19);
    for (const a of answers.filter((x) => x.status === 409)) expect(a.body.error.code).toBe('STALE_VERSION');
    const winner = statuses.indexOf(200);
    expect(answers[winner].body.revision.version).toBe(2);

    const row = await h.db('revisions').where({ id: revisionId }).first('version', 'document');
    expect(row.version).toBe(2);
    expect(row.document.id).toBe(`doc-${winner}`);
    expect(row.document.segments[0].fittings[0].count).toBe(winner + 1);
    // one audit entry: the one save that happened
    const saves = await h.db('audit_log').where({ action: 'revision.saved', subject_id: revisionId });
    expect(saves).toHaveLength(1);
  });

  it('when twenty users each save in turn with the version they read, then no update is lost (every save is in the final version count)', async () => {
    const { path, revisionId } = await draft();
    // read-modify-write with retry on 409: every one of the 20 edits must land exactly once
    await Promise.all(
      Array.from({ length: 20 }, async (_, i) => {
        for (let attempt = 0; attempt < 100; attempt++) {
          const current = (await want(designer.get(path), 200)).body.revision;
          const doc = current.document;
          doc.nodes[0].label = `${doc.nodes[0].label}|${i}`;
          const res = await designer.send('PUT', `${path}/document`, { document: doc, version: current.version });
          if (res.status === 200) return;
          expect(res.status).toBe(409);
        }
        throw new Error(`edit ${i} never landed`);
      }),
    );
    const row = await h.db('revisions').where({ id: revisionId }).first('version', 'document');
    expect(row.version).toBe(21);
    const marks = String(row.document.nodes[0].label)
      .split('|')
      .slice(1)
      .map(Number)
      .sort((a, b) => a - b);
    expect(marks).toEqual(Array.from({ length: 20 }, (_, i) => i));
  });
});
