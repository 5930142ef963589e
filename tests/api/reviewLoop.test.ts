import { ATTESTATION } from './support/attestation';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { makeUser, projectWithRoles, signedIn, startHarness, type Client, type Harness } from './support/harness';
import { demoDocument, FAST_OUTBOX, issuedSystem, SmtpSink, waitForMessages } from './support/smtpSink';

/**
 * The review loop through the API: a returned review marks the system and the project, the
 * designer answers each item comment, the next issued revision freezes the answers and prints them
 * ("Response to review comments"), the inspector's review of it has the compare and the answers,
 * and an acceptance stores a one-page record the project's members download.
 */
let sink: SmtpSink;
let h: Harness;
let tmp: string;
beforeAll(async () => {
  sink = new SmtpSink();
  await sink.start(0);
  h = startHarness({ SMTP_HOST: '127.0.0.1', SMTP_PORT: String(sink.port), MAIL_FROM: 'Headroom <headroom@headroom.test>', ...FAST_OUTBOX });
  h.headroom.outbox.start();
  tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'review-loop-'));
});
afterAll(async () => {
  await h.close();
  await sink.stop();
  fs.rmSync(tmp, { recursive: true, force: true });
});

/** poppler-utils' pdftotext; runs of white space made single (it wraps as it likes). */
function pdfText(bytes: Buffer, args: string[] = []): string {
  const file = path.join(tmp, `${randomUUID()}.pdf`);
  fs.writeFileSync(file, bytes);
  // -raw: the content order, so a table cell's wrapped lines read together
  return execFileSync('pdftotext', ['-raw', ...args, file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
}
const pdfBytes = async (client: Client, url: string) =>
  (await client.get(url).responseType('blob').expect(200).expect('Content-Type', 'application/pdf')).body as Buffer;

const ITEMS = [
  { itemType: 'segment', itemId: 'riser-2', comment: 'Show the fittings on the riser to level 2.' },
  { itemType: 'fixture', itemId: 'shower-201', comment: 'Confirm the shower valve model.' },
];

/** Issued, sent, and returned by the project's inspector with two item comments. */
async function returnedSystem() {
  const p = await projectWithRoles(h);
  const s = await issuedSystem(p.designer, p.projectId, demoDocument());
  await p.designer.send('POST', `${s.base}/summary/send`, { inspectorIds: [p.inspectorUser.id] }).expect(202);
  const inspector = await signedIn(h, p.inspectorUser);
  const review = (await inspector.get(`${s.base}/reviews`).expect(200)).body.reviews[0];
  const returned = (
    await inspector
      .send('PATCH', `/api/projects/${p.projectId}/reviews/${review.id}`, {
        decision: 'returned',
        comment: 'Two items to address.',
        items: ITEMS,
        version: review.version,
      })
      .expect(200)
  ).body.review;
  const systemUrl = `/api/projects/${p.projectId}/systems/${s.systemId}`;
  return {
    ...p,
    ...s,
    inspector,
    review: returned,
    systemUrl,
    replyUrl: (commentId: string) => `/api/projects/${p.projectId}/reviews/${review.id}/comments/${commentId}/reply`,
  };
}

/** The designer's next revision: a new draft with 4 more standard elbows on the riser to level 2, issued. */
async function issueNext(w: Awaited<ReturnType<typeof returnedSystem>>) {
  const draft = (await w.designer.send('POST', `${w.systemUrl}/revisions`, { fromRevisionId: w.revisionId }).expect(201)).body.revision;
  const document = structuredClone(draft.document);
  const riser = document.segments.find((s: { id: string }) => s.id === 'riser-2');
  riser.fittings = [...riser.fittings, { typeId: 'elbow-90-standard', count: 4 }];
  const saved = (await w.designer.send('PUT', `${w.systemUrl}/revisions/${draft.id}/document`, { document, version: draft.version }).expect(200)).body.revision;
  const issued = await w.designer.send('POST', `${w.systemUrl}/revisions/${draft.id}/issue`, { version: saved.version, attestation: ATTESTATION });
  expect(issued.status, JSON.stringify(issued.body)).toBe(200);
  return { revisionId: draft.id as string, base: `${w.systemUrl}/revisions/${draft.id}` };
}

describe('the returned-to-you marker', () => {
  it('when the inspector returns the issued revision, then the system and the project carry the marker until the next revision is issued', async () => {
    const w = await returnedSystem();
    const systems = (await w.designer.get(`/api/projects/${w.projectId}/systems`).expect(200)).body.systems;
    const marker = systems.find((s: { id: string }) => s.id === w.systemId).returned;
    expect(marker).toMatchObject({ reviewId: w.review.id, revisionId: w.revisionId, revisionNumber: 1, comments: 2, answered: 0 });
    expect((await w.designer.get(`${w.systemUrl}`).expect(200)).body.system.returned.reviewId).toBe(w.review.id);
    expect((await w.designer.get(`/api/projects/${w.projectId}`).expect(200)).body.project.returnedSystems).toBe(1);
    const listed = (await w.designer.get('/api/projects').expect(200)).body.projects.find((p: { id: string }) => p.id === w.projectId);
    expect(listed.returnedSystems).toBe(1);

    await issueNext(w);
    expect((await w.designer.get(`${w.systemUrl}`).expect(200)).body.system.returned).toBeNull();
    expect((await w.designer.get(`/api/projects/${w.projectId}`).expect(200)).body.project.returnedSystems).toBe(0);
  });

  it('when the inspector accepts, then there is no marker', async () => {
    const p = await projectWithRoles(h);
    const s = await issuedSystem(p.designer, p.projectId, demoDocument());
    await p.designer.send('POST', `${s.base}/summary/send`, { inspectorIds: [p.inspectorUser.id] }).expect(202);
    const inspector = await signedIn(h, p.inspectorUser);
    const review = (await inspector.get(`${s.base}/reviews`).expect(200)).body.reviews[0];
    await inspector.send('PATCH', `/api/projects/${p.projectId}/reviews/${review.id}`, { decision: 'accepted', version: review.version }).expect(200);
    expect((await p.designer.get(`/api/projects/${p.projectId}/systems/${s.systemId}`).expect(200)).body.system.returned).toBeNull();
  });
});

describe('the designer answers the comments', () => {
  it('when the designer replies to an item comment, then the reply is stored with its author and counted on the marker; other roles and empty replies are refused', async () => {
    const w = await returnedSystem();
    const [first, second] = w.review.items;
    expect(first).toMatchObject({ itemType: 'segment', itemId: 'riser-2', reply: null });
    const answered = (await w.designer.send('PUT', w.replyUrl(first.id), { reply: 'Added the elbows to the riser.' }).expect(200)).body.review;
    const item = answered.items.find((i: { id: string }) => i.id === first.id);
    expect(item.reply.text).toBe('Added the elbows to the riser.');
    expect(item.reply.by).toBe((await h.db('users').where({ id: w.designerUser.id }).first('name')).name);
    expect(answered.items.find((i: { id: string }) => i.id === second.id).reply).toBeNull();
    // a second reply replaces the first until the next issue
    await w.designer.send('PUT', w.replyUrl(first.id), { reply: 'Added four standard elbows to the riser.' }).expect(200);

    const contractor = await signedIn(h, w.contractorUser);
    await contractor.send('PUT', w.replyUrl(second.id), { reply: 'Not mine to answer.' }).expect(403);
    await w.inspector.send('PUT', w.replyUrl(second.id), { reply: 'Not mine to answer.' }).expect(403);
    const empty = await w.designer.send('PUT', w.replyUrl(second.id), { reply: '   ' }).expect(400);
    expect(empty.body.error.fields.reply).toBeTruthy();
    await w.designer.send('PUT', w.replyUrl('999999999'), { reply: 'Nothing there.' }).expect(404);

    const marker = (await w.designer.get(w.systemUrl).expect(200)).body.system.returned;
    expect(marker).toMatchObject({ comments: 2, answered: 1 });
  });

  it('when the next revision is issued, then the replies are frozen (409)', async () => {
    const w = await returnedSystem();
    await w.designer.send('PUT', w.replyUrl(w.review.items[0].id), { reply: 'Added the elbows.' }).expect(200);
    await issueNext(w);
    const late = await w.designer.send('PUT', w.replyUrl(w.review.items[1].id), { reply: 'Too late.' }).expect(409);
    expect(late.body.error.message).toMatch(/frozen/);
  });

  it('when a review was accepted, then its comments take no reply (409)', async () => {
    const p = await projectWithRoles(h);
    const s = await issuedSystem(p.designer, p.projectId, demoDocument());
    await p.designer.send('POST', `${s.base}/summary/send`, { inspectorIds: [p.inspectorUser.id] }).expect(202);
    const inspector = await signedIn(h, p.inspectorUser);
    const review = (await inspector.get(`${s.base}/reviews`).expect(200)).body.reviews[0];
    const accepted = (
      await inspector
        .send('PATCH', `/api/projects/${p.projectId}/reviews/${review.id}`, { decision: 'accepted', items: [ITEMS[0]], version: review.version })
        .expect(200)
    ).body.review;
    await p.designer.send('PUT', `/api/projects/${p.projectId}/reviews/${review.id}/comments/${accepted.items[0].id}/reply`, { reply: 'Noted.' }).expect(409);
  });
});

describe('the next revision answers the returned one', () => {
  it('when the designer issues the next revision, then its summary prints each comment with the item as typed and the reply, and the inspector’s review of it has the compare and the answers', async () => {
    const w = await returnedSystem();
    await w.designer.send('PUT', w.replyUrl(w.review.items[0].id), { reply: 'Added four standard elbows to the riser.' }).expect(200);
    const next = await issueNext(w);

    const text = pdfText(await pdfBytes(w.designer, `${next.base}/summary.pdf`));
    expect(text).toContain('Response to review comments');
    expect(text).toContain('Revision 1 was returned by');
    expect(text).toContain('Segment Riser to level 2');
    expect(text).toContain('Show the fittings on the riser to level 2.');
    expect(text).toContain('Added four standard elbows to the riser.');
    expect(text).toContain('Checked fixture Shower, apartment 201');
    expect(text).toContain('Not answered before this revision was issued');
    // the previous revision's summary was made before: it has no such section
    expect(pdfText(await pdfBytes(w.designer, `${w.base}/summary.pdf`))).not.toContain('Response to review comments');

    await w.designer.send('POST', `${next.base}/summary/send`, { inspectorIds: [w.inspectorUser.id] }).expect(202);
    const answers = (await w.inspector.get(`${next.base}/answers`).expect(200)).body.answers;
    expect(answers.reviews.map((r: { id: string }) => r.id)).toEqual([w.review.id]);
    expect(answers.reviews[0].answeredIn).toEqual({ revisionId: next.revisionId, revisionNumber: 2 });
    expect(answers.reviews[0].items[0].reply.text).toBe('Added four standard elbows to the riser.');
    expect(answers.compare.returnedRevision).toEqual({ id: w.revisionId, number: 1 });
    const change = answers.compare.changes.find((c: { elementId: string }) => c.elementId === 'riser-2');
    expect(change.label).toBe('Riser to level 2');
    expect(change.fields[0].field).toBe('fittings');
    expect(change.fields[0].after).toMatch(/4× /);
    expect(change.text).toContain('→');
    // the same fixtures on both sides, with their margins before and after
    expect(answers.compare.fixtures.length).toBeGreaterThan(0);
    expect(
      answers.compare.fixtures.every((f: { issuedMargin: number | null; newMargin: number | null }) => f.issuedMargin !== null && f.newMargin !== null),
    ).toBe(true);

    // the first revision answers nothing
    expect((await w.inspector.get(`${w.base}/answers`).expect(200)).body.answers).toBeNull();
  });
});

describe('the acceptance record', () => {
  it('when the inspector accepts, then a one-page record is stored and every member downloads it; non-members do not', async () => {
    const p = await projectWithRoles(h);
    const s = await issuedSystem(p.designer, p.projectId, demoDocument());
    await p.designer.send('POST', `${s.base}/summary/send`, { inspectorIds: [p.inspectorUser.id] }).expect(202);
    const inspector = await signedIn(h, p.inspectorUser);
    const review = (await inspector.get(`${s.base}/reviews`).expect(200)).body.reviews[0];
    const accepted = (
      await inspector
        .send('PATCH', `/api/projects/${p.projectId}/reviews/${review.id}`, {
          decision: 'accepted',
          comment: 'Meets the adopted code as read.',
          items: [ITEMS[1]],
          version: review.version,
        })
        .expect(200)
    ).body.review;
    await waitForMessages(h, { revision_id: s.revisionId, kind: 'review-decision' }, 'sent', 1);
    expect(accepted.acceptanceRecord.url).toBe(`/api/projects/${p.projectId}/reviews/${review.id}/acceptance.pdf`);

    const bytes = await pdfBytes(p.designer, accepted.acceptanceRecord.url);
    expect(bytes.subarray(0, 5).toString()).toBe('%PDF-');
    const file = path.join(tmp, `${randomUUID()}.pdf`);
    fs.writeFileSync(file, bytes);
    const info = execFileSync('pdfinfo', [file], { encoding: 'utf8' });
    expect(info).toMatch(/Pages:\s+1\n/);
    const text = pdfText(bytes);
    expect(text).toContain('ACCEPTED');
    expect(text).toContain(p.project.name);
    expect(text).toContain('1, issued');
    expect(text).toContain(s.revision.inputHash);
    expect(text).toContain((await h.db('users').where({ id: p.inspectorUser.id }).first('name')).name);
    expect(text).toContain('Meets the adopted code as read.');
    expect(text).toContain('Checked fixture Shower, apartment 201');
    expect(text).toContain('Confirm the shower valve model.');

    const contractor = await signedIn(h, p.contractorUser);
    expect((await pdfBytes(contractor, accepted.acceptanceRecord.url)).equals(bytes)).toBe(true);
    expect((await pdfBytes(inspector, accepted.acceptanceRecord.url)).equals(bytes)).toBe(true);
    const outsider = await signedIn(h, await makeUser(h.db, { accountRole: 'designer' }));
    await outsider.get(accepted.acceptanceRecord.url).expect(404);
    // the stored record never changes
    await expect(h.db('acceptance_records').where({ review_id: review.id }).update({ sha256: 'x' })).rejects.toThrow(/cannot change/);
  });

  it('when a review is returned, then it has no acceptance record (404)', async () => {
    const w = await returnedSystem();
    expect(w.review.acceptanceRecord).toBeNull();
    await w.designer.get(`/api/projects/${w.projectId}/reviews/${w.review.id}/acceptance.pdf`).expect(404);
  });
});
