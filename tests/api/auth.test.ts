import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { Client, makeUser, PASSWORD, signedIn, startHarness, type Harness } from './support/harness';

let h: Harness;
beforeAll(() => {
  h = startHarness();
});
afterAll(() => h.close());

const sessionCookie = (res: request.Response) => ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith('headroom.sid='));

describe('signing in and out', () => {
  it('when the password is right, then the user is returned without any password field and /me answers', async () => {
    const user = await makeUser(h.db);
    const client = new Client(h);
    const res = await client.signIn(user.email);
    expect(res.status).toBe(200);
    expect(res.body.user.email).toBe(user.email);
    expect(JSON.stringify(res.body)).not.toMatch(/password/i);
    const me = await client.get('/api/auth/me').expect(200);
    expect(me.body.user.id).toBe(user.id);
  });

  it('when the password is wrong or the e-mail unknown, then both get the same 401 message (no enumeration)', async () => {
    const user = await makeUser(h.db);
    const wrong = await new Client(h).signIn(user.email, 'not the password');
    const unknown = await new Client(h).signIn('nobody-here@test.example', 'not the password');
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body.error.code).toBe('BAD_CREDENTIALS');
    expect(unknown.body).toEqual(wrong.body);
  });

  it('when an account is disabled or not yet activated, then it cannot sign in', async () => {
    const disabled = await makeUser(h.db, { status: 'disabled' });
    const invited = await makeUser(h.db, { status: 'invited' });
    expect((await new Client(h).signIn(disabled.email)).status).toBe(401);
    expect((await new Client(h).signIn(invited.email)).status).toBe(401);
  });

  it('when a user signs in, then the session id changes and the cookie is HttpOnly and SameSite=Lax', async () => {
    const user = await makeUser(h.db);
    const client = new Client(h);
    const tokenRes = await client.agent.get('/api/csrf-token').expect(200);
    // an anonymous token request stores no session (issue 13 finding 7): the session starts at sign-in
    expect(sessionCookie(tokenRes)).toBeUndefined();
    const signIn = await client.agent.post('/api/auth/sign-in').set('x-csrf-token', tokenRes.body.token).send({ email: user.email, password: PASSWORD });
    expect(signIn.status).toBe(200);
    const after = sessionCookie(signIn);
    expect(after).toBeDefined();
    expect(after).toMatch(/HttpOnly/i);
    expect(after).toMatch(/SameSite=Lax/i);
  });

  it('when a user signs out, then the session no longer answers /me', async () => {
    const client = await signedIn(h, await makeUser(h.db));
    await client.send('POST', '/api/auth/sign-out').expect(204);
    await client.get('/api/auth/me').expect(401);
  });

  it('when a state-changing request has no CSRF token, then it gets 403 CSRF_FAILED', async () => {
    const user = await makeUser(h.db);
    const client = await signedIn(h, user);
    const res = await client.agent.post('/api/projects').send({ name: 'No token' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('CSRF_FAILED');
    const forged = await client.agent.post('/api/projects').set('x-csrf-token', 'forged').send({ name: 'Forged token' });
    expect(forged.status).toBe(403);
    expect(await h.db('projects').whereIn('name', ['No token', 'Forged token']).count({ n: '*' })).toEqual([{ n: '0' }]);
  });

  it('when the token from before sign-in is reused after it, then it is refused (bound to the old session)', async () => {
    const user = await makeUser(h.db);
    const client = new Client(h);
    await client.refreshToken();
    const oldToken = client.token;
    await client.agent.post('/api/auth/sign-in').set('x-csrf-token', oldToken).send({ email: user.email, password: PASSWORD }).expect(200);
    const res = await client.agent.post('/api/projects').set('x-csrf-token', oldToken).send({ name: 'Old token' });
    expect(res.status).toBe(403);
  });
});

describe('the sign-in rate limit', () => {
  it('when one address tries the same e-mail too often, then it gets 429 and even the right password waits', async () => {
    const limited = startHarness({ SIGN_IN_LIMIT: '3' });
    try {
      const user = await makeUser(limited.db);
      const client = new Client(limited);
      for (let i = 0; i < 3; i++) expect((await client.signIn(user.email, 'wrong password')).status).toBe(401);
      const blocked = await client.signIn(user.email);
      expect(blocked.status).toBe(429);
      expect(blocked.body.error.code).toBe('RATE_LIMITED');
    } finally {
      await limited.close();
    }
  });
});

describe('invitations', () => {
  it('when an administrator invites a person, then the link works once, signs them in, and then is spent', async () => {
    const admin = await signedIn(h, await makeUser(h.db, { isAdmin: true }));
    const email = `new-${Date.now()}@test.example`;
    const created = await admin.send('POST', '/api/users', { email, name: 'New Person', accountRole: 'contractor' }).expect(201);
    expect(created.body.user.status).toBe('invited');
    const token = new URL(created.body.invitation.url).pathname.split('/').pop()!;

    const info = await request(h.headroom.app).get(`/api/invitations/${token}`).expect(200);
    expect(info.body.email).toBe(email);

    const person = new Client(h);
    await person.refreshToken();
    const short = await person.send('POST', `/api/invitations/${token}`, { password: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.error.fields.password).toBeDefined();
    const accepted = await person.send('POST', `/api/invitations/${token}`, { password: 'a long new password' }).expect(200);
    expect(accepted.body.user.status).toBe('active');
    await person.get('/api/auth/me').expect(200);

    const again = new Client(h);
    await again.refreshToken();
    const reuse = await again.send('POST', `/api/invitations/${token}`, { password: 'another long password' });
    expect(reuse.status).toBe(404);
    expect(reuse.body.error.code).toBe('INVITATION_INVALID');
    expect((await new Client(h).signIn(email, 'a long new password')).status).toBe(200);
  });

  it('when an invitation has expired, then it is refused', async () => {
    const admin = await signedIn(h, await makeUser(h.db, { isAdmin: true }));
    const created = await admin
      .send('POST', '/api/users', { email: `late-${Date.now()}@test.example`, name: 'Late Person', accountRole: 'inspector' })
      .expect(201);
    const token = new URL(created.body.invitation.url).pathname.split('/').pop()!;
    await h
      .db('invitations')
      .where({ user_id: created.body.user.id })
      .update({ expires_at: new Date(Date.now() - 1000) });
    await request(h.headroom.app).get(`/api/invitations/${token}`).expect(404);
  });

  it('when a new link is issued, then the earlier one stops working', async () => {
    const admin = await signedIn(h, await makeUser(h.db, { isAdmin: true }));
    const created = await admin
      .send('POST', '/api/users', { email: `twice-${Date.now()}@test.example`, name: 'Twice Person', accountRole: 'designer' })
      .expect(201);
    const first = new URL(created.body.invitation.url).pathname.split('/').pop()!;
    const again = await admin.send('POST', `/api/users/${created.body.user.id}/invitations`).expect(201);
    const second = new URL(again.body.invitation.url).pathname.split('/').pop()!;
    await request(h.headroom.app).get(`/api/invitations/${first}`).expect(404);
    await request(h.headroom.app).get(`/api/invitations/${second}`).expect(200);
  });
});

describe('health', () => {
  it('when the database answers, then /api/health says so', async () => {
    const res = await request(h.headroom.app).get('/api/health').expect(200);
    expect(res.body).toEqual({ ok: true, database: 'up' });
  });
});
