import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { projectWithRoles, signedIn, startHarness, type Harness } from './support/harness';
import { demoDocument, FAST_OUTBOX, issuedSystem, SmtpSink, waitForMessages } from './support/smtpSink';

let sink: SmtpSink;
let h: Harness;
beforeAll(async () => {
  sink = new SmtpSink();
  await sink.start(0);
  h = startHarness({ SMTP_HOST: '127.0.0.1', SMTP_PORT: String(sink.port), MAIL_FROM: 'Headroom <headroom@headroom.test>', ...FAST_OUTBOX });
  h.headroom.outbox.start();
});
afterAll(async () => {
  await h.close();
  await sink.stop();
});

async function sentToInspector() {
  const p = await projectWithRoles(h);
  const s = await issuedSystem(p.designer, p.projectId, demoDocument());
  await p.designer.send('POST', `${s.base}/summary/send`, { inspectorIds: [p.inspectorUser.id] }).expect(202);
  const inspector = await signedIn(h, p.inspectorUser);
  const inbox = (await inspector.get('/api/inbox').expect(200)).body.items;
  const item = inbox.find((i: { review: { revisionId: string } }) => i.review.revisionId === s.revisionId);
  return { ...p, ...s, inspector, review: item.review };
}

describe('the designer hears the inspector’s decision', () => {
  it('when the inspector returns the summary with two item comments, then the designer who sent it gets one e-mail naming the items by their labels', async () => {
    const { inspector, projectId, revisionId, systemId, designerUser, review } = await sentToInspector();
    const items = [
      { itemType: 'segment', itemId: 'riser-2', comment: 'Show the riser support spacing.' },
      { itemType: 'fixture', itemId: 'shower-201', comment: 'Confirm the valve model.' },
    ];
    await inspector
      .send('PATCH', `/api/projects/${projectId}/reviews/${review.id}`, {
        decision: 'returned',
        comment: 'Two items to address.',
        items,
        version: review.version,
      })
      .expect(200);
    const rows = await waitForMessages(h, { revision_id: revisionId, kind: 'review-decision' }, 'sent', 1);
    expect(rows).toHaveLength(1);
    expect(rows[0].to_address).toBe(designerUser.email);
    const mail = sink.to(designerUser.email).filter((m) => m.parsed.headers.get('x-headroom-outbox-id') === rows[0].id);
    expect(mail).toHaveLength(1);
    const text = mail[0].parsed.text ?? '';
    expect(mail[0].parsed.subject).toMatch(/^Returned with comments: /);
    expect(text).toContain('Two items to address.');
    // Items are named as the designer typed them (the demo's labels), never only by internal id.
    expect(text).toContain('segment Riser to level 2: Show the riser support spacing.');
    expect(text).toContain('fixture Shower, apartment 201: Confirm the valve model.');
    expect(text).toContain(`/projects/${projectId}/systems/${systemId}/revisions/${revisionId}/result`);
  });

  it('when the inspector accepts, then the designer gets an "Accepted" e-mail and no one else does', async () => {
    const { inspector, projectId, revisionId, designerUser, inspectorUser, review } = await sentToInspector();
    await inspector.send('PATCH', `/api/projects/${projectId}/reviews/${review.id}`, { decision: 'accepted', version: review.version }).expect(200);
    const rows = await waitForMessages(h, { revision_id: revisionId, kind: 'review-decision' }, 'sent', 1);
    expect(rows.map((r: { to_address: string }) => r.to_address)).toEqual([designerUser.email]);
    const mail = sink.to(designerUser.email).filter((m) => m.parsed.headers.get('x-headroom-outbox-id') === rows[0].id);
    expect(mail[0].parsed.subject).toMatch(/^Accepted: /);
    expect(sink.to(inspectorUser.email).filter((m) => /^(Accepted|Returned)/.test(m.parsed.subject ?? ''))).toHaveLength(0);
  });
});
