/**
 * Issue 16, more processes: the real server (`node --import tsx server/index.ts`) with
 * HEADROOM_PROCESSES=2 over the API suite's database. Two app processes share the one port; the
 * sign-in limit counts across both (RATE_LIMIT_STORE=auto → PostgreSQL), so spreading attempts over
 * the processes does not double it; the outbox sends each message once although both processes poll
 * it (claims with FOR UPDATE SKIP LOCKED); a crashed app process is replaced; SIGTERM stops all.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import http from 'node:http';
import { makeUser, PASSWORD, startHarness, testDatabaseUrl, type Harness } from './support/harness';
import { ATTESTATION } from './support/attestation';
import { UrlClient } from './support/hardening';
import { demoDocument, FAST_OUTBOX, SmtpSink, waitForMessages } from './support/smtpSink';
import { startServer, type Server } from '../load/world';

let h: Harness;
let sink: SmtpSink;
let server: Server;

/**
 * One failed sign-in over a connection of its own (the CSRF token and the attempt on that one
 * connection): the supervisor hands each new connection to the next app process in turn, so
 * consecutive attempts go to alternate processes.
 */
async function failedSignIn(url: string, email: string): Promise<number> {
  const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
  const call = (method: string, path: string, headers: Record<string, string>, body?: string) =>
    new Promise<{ status: number; headers: http.IncomingHttpHeaders; text: string }>((resolve, reject) => {
      const req = http.request(`${url}${path}`, { method, agent, headers }, (res) => {
        let text = '';
        res.on('data', (c) => (text += c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, text }));
      });
      req.on('error', reject);
      req.end(body);
    });
  try {
    const token = await call('GET', '/api/csrf-token', {});
    const cookie = (token.headers['set-cookie'] ?? []).map((c) => c.split(';')[0]).join('; ');
    const body = JSON.stringify({ email, password: 'not the password at all' });
    const res = await call(
      'POST',
      '/api/auth/sign-in',
      { cookie, 'x-csrf-token': JSON.parse(token.text).token, 'content-type': 'application/json', 'content-length': String(Buffer.byteLength(body)) },
      body,
    );
    return res.status;
  } finally {
    agent.destroy();
  }
}

/** The pids of the app processes that said they listen (server/index.ts prints each). */
const appPids = () => [...server.log.join('').matchAll(/listening on \S+ \(app process \d+, pid (\d+)\)/g)].map((m) => Number(m[1]));

async function until<T>(what: string, probe: () => T | Promise<T>, timeoutMs = 60_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (value) return value;
    if (Date.now() > deadline) throw new Error(`${what} did not happen; server log:\n${server.log.join('').slice(-3000)}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

const alive = (pid: number) => {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
};

beforeAll(async () => {
  h = startHarness();
  sink = new SmtpSink();
  await sink.start(0);
  const started = performance.now();
  server = await startServer({
    NODE_ENV: 'test',
    DATABASE_URL: testDatabaseUrl(),
    HEADROOM_PROCESSES: '2',
    SIGN_IN_LIMIT: '3',
    SIGN_IN_CLIENT_LIMIT: '100000',
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: String(sink.port),
    MAIL_FROM: 'Headroom <headroom@headroom.test>',
    ...FAST_OUTBOX,
  });
  await until('both app processes listening', () => appPids().length >= 2);
  console.log(`2 app processes ready in ${((performance.now() - started) / 1000).toFixed(1)} s: pids ${appPids().join(', ')}`);
}, 120_000);

afterAll(async () => {
  if (server && server.proc.exitCode === null) await server.stop();
  await sink?.stop();
  await h?.close();
});

describe('the server with two app processes', () => {
  it('when one client fails to sign in again and again, then the limit of 3 holds across both processes (counted in PostgreSQL), where counts kept in memory would not hold', async () => {
    const user = await makeUser(h.db);
    const statuses: number[] = [];
    for (let i = 0; i < 6; i++) statuses.push(await failedSignIn(server.url, user.email));
    console.log(`RATE_LIMIT_STORE=auto (PostgreSQL with 2 processes), failed sign-ins answered: ${statuses.join(' ')}`);
    expect(statuses).toEqual([401, 401, 401, 429, 429, 429]);
    // the right password is refused too while the window lasts (the limit is per address and e-mail)
    const client = new UrlClient(server.url);
    await client.refreshToken();
    expect((await client.request('POST', '/api/auth/sign-in', { json: { email: user.email, password: PASSWORD } })).status).toBe(429);

    // the control: the same two processes counting in memory let the attempts through, since they alternate
    const control = await startServer({
      NODE_ENV: 'test',
      DATABASE_URL: testDatabaseUrl(),
      HEADROOM_PROCESSES: '2',
      RATE_LIMIT_STORE: 'memory',
      SIGN_IN_LIMIT: '3',
      SIGN_IN_CLIENT_LIMIT: '100000',
    });
    try {
      await until('both control processes listening', () => [...control.log.join('').matchAll(/\(app process \d+, pid/g)].length >= 2);
      const other = await makeUser(h.db);
      const memory: number[] = [];
      for (let i = 0; i < 6; i++) memory.push(await failedSignIn(control.url, other.email));
      console.log(`RATE_LIMIT_STORE=memory with 2 processes, failed sign-ins answered: ${memory.join(' ')}`);
      expect(memory.filter((s) => s === 401).length).toBeGreaterThan(3);
    } finally {
      await control.stop();
    }
  }, 180_000);

  it('when a summary goes to two addresses while both processes poll the outbox, then each address gets it exactly once', async () => {
    const designerUser = await makeUser(h.db, { accountRole: 'designer' });
    const inspectorUser = await makeUser(h.db, { accountRole: 'inspector' });
    const designer = await new UrlClient(server.url).signIn(designerUser.email);
    const project = await designer.send('POST', '/api/projects', { name: `Two processes ${randomUUID().slice(0, 6)}`, address: '12 Kiln Row, Wrenmoor' });
    expect(project.status).toBe(201);
    const projectId = project.body.project.id;
    expect((await designer.send('POST', `/api/projects/${projectId}/members`, { email: inspectorUser.email, role: 'inspector' })).status).toBe(201);
    const created = await designer.send('POST', `/api/projects/${projectId}/systems`, {
      name: 'Domestic cold water',
      service: 'cold',
      document: demoDocument(),
    });
    expect(created.status).toBe(201);
    const base = `/api/projects/${projectId}/systems/${created.body.system.id}/revisions/${created.body.revision.id}`;
    expect((await designer.send('POST', `${base}/issue`, { version: created.body.revision.version, attestation: ATTESTATION })).status).toBe(200);
    const outside = `plan-review-${randomUUID().slice(0, 6)}@wrenmoor.example`;
    expect((await designer.send('POST', `${base}/summary/send`, { inspectorIds: [inspectorUser.id], emails: [outside] })).status).toBe(202);

    const rows = await waitForMessages(h, { revision_id: created.body.revision.id }, 'sent', 2, 60_000);
    // a little longer than one poll of each process: a second send would have arrived by now
    await new Promise((r) => setTimeout(r, Number(FAST_OUTBOX.OUTBOX_POLL_MS) * 10));
    for (const address of [inspectorUser.email, outside]) expect(sink.to(address), address).toHaveLength(1);
    for (const row of rows) expect(row.attempts, row.id).toBe(1);
  });

  it('when an app process crashes, then another takes its place and the server keeps answering; SIGTERM then stops every process', async () => {
    const [first, second] = appPids();
    process.kill(first, 'SIGKILL');
    await until('a new app process', () => appPids().length >= 3);
    expect(server.log.join('')).toContain('starting a new app process in its place');
    expect((await fetch(`${server.url}/api/health`)).status).toBe(200);
    const third = appPids()[2];
    expect([first, second]).not.toContain(third);

    await server.stop();
    console.log(
      `supervisor exit ${server.proc.exitCode}; log: ${server.log
        .join('')
        .split('\n')
        .filter((l) => /stopping/.test(l))
        .join(' | ')}`,
    );
    expect(server.proc.exitCode).toBe(0);
    await until('every app process gone', () => ![second, third].some(alive), 30_000);
  }, 120_000);
});
