/**
 * Issue 13 finding 3: the anonymous routes that choose a password through a one-time link
 * (password reset, invitation) look the link up before hashing anything, are rate-limited per
 * client address, and password hashing runs at most HASH_CONCURRENCY at a time.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomBytes } from 'node:crypto';
import { Client, makeUser, startHarness, type Harness } from './support/harness';
import { HASH_CONCURRENCY, hashPassword, hashStats } from '../../server/auth/password';

let h: Harness;
beforeAll(() => {
  h = startHarness();
});
afterAll(() => h.close());

async function anonymous(harness: Harness = h) {
  const client = new Client(harness);
  await client.refreshToken();
  return client;
}
const bogusToken = () => randomBytes(32).toString('base64url');

describe('one-time links are looked up before any password is hashed', () => {
  it('when 40 reset confirmations and 40 invitation acceptances carry made-up links, then all are refused and not one password is hashed', async () => {
    const client = await anonymous();
    const before = hashStats().started;
    const answers = await Promise.all([
      ...Array.from({ length: 40 }, () => client.send('POST', '/api/auth/password-reset/confirm', { token: bogusToken(), password: 'a long enough password' })),
      ...Array.from({ length: 40 }, () => client.send('POST', `/api/invitations/${bogusToken()}`, { password: 'a long enough password' })),
    ]);
    expect(answers.slice(0, 40).map((r) => r.status)).toEqual(Array(40).fill(400));
    expect(answers.slice(0, 40).every((r) => r.body.error.code === 'RESET_LINK_INVALID')).toBe(true);
    expect(answers.slice(40).map((r) => r.status)).toEqual(Array(40).fill(404));
    expect(answers.slice(40).every((r) => r.body.error.code === 'INVITATION_INVALID')).toBe(true);
    expect(hashStats().started - before).toBe(0);
  });

  it('when a real invitation is accepted, then its password is hashed once and the account is active', async () => {
    const admin = await makeUser(h.db, { isAdmin: true });
    const adminClient = new Client(h);
    await adminClient.signIn(admin.email);
    const created = await adminClient
      .send('POST', '/api/users', {
        email: `inv-${randomBytes(4).toString('hex')}@test.example`,
        name: 'Invited Person',
        accountRole: 'designer',
        isAdmin: false,
      })
      .expect(201);
    const token = decodeURIComponent(created.body.invitation.url.split('/invitations/')[1]);
    const before = hashStats().started;
    const res = await (await anonymous()).send('POST', `/api/invitations/${token}`, { password: 'a long enough password' });
    expect(res.status).toBe(200);
    expect(hashStats().started - before).toBe(1);
  });
});

describe('rate limits on the link routes', () => {
  it('when one address uses more links than LINK_LIMIT in 15 minutes, then the next is 429 on either link route', async () => {
    const limited = startHarness({ LINK_LIMIT: '3' });
    try {
      const client = await anonymous(limited);
      for (let i = 0; i < 3; i++) {
        const res = await client.send('POST', '/api/auth/password-reset/confirm', { token: bogusToken(), password: 'a long enough password' });
        expect(res.status).toBe(400);
      }
      const over = await client.send('POST', '/api/auth/password-reset/confirm', { token: bogusToken(), password: 'a long enough password' });
      expect(over.status).toBe(429);
      expect(over.body.error.code).toBe('RATE_LIMITED');
      // one budget for both kinds of link: switching routes does not buy more hashes
      const invitation = await client.send('POST', `/api/invitations/${bogusToken()}`, { password: 'a long enough password' });
      expect(invitation.status).toBe(429);
    } finally {
      await limited.close();
    }
  });
});

describe('bounded concurrent hashing', () => {
  it(`when 12 passwords are hashed at once, then at most ${HASH_CONCURRENCY} run at the same time and all finish`, async () => {
    const hashes = await Promise.all(Array.from({ length: 12 }, (_, i) => hashPassword(`password number ${i}`)));
    expect(new Set(hashes).size).toBe(12);
    expect(hashStats().mostAtOnce).toBeLessThanOrEqual(HASH_CONCURRENCY);
    expect(hashStats().mostAtOnce).toBe(HASH_CONCURRENCY);
    expect(hashStats().running).toBe(0);
  });
});
