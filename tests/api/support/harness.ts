import { randomUUID } from 'node:crypto';
import request from 'supertest';
import type { Agent } from 'supertest';
import { createApp, type HeadroomApp } from '../../../server/app';
import { createDb, type Db } from '../../../server/db/knex';
import { loadConfig, type Config } from '../../../server/config';
import { hashPassword } from '../../../server/auth/password';

/** The app over the throw-away database that scripts/test.mjs made (real PostgreSQL, no mocks). */
export function testDatabaseUrl(): string {
  const url = process.env.TEST_DATABASE_URL;
  if (!url) throw new Error('TEST_DATABASE_URL is not set: run the API tests through `npm test` (scripts/test.mjs).');
  return url;
}

export interface Harness {
  config: Config;
  db: Db;
  headroom: HeadroomApp;
  close: () => Promise<void>;
}

export function startHarness(overrides: Partial<Record<keyof Config, string>> = {}): Harness {
  const config = loadConfig({
    NODE_ENV: 'test',
    DATABASE_URL: testDatabaseUrl(),
    SESSION_SECRET: 'test-secret-test-secret-test-secret-0123',
    PUBLIC_URL: 'http://headroom.test',
    SIGN_IN_LIMIT: '1000',
    SIGN_IN_CLIENT_LIMIT: '100000',
    LINK_LIMIT: '100000',
    ...overrides,
  });
  const db = createDb(config.DATABASE_URL);
  const headroom = createApp({ config, db });
  return {
    config,
    db,
    headroom,
    close: async () => {
      await headroom.close();
      await db.destroy();
    },
  };
}

export const PASSWORD = 'correct horse battery';
let cachedHash: Promise<string> | null = null;

/** A user made directly in the database (each test makes its own, with a unique e-mail). */
export async function makeUser(
  db: Db,
  opts: { isAdmin?: boolean; accountRole?: 'designer' | 'contractor' | 'inspector'; status?: 'active' | 'invited' | 'disabled' } = {},
) {
  cachedHash ??= hashPassword(PASSWORD);
  const email = `u-${randomUUID()}@test.example`;
  const status = opts.status ?? 'active';
  const [row] = await db('users')
    .insert({
      email,
      name: `Test ${email.slice(2, 8)}`,
      is_admin: opts.isAdmin ?? false,
      account_role: opts.accountRole ?? 'designer',
      status,
      password_hash: status === 'invited' ? null : await cachedHash,
    })
    .returning(['id', 'email']);
  return row as { id: string; email: string };
}

/** A cookie-keeping client that carries the CSRF token on every state-changing call. */
export class Client {
  readonly agent: Agent;
  token = '';
  constructor(h: Harness) {
    this.agent = request.agent(h.headroom.app);
  }
  async refreshToken() {
    const res = await this.agent.get('/api/csrf-token').expect(200);
    this.token = res.body.token;
    return this.token;
  }
  async signIn(email: string, password = PASSWORD) {
    await this.refreshToken();
    const res = await this.agent.post('/api/auth/sign-in').set('x-csrf-token', this.token).send({ email, password });
    // the session id changed: the token bound to the old one no longer passes
    if (res.status === 200) await this.refreshToken();
    return res;
  }
  get(url: string) {
    return this.agent.get(url);
  }
  send(method: string, url: string, body?: unknown) {
    const m = method.toLowerCase() as 'post' | 'patch' | 'put' | 'delete';
    const req = this.agent[m](url).set('x-csrf-token', this.token);
    return body === undefined ? req : req.send(body as object);
  }
}

export async function signedIn(h: Harness, user: { email: string }) {
  const client = new Client(h);
  const res = await client.signIn(user.email);
  if (res.status !== 200) throw new Error(`sign-in failed for ${user.email}: ${res.status} ${JSON.stringify(res.body)}`);
  return client;
}

/** A project with one member per role, made through the API by its designer. */
export async function projectWithRoles(h: Harness) {
  const designerUser = await makeUser(h.db, { accountRole: 'designer' });
  const contractorUser = await makeUser(h.db, { accountRole: 'contractor' });
  const inspectorUser = await makeUser(h.db, { accountRole: 'inspector' });
  const designer = await signedIn(h, designerUser);
  const created = await designer.send('POST', '/api/projects', { name: `Project ${randomUUID().slice(0, 6)}`, address: '12 Kiln Row, Wrenmoor' }).expect(201);
  const projectId: string = created.body.project.id;
  await designer.send('POST', `/api/projects/${projectId}/members`, { email: contractorUser.email, role: 'contractor' }).expect(201);
  await designer.send('POST', `/api/projects/${projectId}/members`, { email: inspectorUser.email, role: 'inspector' }).expect(201);
  return { projectId, project: created.body.project, designerUser, contractorUser, inspectorUser, designer };
}
