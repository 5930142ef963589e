/**
 * "Forgot my password" (issue 7): the request answers alike for every address, the link comes
 * through the outbox, works once and expires, the new password ends the account's other sessions.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { Client, makeUser, PASSWORD, signedIn, startHarness, type Harness } from './support/harness';
import { FAST_OUTBOX, SmtpSink } from './support/smtpSink';

let sink: SmtpSink;
let h: Harness;
beforeAll(async () => {
  sink = new SmtpSink();
  await sink.start(0);
  h = startHarness({ SMTP_HOST: '127.0.0.1', SMTP_PORT: String(sink.port), ...FAST_OUTBOX });
  h.headroom.outbox.start();
});
afterAll(async () => {
  await h.close();
  await sink.stop();
});

const NEW_PASSWORD = 'a brand new long password';
const LINK = /http:\/\/headroom\.test\/reset-password\?token=([A-Za-z0-9_%-]+)/;

async function anonymous(harness: Harness = h) {
  const client = new Client(harness);
  await client.refreshToken();
  return client;
}

/** Asks for a link for `email` and returns the token from the e-mail that arrives (the n-th to that address). */
async function requestLink(email: string, nth = 1): Promise<string> {
  await (await anonymous()).send('POST', '/api/auth/password-reset', { email }).expect(202);
  const deadline = Date.now() + 15_000;
  while (sink.to(email).length < nth) {
    if (Date.now() > deadline) throw new Error(`no reset e-mail number ${nth} reached ${email}`);
    await new Promise((r) => setTimeout(r, 25));
  }
  const match = sink.to(email)[nth - 1].parsed.text?.match(LINK);
  if (!match) throw new Error(`the e-mail to ${email} has no reset link`);
  return decodeURIComponent(match[1]);
}

const confirm = async (token: string, password = NEW_PASSWORD) => (await anonymous()).send('POST', '/api/auth/password-reset/confirm', { token, password });

describe('asking for a reset link', () => {
  it('when an existing and an unknown e-mail ask, then both get the same 202 and body, and only the real account gets a link and an audit entry', async () => {
    const user = await makeUser(h.db);
    const unknown = `nobody-${randomUUID()}@test.example`;
    const known = await (await anonymous()).send('POST', '/api/auth/password-reset', { email: user.email });
    const other = await (await anonymous()).send('POST', '/api/auth/password-reset', { email: unknown });
    expect(known.status).toBe(202);
    expect(other.status).toBe(202);
    expect(other.body).toEqual(known.body);
    expect(known.body.message).toMatch(/if an active account/i);

    const resets = await h.db('password_resets').where({ user_id: user.id });
    expect(resets).toHaveLength(1);
    // only the hash is stored: 64 hex digits of SHA-256, never the token the e-mail carries
    expect(resets[0].token_hash).toMatch(/^[0-9a-f]{64}$/);
    expect(resets[0].requested_from).toBeTypeOf('string');
    const audit = await h.db('audit_log').where({ action: 'password-reset.requested', subject_id: user.id });
    expect(audit).toHaveLength(1);
    expect(audit[0].actor_id).toBeNull();
    expect(await h.db('outbox').where({ to_address: unknown })).toHaveLength(0);
  });

  it('when a disabled or a not-yet-activated account asks, then the answer is the same and no link is made', async () => {
    const disabled = await makeUser(h.db, { status: 'disabled' });
    const invited = await makeUser(h.db, { status: 'invited' });
    const reference = await (await anonymous()).send('POST', '/api/auth/password-reset', { email: `nobody-${randomUUID()}@test.example` });
    for (const u of [disabled, invited]) {
      const res = await (await anonymous()).send('POST', '/api/auth/password-reset', { email: u.email.toUpperCase() });
      expect(res.status).toBe(202);
      expect(res.body).toEqual(reference.body);
      expect(await h.db('password_resets').where({ user_id: u.id })).toHaveLength(0);
    }
  });

  it('when the e-mail is not an address, then 400 names the email field', async () => {
    const res = await (await anonymous()).send('POST', '/api/auth/password-reset', { email: 'not an address' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['email']);
  });

  it('when the request has no CSRF token, then it is refused like every write', async () => {
    const user = await makeUser(h.db);
    const res = await new Client(h).agent.post('/api/auth/password-reset').send({ email: user.email });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('CSRF_FAILED');
    expect(await h.db('password_resets').where({ user_id: user.id })).toHaveLength(0);
  });
});

describe('the e-mail and its link', () => {
  it('when the mail arrives through the outbox, then its link sets the new password once: the old one stops working and the new one signs in', async () => {
    const user = await makeUser(h.db);
    const token = await requestLink(user.email);
    const mail = sink.to(user.email)[0];
    expect(mail.envelope.to).toEqual([user.email]);
    expect(mail.parsed.subject).toMatch(/new password/i);
    // the outbox erases the one-time link once the message is sent
    const row = await h.db('outbox').where({ recipient_user_id: user.id, kind: 'password-reset' }).first();
    expect(row.status).toBe('sent');
    expect(row.secret_url).toBeNull();

    const done = await confirm(token);
    expect(done.status).toBe(200);
    expect(done.body.message).toMatch(/sign in/i);
    expect((await new Client(h).signIn(user.email, PASSWORD)).status).toBe(401);
    expect((await new Client(h).signIn(user.email, NEW_PASSWORD)).status).toBe(200);
    const audit = await h.db('audit_log').where({ action: 'password-reset.completed', subject_id: user.id });
    expect(audit).toHaveLength(1);
    expect(audit[0].actor_id).toBe(user.id);
  });

  it('when a used, an expired and a made-up link are tried, then each gets the same 400 that does not say which, and the password stays', async () => {
    const user = await makeUser(h.db);
    const used = await requestLink(user.email, 1);
    expect((await confirm(used)).status).toBe(200);
    const again = await confirm(used, 'yet another long password');
    expect(again.status).toBe(400);
    expect(again.body.error.code).toBe('RESET_LINK_INVALID');

    const other = await makeUser(h.db);
    const expired = await requestLink(other.email, 1);
    await h
      .db('password_resets')
      .where({ user_id: other.id })
      .update({ expires_at: h.db.raw(`now() - interval '1 second'`) });
    const late = await confirm(expired);
    const madeUp = await confirm(randomUUID());
    expect(late.status).toBe(400);
    expect(madeUp.status).toBe(400);
    expect(late.body).toEqual(again.body);
    expect(madeUp.body).toEqual(again.body);
    // the expired link changed nothing
    expect((await new Client(h).signIn(other.email, PASSWORD)).status).toBe(200);
    expect((await new Client(h).signIn(user.email, 'yet another long password')).status).toBe(401);
  });

  it('when the new password is too short, then 400 names the password field and the link still works', async () => {
    const user = await makeUser(h.db);
    const token = await requestLink(user.email);
    const weak = await confirm(token, 'short');
    expect(weak.status).toBe(400);
    expect(weak.body.error.code).toBe('VALIDATION_FAILED');
    expect(Object.keys(weak.body.error.fields)).toEqual(['password']);
    expect((await confirm(token)).status).toBe(200);
  });
});

describe('what a new password ends', () => {
  it("when the password is reset, then every session of that user ends, the user's other open links stop working, and other people stay signed in", async () => {
    const user = await makeUser(h.db);
    const bystander = await makeUser(h.db);
    const laptop = await signedIn(h, user);
    const phone = await signedIn(h, user);
    const colleague = await signedIn(h, bystander);
    await laptop.get('/api/auth/me').expect(200);

    const first = await requestLink(user.email, 1);
    const second = await requestLink(user.email, 2);
    // the first link, used from the signed-in laptop: that browser is signed out too
    const done = await laptop.send('POST', '/api/auth/password-reset/confirm', { token: first, password: NEW_PASSWORD });
    expect(done.status).toBe(200);

    expect((await laptop.get('/api/auth/me')).status).toBe(401);
    expect((await phone.get('/api/auth/me')).status).toBe(401);
    expect((await colleague.get('/api/auth/me')).status).toBe(200);
    expect((await confirm(second, 'a password from the second link')).status).toBe(400);
    const audit = await h.db('audit_log').where({ action: 'password-reset.completed', subject_id: user.id }).first();
    expect(audit.details).toMatchObject({ sessionsEnded: 2, otherLinksRevoked: 1 });
    expect((await new Client(h).signIn(user.email, NEW_PASSWORD)).status).toBe(200);
  });
});

describe('the request rate limit', () => {
  it('when one address asks for the same e-mail too often (however it is written), then it gets 429, no further link is made, and sign-in keeps its own count', async () => {
    const limited = startHarness({ SIGN_IN_LIMIT: '3' });
    try {
      const user = await makeUser(limited.db);
      const client = await anonymous(limited);
      // capitals and spaces name the same account, so they count together
      for (const email of [user.email, user.email.toUpperCase(), ` ${user.email} `])
        expect((await client.send('POST', '/api/auth/password-reset', { email })).status).toBe(202);
      const blocked = await client.send('POST', '/api/auth/password-reset', { email: user.email });
      expect(blocked.status).toBe(429);
      expect(blocked.body.error.code).toBe('RATE_LIMITED');
      expect(await limited.db('password_resets').where({ user_id: user.id })).toHaveLength(3);
      expect((await new Client(limited).signIn(user.email)).status).toBe(200);
    } finally {
      await limited.close();
    }
  });
});
