import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash, randomUUID } from 'node:crypto';
import { Client, makeUser, projectWithRoles, signedIn, startHarness, type Harness } from './support/harness';
import { WITHHELD_TEXT } from '../../server/mail/devMail';
import { loadConfig } from '../../server/config';
import { demoDocument, FAST_OUTBOX, issuedSystem, SmtpSink, waitForMessages } from './support/smtpSink';

const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

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

async function pdfOf(client: { get: (u: string) => import('supertest').Test }, base: string): Promise<Buffer> {
  return (await client.get(`${base}/summary.pdf`).responseType('blob').expect(200)).body as Buffer;
}

describe('sending the issued summary', () => {
  it('when the designer sends to a member inspector and an outside address, then each gets one message with the PDF byte-identical, the view link, and the outsider an invitation that works', async () => {
    const p = await projectWithRoles(h);
    const { base, revisionId, systemId } = await issuedSystem(p.designer, p.projectId, demoDocument());
    const outsider = `outside-${randomUUID().slice(0, 8)}@reviewers.example`;
    const sent = await p.designer
      .send('POST', `${base}/summary/send`, { inspectorIds: [p.inspectorUser.id], emails: [outsider], message: 'Second floor riser resized.' })
      .expect(202);
    expect(sent.body.messages.map((m: { status: string }) => m.status)).toEqual(['queued', 'queued']);
    expect(sent.body.reviews.map((r: { status: string }) => r.status)).toEqual(['received', 'received']);

    await waitForMessages(h, { revision_id: revisionId }, 'sent', 2);
    const pdf = await pdfOf(p.designer, base);
    const toInspector = sink.to(p.inspectorUser.email);
    const toOutsider = sink.to(outsider);
    expect(toInspector).toHaveLength(1);
    expect(toOutsider).toHaveLength(1);
    const viewUrl = `http://headroom.test/projects/${p.projectId}/systems/${systemId}/revisions/${revisionId}/result`;
    for (const m of [...toInspector, ...toOutsider]) {
      expect(m.envelope.to).toHaveLength(1);
      expect(m.parsed.subject).toContain('revision 1');
      expect(m.parsed.text).toContain(viewUrl);
      expect(m.parsed.text).toContain('Second floor riser resized.');
      expect(m.parsed.attachments).toHaveLength(1);
      expect(m.parsed.attachments[0].contentType).toBe('application/pdf');
      expect(sha(m.parsed.attachments[0].content)).toBe(sha(pdf));
    }
    // the Message-ID is the outbox row's id
    const messages = (await p.designer.get(`${base}/messages`).expect(200)).body.messages;
    expect(messages.map((m: { status: string }) => m.status)).toEqual(['sent', 'sent']);
    for (const m of messages) expect(sink.messages.filter((x) => x.parsed.messageId === m.messageId)).toHaveLength(1);
    expect(messages[0].messageId).toMatch(/^<[0-9a-f-]{36}@headroom\.test>$/);

    // the outsider now has an inspector account in the project, and the link in the mail sets its password
    const token = toOutsider[0].parsed.text!.match(/http:\/\/headroom\.test\/invitations\/(\S+)/)![1];
    expect((await h.db('outbox').where({ revision_id: revisionId }).whereNotNull('secret_url')).length).toBe(0);
    const info = await p.designer.get(`/api/invitations/${token}`).expect(200);
    expect(info.body.email).toBe(outsider);
    const members = (await p.designer.get(`/api/projects/${p.projectId}/members`).expect(200)).body.members;
    expect(members.find((m: { email: string }) => m.email === outsider)?.role).toBe('inspector');
    expect(toInspector[0].parsed.text).not.toContain('/invitations/');
  });

  it('when a recipient is not an inspector of the project, then nothing is queued and the field is named', async () => {
    const p = await projectWithRoles(h);
    const { base, revisionId } = await issuedSystem(p.designer, p.projectId, demoDocument());
    const res = await p.designer.send('POST', `${base}/summary/send`, { inspectorIds: [p.contractorUser.id], emails: [p.designerUser.email] });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['emails.0', 'inspectorIds.0']);
    expect(await h.db('outbox').where({ revision_id: revisionId })).toHaveLength(0);
    expect((await p.designer.send('POST', `${base}/summary/send`, {})).status).toBe(400);
  });

  it('when the SMTP server refuses the message twice (451), then the worker retries with backoff and it arrives exactly once', async () => {
    const p = await projectWithRoles(h);
    const { base, revisionId } = await issuedSystem(p.designer, p.projectId, demoDocument());
    sink.refuseTo.set(p.inspectorUser.email.toLowerCase(), 2);
    await p.designer.send('POST', `${base}/summary/send`, { inspectorIds: [p.inspectorUser.id] }).expect(202);
    const [row] = await waitForMessages(h, { revision_id: revisionId }, 'sent', 1);
    expect(row.attempts).toBe(3);
    expect(row.last_error).toBeNull();
    expect(sink.to(p.inspectorUser.email).filter((m) => m.parsed.headers.get('x-headroom-outbox-id') === row.id)).toHaveLength(1);
    const attempts = await h.db('audit_log').where({ subject_id: row.id, action: 'message.sent' });
    expect(attempts).toHaveLength(1);
  });

  it('when the SMTP server is down during the send, then the message waits, retries and is delivered exactly once after it is back', async () => {
    const p = await projectWithRoles(h);
    const { base, revisionId } = await issuedSystem(p.designer, p.projectId, demoDocument());
    await sink.stop();
    await p.designer.send('POST', `${base}/summary/send`, { inspectorIds: [p.inspectorUser.id] }).expect(202);
    const deadline = Date.now() + 10_000;
    let row;
    do {
      await sleep(30);
      row = await h.db('outbox').where({ revision_id: revisionId }).first();
    } while (row.attempts < 2 && Date.now() < deadline);
    expect(row.attempts).toBeGreaterThanOrEqual(2);
    expect(row.status).not.toBe('sent');
    expect(row.last_error).toMatch(/ECONNREFUSED|ECONNECTION|connect/i);
    const messages = (await p.designer.get(`${base}/messages`).expect(200)).body.messages;
    expect(messages[0].lastError).toBe(row.last_error);

    await sink.start(); // the same port
    const [done] = await waitForMessages(h, { revision_id: revisionId }, 'sent', 1);
    await sleep(200); // room for a duplicate to show up, if there were one
    expect(sink.messages.filter((m) => m.parsed.headers.get('x-headroom-outbox-id') === done.id)).toHaveLength(1);
  });

  it('when every attempt fails, then the message is marked failed with the reason, and the sender can queue it again', async () => {
    const p = await projectWithRoles(h);
    const { base, revisionId } = await issuedSystem(p.designer, p.projectId, demoDocument());
    sink.refuseNext = 1000;
    try {
      await p.designer.send('POST', `${base}/summary/send`, { inspectorIds: [p.inspectorUser.id] }).expect(202);
      const [failed] = await waitForMessages(h, { revision_id: revisionId }, 'failed', 1);
      expect(failed.attempts).toBe(Number(FAST_OUTBOX.OUTBOX_MAX_ATTEMPTS));
      const info = (await p.designer.get(`${base}/messages`).expect(200)).body.messages[0];
      expect(info.status).toBe('failed');
      expect(info.lastError).toMatch(/451/);
      const contractor = await signedIn(h, p.contractorUser);
      expect((await contractor.send('POST', `/api/projects/${p.projectId}/messages/${failed.id}/retry`)).status).toBe(403);
    } finally {
      sink.refuseNext = 0;
    }
    const failed = await h.db('outbox').where({ revision_id: revisionId }).first();
    const again = await p.designer.send('POST', `/api/projects/${p.projectId}/messages/${failed.id}/retry`).expect(200);
    expect(again.body.message.status).toBe('queued');
    await waitForMessages(h, { revision_id: revisionId }, 'sent', 1);
    expect(sink.messages.filter((m) => m.parsed.headers.get('x-headroom-outbox-id') === failed.id)).toHaveLength(1);
  });

  it('when the server restarts with messages queued (and one claimed by a worker that crashed), then each is delivered exactly once', async () => {
    const p = await projectWithRoles(h);
    const { base, revisionId } = await issuedSystem(p.designer, p.projectId, demoDocument());
    await h.headroom.outbox.stop();
    try {
      const emails = Array.from({ length: 6 }, (_, i) => `restart-${i}-${randomUUID().slice(0, 6)}@reviewers.example`);
      await p.designer.send('POST', `${base}/summary/send`, { emails }).expect(202);
      const rows = await h.db('outbox').where({ revision_id: revisionId }).orderBy('to_address');
      expect(rows).toHaveLength(6);
      // a worker that claimed one and died before sending: its lease ran out
      await h
        .db('outbox')
        .where({ id: rows[0].id })
        .update({ status: 'sending', attempts: 1, lease_owner: 'worker-crashed', lease_until: h.db.raw(`now() - interval '1 second'`) });

      // server A starts, delivers some, and is stopped mid-way
      const a = startHarness({ SMTP_HOST: '127.0.0.1', SMTP_PORT: String(sink.port), ...FAST_OUTBOX });
      a.headroom.outbox.start();
      const deadline = Date.now() + 10_000;
      while ((await h.db('outbox').where({ revision_id: revisionId, status: 'sent' })).length < 1 && Date.now() < deadline) await sleep(5);
      await a.close();
      // server B picks up the rest
      const b = startHarness({ SMTP_HOST: '127.0.0.1', SMTP_PORT: String(sink.port), ...FAST_OUTBOX });
      b.headroom.outbox.start();
      try {
        await waitForMessages(h, { revision_id: revisionId }, 'sent', 6);
        await sleep(200);
      } finally {
        await b.close();
      }
      for (const r of rows)
        expect(
          sink.messages.filter((m) => m.parsed.headers.get('x-headroom-outbox-id') === r.id),
          r.to_address,
        ).toHaveLength(1);
    } finally {
      h.headroom.outbox.start();
    }
  });

  it('when an administrator creates an account, then the invitation goes out through the outbox', async () => {
    const admin = await signedIn(h, await makeUser(h.db, { isAdmin: true }));
    const email = `invitee-${randomUUID().slice(0, 8)}@test.example`;
    const created = await admin.send('POST', '/api/users', { email, name: 'Invited Person', accountRole: 'inspector' }).expect(201);
    const [row] = await waitForMessages(h, { recipient_user_id: created.body.user.id, kind: 'invitation' }, 'sent', 1);
    const mail = sink.messages.find((m) => m.parsed.headers.get('x-headroom-outbox-id') === row.id)!;
    expect(mail.envelope.to).toEqual([email]);
    expect(mail.parsed.text).toContain(created.body.invitation.url);
  });
});

describe('the development mail page (HEADROOM_DEV_MAIL=1)', () => {
  let dev: Harness;
  beforeAll(async () => {
    // one worker on the shared outbox: the file's other worker would otherwise claim this
    // harness's messages and deliver them to the test sink instead of the in-process one
    await h.headroom.outbox.stop();
    dev = startHarness({ HEADROOM_DEV_MAIL: '1', HEADROOM_DEV_MAIL_PAGE: '1', ...FAST_OUTBOX });
    dev.headroom.outbox.start();
  });
  afterAll(() => dev.close());

  it('when mail is sent, then the in-process sink catches it, and an administrator who is not its recipient sees who and what about, never its text or attachment', async () => {
    const p = await projectWithRoles(dev);
    const { base, revisionId } = await issuedSystem(p.designer, p.projectId, demoDocument());
    await p.designer.send('POST', `${base}/summary/send`, { inspectorIds: [p.inspectorUser.id] }).expect(202);
    const [row] = await waitForMessages(dev, { revision_id: revisionId }, 'sent', 1);
    const admin = await signedIn(dev, await makeUser(dev.db, { isAdmin: true }));
    const list = (await admin.get(`/api/dev/mail?to=${encodeURIComponent(p.inspectorUser.email)}`).expect(200)).body.messages;
    expect(list).toHaveLength(1);
    const caught = list.find((m: { messageId: string }) => m.messageId?.includes(row.id));
    expect(caught).toBeDefined();
    expect(caught.envelopeTo).toEqual([p.inspectorUser.email]);
    expect(caught.subject).toMatch(/summary|revision/i);
    // the summary PDF and the text are the inspector's (the design screens deny administrators too)
    expect(caught.text).toBe(WITHHELD_TEXT);
    expect(caught.attachments).toEqual([]);
    expect((await admin.get(`/api/dev/mail/${caught.id}/attachments/0`)).status).toBe(404);
    expect((await admin.get(`/api/dev/mail/${caught.id}`).expect(200)).body.message.text).toBe(WITHHELD_TEXT);
    // the sink itself holds the whole message, PDF included (the recipient's mailbox)
    const stored = await dev
      .db('dev_mail')
      .whereRaw('envelope_to @> ?::jsonb', [JSON.stringify([p.inspectorUser.email])])
      .first('raw');
    const pdf = (await p.designer.get(`${base}/summary.pdf`).responseType('blob').expect(200)).body as Buffer;
    const { simpleParser } = await import('mailparser');
    expect((await simpleParser(stored.raw)).attachments[0].content.equals(pdf)).toBe(true);

    expect((await p.designer.get('/api/dev/mail')).status).toBe(403);
    expect((await admin.get('/api/dev/mail/999999999')).status).toBe(404);
  });

  it('when an administrator asks for a reset link, then only that administrator sees its text; another administrator does not see the link', async () => {
    const me = await makeUser(dev.db, { isAdmin: true });
    const other = await signedIn(dev, await makeUser(dev.db, { isAdmin: true }));
    const anonymous = new Client(dev);
    await anonymous.refreshToken();
    await anonymous.send('POST', '/api/auth/password-reset', { email: me.email }).expect(202);
    const self = await signedIn(dev, me);
    let mine: { text: string; id: number } | undefined;
    const deadline = Date.now() + 15_000;
    while (!mine && Date.now() < deadline) {
      mine = (await self.get(`/api/dev/mail?to=${encodeURIComponent(me.email)}`).expect(200)).body.messages[0];
      if (!mine) await new Promise((r) => setTimeout(r, 50));
    }
    expect(mine?.text).toMatch(/reset-password\?token=/);
    const seen = (await other.get(`/api/dev/mail/${mine!.id}`).expect(200)).body.message;
    expect(seen.text).toBe(WITHHELD_TEXT);
    expect(JSON.stringify(seen)).not.toMatch(/token=/);
  });

  it('when the sink runs without HEADROOM_DEV_MAIL_PAGE=1, then the mail API answers 404 even to administrators', async () => {
    const quiet = startHarness({ HEADROOM_DEV_MAIL: '1' });
    try {
      const admin = await signedIn(quiet, await makeUser(quiet.db, { isAdmin: true }));
      expect((await admin.get('/api/dev/mail')).status).toBe(404);
    } finally {
      await quiet.close();
    }
  });

  it('when NODE_ENV=production, then the development sink is refused at start', () => {
    expect(() =>
      loadConfig({ NODE_ENV: 'production', HEADROOM_DEV_MAIL: '1', DATABASE_URL: 'postgres://x@127.0.0.1/x', SESSION_SECRET: 'x'.repeat(40) }),
    ).toThrow(/HEADROOM_DEV_MAIL/);
    expect(loadConfig({ NODE_ENV: 'development', DATABASE_URL: 'postgres://x@127.0.0.1/x', SESSION_SECRET: 'x'.repeat(40) }).HEADROOM_DEV_MAIL).toBe('0');
  });
});
