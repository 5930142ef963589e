import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeUser, projectWithRoles, signedIn, startHarness, type Harness } from './support/harness';
import { demoDocument, issuedSystem } from './support/smtpSink';

let h: Harness;
beforeAll(() => {
  h = startHarness();
});
afterAll(() => h.close());

async function sentToInspector() {
  const p = await projectWithRoles(h);
  const s = await issuedSystem(p.designer, p.projectId, demoDocument());
  await p.designer.send('POST', `${s.base}/summary/send`, { inspectorIds: [p.inspectorUser.id] }).expect(202);
  const inspector = await signedIn(h, p.inspectorUser);
  return { ...p, ...s, inspector };
}

describe('the inspector’s review', () => {
  it('when a summary is sent, then it is in the inspector’s inbox with its PDF, and a return with comments reaches the designer', async () => {
    const { inspector, designer, projectId, revisionId, systemId, base, inspectorUser } = await sentToInspector();
    const inbox = (await inspector.get('/api/inbox').expect(200)).body.items;
    const item = inbox.find((i: { review: { revisionId: string } }) => i.review.revisionId === revisionId);
    expect(item.review.status).toBe('received');
    expect(item.summary.status).toBe('ready');
    expect(item.viewPath).toBe(`/projects/${projectId}/systems/${systemId}/revisions/${revisionId}/result`);
    expect((await inspector.get(item.summary.pdfUrl).expect(200)).headers['content-type']).toBe('application/pdf');

    const items = [
      { itemType: 'segment', itemId: 'riser-2', comment: 'Show the riser support spacing.' },
      { itemType: 'input', itemId: 'source', comment: 'The pressure letter is older than a year; send a current flow test.' },
    ];
    const decided = await inspector
      .send('PATCH', `/api/projects/${projectId}/reviews/${item.review.id}`, {
        decision: 'returned',
        comment: 'Two items to address.',
        items,
        version: item.review.version,
      })
      .expect(200);
    expect(decided.body.review.status).toBe('returned');
    expect(decided.body.review.decidedAt).not.toBeNull();

    const seen = (await designer.get(`${base}/reviews`).expect(200)).body.reviews;
    expect(seen).toHaveLength(1);
    expect(seen[0]).toMatchObject({ status: 'returned', comment: 'Two items to address.', reviewer: { id: inspectorUser.id } });
    // each comment as sent, with its id and no reply yet (the designer answers it: tests/api/reviewLoop.test.ts)
    expect(
      seen[0].items.map(({ itemType, itemId, comment }: { itemType: string; itemId: string | null; comment: string }) => ({ itemType, itemId, comment })),
    ).toEqual(items);
    expect(seen[0].items.every((i: { id: string; reply: unknown }) => /^\d+$/.test(i.id) && i.reply === null)).toBe(true);
    const onProject = (await designer.get(`/api/projects/${projectId}/reviews`).expect(200)).body.reviews;
    expect(onProject.map((r: { id: string }) => r.id)).toEqual([item.review.id]);

    // a decision is final; a return needs a reason
    const again = await inspector.send('PATCH', `/api/projects/${projectId}/reviews/${item.review.id}`, {
      decision: 'accepted',
      version: decided.body.review.version,
    });
    expect(again.status).toBe(409);
  });

  it('when an inspector returns without a reason, or someone else decides, then it is refused', async () => {
    const { inspector, designer, projectId, revisionId } = await sentToInspector();
    const review = (await designer.get(`/api/projects/${projectId}/reviews`).expect(200)).body.reviews.find(
      (r: { revisionId: string }) => r.revisionId === revisionId,
    );
    const bare = await inspector.send('PATCH', `/api/projects/${projectId}/reviews/${review.id}`, { decision: 'returned', version: review.version });
    expect(bare.status).toBe(400);
    expect(Object.keys(bare.body.error.fields)).toContain('comment');
    expect((await designer.send('PATCH', `/api/projects/${projectId}/reviews/${review.id}`, { decision: 'accepted', version: review.version })).status).toBe(
      403,
    );
    // a second inspector of the project, to whom it was not sent
    const other = await makeUser(h.db, { accountRole: 'inspector' });
    await designer.send('POST', `/api/projects/${projectId}/members`, { email: other.email, role: 'inspector' }).expect(201);
    const otherClient = await signedIn(h, other);
    expect((await otherClient.send('PATCH', `/api/projects/${projectId}/reviews/${review.id}`, { decision: 'accepted', version: review.version })).status).toBe(
      403,
    );
    const accepted = await inspector
      .send('PATCH', `/api/projects/${projectId}/reviews/${review.id}`, { decision: 'accepted', version: review.version })
      .expect(200);
    expect(accepted.body.review.status).toBe('accepted');
  });

  it('when an inspector does not belong to a project, then its summaries, reviews and inbox entries are hidden from them', async () => {
    const { projectId, base, revisionId } = await sentToInspector();
    const stranger = await signedIn(h, await makeUser(h.db, { accountRole: 'inspector' }));
    expect((await stranger.get(`${base}/summary`)).status).toBe(404);
    expect((await stranger.get(`${base}/summary.pdf`)).status).toBe(404);
    expect((await stranger.get(`${base}/reviews`)).status).toBe(404);
    expect((await stranger.get(`/api/projects/${projectId}/reviews`)).status).toBe(404);
    const inbox = (await stranger.get('/api/inbox').expect(200)).body.items;
    expect(inbox.filter((i: { review: { revisionId: string } }) => i.review.revisionId === revisionId)).toEqual([]);
  });

  it('when an inspector is removed from the project, then the summary leaves their inbox', async () => {
    const { inspector, designer, projectId, revisionId, inspectorUser } = await sentToInspector();
    expect((await inspector.get('/api/inbox').expect(200)).body.items.some((i: { review: { revisionId: string } }) => i.review.revisionId === revisionId)).toBe(
      true,
    );
    await designer.send('DELETE', `/api/projects/${projectId}/members/${inspectorUser.id}`).expect(204);
    expect((await inspector.get('/api/inbox').expect(200)).body.items.some((i: { review: { revisionId: string } }) => i.review.revisionId === revisionId)).toBe(
      false,
    );
  });

  it('when things happen on a project, then its designers read who did what and when in the audit log, and others may not', async () => {
    const { inspector, designer, projectId, revisionId, designerUser, inspectorUser, contractorUser } = await sentToInspector();
    const review = (await inspector.get('/api/inbox').expect(200)).body.items.find(
      (i: { review: { revisionId: string } }) => i.review.revisionId === revisionId,
    ).review;
    await inspector.send('PATCH', `/api/projects/${projectId}/reviews/${review.id}`, { decision: 'accepted', version: review.version }).expect(200);
    const log = (await designer.get(`/api/projects/${projectId}/audit`).expect(200)).body;
    const actions = log.entries.map((e: { action: string }) => e.action);
    for (const a of ['revision.issued', 'summary.ready', 'summary.sent', 'review.accepted']) expect(actions).toContain(a);
    const sent = log.entries.find((e: { action: string }) => e.action === 'summary.sent');
    expect(sent.actor).toEqual({ id: designerUser.id, name: expect.any(String) });
    expect(sent.details.to).toEqual([inspectorUser.email]);
    expect(log.entries.find((e: { action: string }) => e.action === 'review.accepted').actor.id).toBe(inspectorUser.id);
    // newest first, paged
    const ids = log.entries.map((e: { id: number }) => e.id);
    expect([...ids].sort((x, y) => y - x)).toEqual(ids);
    const page = (await designer.get(`/api/projects/${projectId}/audit?limit=2`).expect(200)).body;
    expect(page.entries).toHaveLength(2);
    const next = (await designer.get(`/api/projects/${projectId}/audit?limit=2&before=${page.nextBefore}`).expect(200)).body;
    expect(next.entries[0].id).toBeLessThan(page.entries[1].id);

    expect((await inspector.get(`/api/projects/${projectId}/audit`)).status).toBe(403);
    expect((await (await signedIn(h, contractorUser)).get(`/api/projects/${projectId}/audit`)).status).toBe(403);
  });
});
