/**
 * Security checks beyond tests/api/security.test.ts (headers, database down) and
 * tests/api/auth.test.ts (sign-in messages, rate limit, invitation links): CSRF on every
 * state-changing route the app registers, cookie flags behind TLS, session expiry, and what the
 * answers tell about who has an account.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { makeUser, startHarness, type Harness } from './support/harness';
import { smallDocument } from './support/documents';
import { expectNoLeak, listen, makeFingerprint, UrlClient, want } from './support/hardening';

let h: Harness;
let server: Awaited<ReturnType<typeof listen>>;
let fingerprint: () => Promise<Record<string, string>>;

beforeAll(async () => {
  h = startHarness();
  server = await listen(h);
  fingerprint = await makeFingerprint(h.db);
});
afterAll(async () => {
  await server?.close();
  await h?.close();
});

const parseCookie = (setCookie: string) => {
  const [pair, ...attrs] = setCookie.split(';').map((s) => s.trim());
  return { name: pair.split('=')[0], attrs: attrs.map((a) => a.toLowerCase()) };
};

describe('CSRF on every state-changing route', () => {
  it('when a signed-in designer sends any registered POST/PATCH/PUT/DELETE without the token, or with another session’s token, then 403 CSRF_FAILED and nothing is written', async () => {
    const designer = await new UrlClient(server.url).signIn((await makeUser(h.db, { accountRole: 'designer' })).email);
    const other = await new UrlClient(server.url).signIn((await makeUser(h.db, { accountRole: 'designer' })).email);
    const project = (await want(designer.send('POST', '/api/projects', { name: 'CSRF' }), 201)).body.project;
    const created = (
      await want(designer.send('POST', `/api/projects/${project.id}/systems`, { name: 'Cold', service: 'cold', document: smallDocument() }), 201)
    ).body;
    // real ids where the designer has them, so a forged request would have something to change
    const ids: Record<string, string> = { projectId: project.id, systemId: created.system.id, revisionId: created.revision.id };
    const writes = h.headroom.apiRoutes.filter((r) => !['GET', 'HEAD', 'OPTIONS'].includes(r.method));
    expect(writes.length).toBeGreaterThan(10);
    const before = await fingerprint();
    const got: string[] = [];
    for (const r of writes) {
      const path = r.path.replace(/:(\w+)/g, (_m, name: string) => ids[name] ?? randomUUID());
      const body = { name: 'Forged', version: 1, document: smallDocument(), role: 'designer', email: 'forged@test.example', password: 'forged password 123' };
      for (const [how, res] of [
        ['no token', await designer.send(r.method, path, body, { csrf: false })],
        ['another session’s token', await designer.request(r.method, path, { json: body, headers: { 'x-csrf-token': other.token }, csrf: false })],
      ] as const) {
        if (res.status !== 403 || res.body?.error?.code !== 'CSRF_FAILED') got.push(`${r.method} ${r.path} (${how}): ${res.status} ${res.text.slice(0, 120)}`);
        expectNoLeak(res.text, `${r.method} ${r.path}`);
      }
    }
    expect(got).toEqual([]);
    expect(await fingerprint()).toEqual(before);
  });
});

describe('cookie flags', () => {
  it('when served plainly (COOKIE_SECURE=0), then the session and CSRF cookies are HttpOnly and SameSite=Lax, and not Secure', async () => {
    const user = await makeUser(h.db);
    const c = new UrlClient(server.url);
    await c.refreshToken();
    const res = await c.request('POST', '/api/auth/sign-in', { json: { email: user.email, password: 'correct horse battery' } });
    expect(res.status).toBe(200);
    const cookies = res.headers.getSetCookie().map(parseCookie);
    const session = cookies.find((k) => k.name === 'headroom.sid');
    expect(session, 'the sign-in sets the session cookie').toBeDefined();
    expect(session!.attrs).toContain('httponly');
    expect(session!.attrs).toContain('samesite=lax');
    expect(session!.attrs).not.toContain('secure');
    const token = (await fetch(`${server.url}/api/csrf-token`)).headers
      .getSetCookie()
      .map(parseCookie)
      .find((k) => k.name.includes('csrf'));
    expect(token!.attrs).toContain('httponly');
    expect(token!.attrs).toContain('samesite=lax');
  });

  it('when behind a TLS proxy (COOKIE_SECURE=1), then both cookies are also Secure and the CSRF cookie has the __Host- prefix', async () => {
    const tls = startHarness({ COOKIE_SECURE: '1' });
    const s = await listen(tls);
    try {
      const user = await makeUser(tls.db);
      // the proxy says the original request came over https (trust proxy is 1 with COOKIE_SECURE=1)
      const https = { 'x-forwarded-proto': 'https' };
      const c = new UrlClient(s.url);
      const tokenRes = await c.request('GET', '/api/csrf-token', { headers: https });
      c.token = tokenRes.body.token;
      const csrf = tokenRes.headers
        .getSetCookie()
        .map(parseCookie)
        .find((k) => k.name.includes('csrf'));
      expect(csrf!.name).toBe('__Host-headroom.csrf');
      expect(csrf!.attrs).toEqual(expect.arrayContaining(['secure', 'httponly', 'samesite=lax', 'path=/']));
      const res = await c.request('POST', '/api/auth/sign-in', { json: { email: user.email, password: 'correct horse battery' }, headers: https });
      expect(res.status).toBe(200);
      const session = res.headers
        .getSetCookie()
        .map(parseCookie)
        .find((k) => k.name === 'headroom.sid');
      expect(session!.attrs).toEqual(expect.arrayContaining(['secure', 'httponly', 'samesite=lax']));
    } finally {
      await s.close();
      await tls.close();
    }
  });
});

describe('session expiry', () => {
  it('when SESSION_IDLE_MINUTES is 1, then the session cookie and the stored session last one minute from the last request', async () => {
    const short = startHarness({ SESSION_IDLE_MINUTES: '1' });
    const s = await listen(short);
    try {
      const c = await new UrlClient(s.url).signIn((await makeUser(short.db)).email);
      const res = await c.get('/api/auth/me');
      expect(res.status).toBe(200);
      const session = res.headers
        .getSetCookie()
        .map(parseCookie)
        .find((k) => k.name === 'headroom.sid');
      // rolling: every answer renews the cookie for the idle period (60 s; express-session writes Expires)
      const expires = session!.attrs.find((a) => a.startsWith('expires='));
      const cookieLeft = new Date(expires!.slice('expires='.length)).getTime() - Date.now();
      // Expires has whole seconds: 60 s, less the second it may have been rounded down, less slack for a busy machine
      expect(cookieLeft).toBeGreaterThan(54_000);
      expect(cookieLeft).toBeLessThanOrEqual(61_000);
      const sid = decodeURIComponent(c.cookies.get('headroom.sid')!).replace(/^s:/, '').split('.')[0];
      const row = await short.db('session').where({ sid }).first('expire');
      const left = new Date(row.expire).getTime() - Date.now();
      // 60 s minus the time the request took; 5 s of slack for a busy machine
      expect(left).toBeGreaterThan(55_000);
      expect(left).toBeLessThanOrEqual(61_000);
    } finally {
      await s.close();
      await short.close();
    }
  });

  it('when the idle period has passed (the stored session expired), then the next request is 401 and a write is refused', async () => {
    const c = await new UrlClient(server.url).signIn((await makeUser(h.db)).email);
    expect((await c.get('/api/auth/me')).status).toBe(200);
    const sid = decodeURIComponent(c.cookies.get('headroom.sid')!).replace(/^s:/, '').split('.')[0];
    // what the idle period does, without waiting for it: the stored session's expiry is in the past
    expect(
      await h
        .db('session')
        .where({ sid })
        .update({ expire: h.db.raw("now() - interval '1 second'") }),
    ).toBe(1);
    const me = await c.get('/api/auth/me');
    expect(me.status).toBe(401);
    expect(me.body.error.code).toBe('NOT_SIGNED_IN');
    const before = await fingerprint();
    const write = await c.send('POST', '/api/projects', { name: 'After expiry' });
    // the token was bound to the expired session, so CSRF refuses it first, or the guard does
    expect([401, 403]).toContain(write.status);
    expect(await fingerprint()).toEqual(before);
  });
});

describe('what answers reveal about accounts', () => {
  it('when a contractor or a non-member adds a member by e-mail, then a known and an unknown address get the same answer', async () => {
    const designer = await new UrlClient(server.url).signIn((await makeUser(h.db, { accountRole: 'designer' })).email);
    const project = (await want(designer.send('POST', '/api/projects', { name: 'Enumeration' }), 201)).body.project;
    const contractorUser = await makeUser(h.db, { accountRole: 'contractor' });
    await want(designer.send('POST', `/api/projects/${project.id}/members`, { email: contractorUser.email, role: 'contractor' }), 201);
    const contractor = await new UrlClient(server.url).signIn(contractorUser.email);
    const outsider = await new UrlClient(server.url).signIn((await makeUser(h.db, { accountRole: 'designer' })).email);
    const known = (await makeUser(h.db)).email;
    const unknown = `nobody-${randomUUID()}@test.example`;
    for (const caller of [contractor, outsider]) {
      const a = await caller.send('POST', `/api/projects/${project.id}/members`, { email: known, role: 'inspector' });
      const b = await caller.send('POST', `/api/projects/${project.id}/members`, { email: unknown, role: 'inspector' });
      expect(a.status).toBe(b.status);
      expect(a.body).toEqual(b.body);
      expect([403, 404]).toContain(a.status);
    }
    // the project's designer is told whether an account exists (documented behaviour: designers
    // add people who already have accounts; administrators invite the others)
    expect((await designer.send('POST', `/api/projects/${project.id}/members`, { email: unknown, role: 'inspector' })).body.error.code).toBe('USER_NOT_FOUND');
  });

  it('when an invitation link is unknown or malformed, then the answer is the same (spent and expired links: tests/api/auth.test.ts)', async () => {
    const anon = new UrlClient(server.url);
    const a = await anon.get(`/api/invitations/${randomUUID().replace(/-/g, '')}`);
    const b = await anon.get('/api/invitations/x');
    expect(a.status).toBe(404);
    expect(b.status).toBe(404);
    expect(a.body).toEqual(b.body);
  });
});
