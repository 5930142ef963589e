import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { freePortSync } from './support/ports';
import { makeUser, signedIn, startHarness, type Harness } from './support/harness';

let h: Harness;
beforeAll(() => {
  h = startHarness();
});
afterAll(() => h.close());

describe('response headers', () => {
  it('when any API route answers, then it carries a CSP with frame-ancestors, nosniff and a same-origin referrer policy', async () => {
    const res = await request(h.headroom.app).get('/api/health');
    const csp = res.headers['content-security-policy'];
    expect(csp).toMatch(/default-src 'self'/);
    expect(csp).toMatch(/frame-ancestors 'self'/);
    expect(csp).toMatch(/script-src 'self'/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['referrer-policy']).toBe('same-origin');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('when a route does not exist, then the answer is the one error format, without a stack trace', async () => {
    const client = await signedIn(h, await makeUser(h.db));
    const res = await client.get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('NOT_FOUND');
    expect(JSON.stringify(res.body)).not.toMatch(/node_modules|\.ts:\d+/);
  });
});

describe('when PostgreSQL does not answer', () => {
  it('then /api/health and a signed-in request answer 503 within a second, with no SQL or stack in the body', async () => {
    // nothing listens on this port: the same as a stopped database server
    const down = startHarness({ DATABASE_URL: `postgres://headroom@127.0.0.1:${freePortSync()}/nowhere` });
    try {
      const t0 = Date.now();
      const health = await request(down.headroom.app).get('/api/health');
      expect(health.status).toBe(503);
      expect(health.body).toEqual({ ok: false, database: 'down' });
      expect(Date.now() - t0).toBeLessThan(1500);
      // a real session cookie (both apps share the test secret), so the session store must be asked
      const client = await signedIn(h, await makeUser(h.db));
      const cookie = (await client.get('/api/auth/me')).request.cookies as unknown as string;
      const t1 = Date.now();
      const res = await request(down.headroom.app).get('/api/projects').set('cookie', cookie);
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe('DATABASE_UNAVAILABLE');
      expect(JSON.stringify(res.body)).not.toMatch(/select|ECONNREFUSED|at /i);
      expect(Date.now() - t1).toBeLessThan(2500);
    } finally {
      await down.close();
    }
  });
});

describe('content security policy and the deployment (issue 13 finding 4)', () => {
  const cspOf = async (overrides: Parameters<typeof startHarness>[0]) => {
    const app = startHarness(overrides);
    try {
      return (await request(app.headroom.app).get('/api/health')).headers['content-security-policy'] as string;
    } finally {
      await app.close();
    }
  };

  it('when served over plain http (the default), then the policy does not ask browsers to upgrade to https', async () => {
    const csp = await cspOf({ PUBLIC_URL: 'http://headroom.internal:5480' });
    expect(csp).toMatch(/default-src 'self'/);
    expect(csp).not.toMatch(/upgrade-insecure-requests/);
  });

  it('when behind TLS (COOKIE_SECURE=1, or an https PUBLIC_URL), then it does', async () => {
    expect(await cspOf({ COOKIE_SECURE: '1' })).toMatch(/upgrade-insecure-requests/);
    expect(await cspOf({ PUBLIC_URL: 'https://headroom.example' })).toMatch(/upgrade-insecure-requests/);
  });

  it('when CSP_UPGRADE_INSECURE is set, then it decides either way', async () => {
    expect(await cspOf({ CSP_UPGRADE_INSECURE: '1' })).toMatch(/upgrade-insecure-requests/);
    expect(await cspOf({ COOKIE_SECURE: '1', CSP_UPGRADE_INSECURE: '0' })).not.toMatch(/upgrade-insecure-requests/);
  });
});
