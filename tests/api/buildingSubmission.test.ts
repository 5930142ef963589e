import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fs from 'node:fs';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import { projectWithRoles, signedIn, startHarness, type Harness } from './support/harness';
import { demoDocument, FAST_OUTBOX, issuedSystem, SmtpSink, waitForMessages } from './support/smtpSink';

/**
 * One submission for a building: the cold and hot systems of the invented Alder & Finch project
 * sent to the inspector together — one e-mail with one PDF per system, one review per system
 * (grouped by the package), decided per system.
 */
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

function hotDocument(): Record<string, unknown> {
  const file = path.resolve(new URL('../../src/engine/examples/alder-finch-hot.json', import.meta.url).pathname);
  return { ...JSON.parse(fs.readFileSync(file, 'utf8')), id: randomUUID() };
}

describe('one submission for a building', () => {
  it('when the designer sends the cold and hot systems together, then the inspector gets one e-mail with both PDFs and one review per system, decided per system', async () => {
    const p = await projectWithRoles(h);
    const cold = await issuedSystem(p.designer, p.projectId, demoDocument(), 'Domestic cold water');
    const hot = await issuedSystem(p.designer, p.projectId, hotDocument(), 'Domestic hot water');
    const sent = (
      await p.designer
        .send('POST', `/api/projects/${p.projectId}/submissions`, {
          systemIds: [cold.systemId, hot.systemId],
          inspectorIds: [p.inspectorUser.id],
          message: 'The building’s two systems.',
        })
        .expect(202)
    ).body;
    expect(sent.messages).toHaveLength(1);
    expect(sent.reviews).toHaveLength(2);
    expect(new Set(sent.reviews.map((r: { packageId: string }) => r.packageId))).toEqual(new Set([sent.packageId]));
    expect(sent.reviews.map((r: { systemName: string }) => r.systemName).sort()).toEqual(['Domestic cold water', 'Domestic hot water']);

    const rows = await waitForMessages(h, { id: sent.messages[0].id }, 'sent', 1);
    const mail = sink.to(p.inspectorUser.email).filter((m) => m.parsed.headers.get('x-headroom-outbox-id') === rows[0].id);
    expect(mail).toHaveLength(1);
    const attachments = mail[0].parsed.attachments;
    expect(attachments).toHaveLength(2);
    expect(attachments.every((a) => a.contentType === 'application/pdf' && a.content.subarray(0, 5).toString() === '%PDF-')).toBe(true);
    expect(attachments[0].filename).toContain('domestic-cold-water');
    expect(attachments[1].filename).toContain('domestic-hot-water');
    const text = mail[0].parsed.text ?? '';
    expect(text).toContain('1. Domestic cold water, revision 1');
    expect(text).toContain('2. Domestic hot water, revision 1');
    expect(text).toContain(`/projects/${p.projectId}/systems/${hot.systemId}/revisions/${hot.revisionId}/result`);
    expect(text).toContain('The building’s two systems.');

    // the inspector decides each system on its own: comments stay with their system
    const inspector = await signedIn(h, p.inspectorUser);
    const inbox = (await inspector.get('/api/inbox').expect(200)).body.items.filter(
      (i: { review: { packageId: string } }) => i.review.packageId === sent.packageId,
    );
    expect(inbox).toHaveLength(2);
    const coldReview = inbox.find((i: { review: { systemId: string } }) => i.review.systemId === cold.systemId).review;
    const hotReview = inbox.find((i: { review: { systemId: string } }) => i.review.systemId === hot.systemId).review;
    await inspector.send('PATCH', `/api/projects/${p.projectId}/reviews/${coldReview.id}`, { decision: 'accepted', version: coldReview.version }).expect(200);
    await inspector
      .send('PATCH', `/api/projects/${p.projectId}/reviews/${hotReview.id}`, {
        decision: 'returned',
        items: [{ itemType: 'input', itemId: 'waterTemperature', comment: 'State the heater set point.' }],
        version: hotReview.version,
      })
      .expect(200);
    const systems = (await p.designer.get(`/api/projects/${p.projectId}/systems`).expect(200)).body.systems;
    expect(systems.find((s: { id: string }) => s.id === hot.systemId).returned.comments).toBe(1);
    expect(systems.find((s: { id: string }) => s.id === cold.systemId).returned).toBeNull();
  });

  it('when a chosen system has no issued revision or a recipient is not an inspector, then nothing is sent and each field says why', async () => {
    const p = await projectWithRoles(h);
    const cold = await issuedSystem(p.designer, p.projectId, demoDocument());
    const draft = (await p.designer.send('POST', `/api/projects/${p.projectId}/systems`, { name: 'Hot water (draft)', service: 'hot' }).expect(201)).body
      .system;
    const refused = await p.designer
      .send('POST', `/api/projects/${p.projectId}/submissions`, { systemIds: [cold.systemId, draft.id], inspectorIds: [p.contractorUser.id] })
      .expect(400);
    expect(refused.body.error.fields['systemIds.1']).toMatch(/no issued revision/);
    expect(refused.body.error.fields['inspectorIds.0']).toMatch(/not an inspector/);
    expect(await h.db('outbox').where({ project_id: p.projectId, kind: 'summary' })).toHaveLength(0);
    expect(await h.db('submission_packages').where({ project_id: p.projectId })).toHaveLength(0);
    const contractor = await signedIn(h, p.contractorUser);
    await contractor.send('POST', `/api/projects/${p.projectId}/submissions`, { systemIds: [cold.systemId], inspectorIds: [p.inspectorUser.id] }).expect(403);
  });
});
