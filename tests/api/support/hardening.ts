/**
 * Helpers of the hardening suites (bad input, concurrency, security): the app served on a real
 * loopback port (one server for thousands of requests), a cookie-keeping client on it, and a
 * fingerprint of everything stored, to prove a refused request wrote nothing.
 */
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Db } from '../../../server/db/knex';
import { PASSWORD, type Harness } from './harness';

/** The harness's app listening on 127.0.0.1:0. */
export async function listen(h: Harness): Promise<{ url: string; close: () => Promise<void> }> {
  const server = http.createServer(h.headroom.app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

/** What a fetch answer is reduced to: status, headers, text and the parsed JSON (or null). */
export interface Answer {
  status: number;
  headers: Headers;
  text: string;
  body: any; // eslint-disable-line @typescript-eslint/no-explicit-any
}

/**
 * Like harness.Client, but over fetch on a listening URL (several times lighter than supertest
 * for thousands of requests), keeping its own cookies; it can send a raw body or leave out the
 * CSRF header.
 */
export class UrlClient {
  token = '';
  readonly cookies = new Map<string, string>();
  constructor(readonly url: string) {}

  async request(method: string, path: string, opts: { raw?: string; json?: unknown; csrf?: boolean; headers?: Record<string, string> } = {}): Promise<Answer> {
    const headers: Record<string, string> = { ...opts.headers };
    if (this.cookies.size) headers.cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
    if (method !== 'GET' && opts.csrf !== false) headers['x-csrf-token'] = this.token;
    let body: string | undefined;
    if (opts.raw !== undefined || opts.json !== undefined) {
      headers['content-type'] = 'application/json';
      body = opts.raw ?? JSON.stringify(opts.json);
    }
    const res = await fetch(this.url + path, { method, headers, body, redirect: 'manual' });
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const i = pair.indexOf('=');
      const name = pair.slice(0, i).trim();
      const value = pair.slice(i + 1).trim();
      if (!value || /expires=Thu, 01 Jan 1970/i.test(c)) this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
    const text = await res.text();
    let parsed: unknown = null;
    try {
      parsed = text ? JSON.parse(text) : null;
    } catch {}
    return { status: res.status, headers: res.headers, text, body: parsed };
  }
  get(path: string) {
    return this.request('GET', path);
  }
  async refreshToken() {
    const res = await this.get('/api/csrf-token');
    if (res.status !== 200) throw new Error(`csrf-token: ${res.status} ${res.text}`);
    this.token = res.body.token;
    return this.token;
  }
  async signIn(email: string, password = PASSWORD) {
    await this.refreshToken();
    const res = await this.request('POST', '/api/auth/sign-in', { json: { email, password } });
    if (res.status !== 200) throw new Error(`sign-in failed for ${email}: ${res.status} ${res.text}`);
    await this.refreshToken();
    return this;
  }
  /** `raw` is sent byte for byte as application/json (it may be broken JSON on purpose). */
  sendRaw(method: string, path: string, raw: string, { csrf = true } = {}) {
    return this.request(method, path, { raw, csrf });
  }
  send(method: string, path: string, body?: unknown, { csrf = true } = {}) {
    return this.request(method, path, { json: body, csrf });
  }
}

/** Tables left out of the fingerprint: the session store (every request may touch it) and knex's own. */
const UNFINGERPRINTED = new Set(['session', 'knex_migrations', 'knex_migrations_lock']);

/**
 * One query that sums up every table: its row count, and an md5 of every row's scalar columns
 * (binary and JSON columns excepted: the PDF bytes and documents are large), plus the sum of
 * `version` and the latest `updated_at` where a table has them (those change with any update of
 * a JSON column). Tables are read from information_schema, so tables added later are covered.
 */
export async function makeFingerprint(db: Db): Promise<() => Promise<Record<string, string>>> {
  const columns = (await db('information_schema.columns')
    .where({ table_schema: 'public' })
    .select('table_name', 'column_name', 'data_type')
    .orderBy(['table_name', 'ordinal_position'])) as { table_name: string; column_name: string; data_type: string }[];
  const tables = new Map<string, { scalar: string[]; all: string[] }>();
  for (const c of columns) {
    if (UNFINGERPRINTED.has(c.table_name)) continue;
    const t = tables.get(c.table_name) ?? { scalar: [], all: [] };
    t.all.push(c.column_name);
    if (!['bytea', 'jsonb', 'json'].includes(c.data_type)) t.scalar.push(c.column_name);
    tables.set(c.table_name, t);
  }
  const q = (s: string) => `"${s.replace(/"/g, '""')}"`;
  const parts = [...tables].map(([name, t]) => {
    const row = `concat_ws('|', ${t.scalar.map((c) => `${q(c)}::text`).join(', ')})`;
    const extra = [
      t.all.includes('version') ? `coalesce(sum(${q('version')}), 0)::text` : `''`,
      t.all.includes('updated_at') ? `coalesce(max(${q('updated_at')})::text, '')` : `''`,
    ].join(` || '/' || `);
    return `(select count(*)::text || ':' || coalesce(md5(string_agg(${row}, ',' order by ${row})), '') || ':' || ${extra} from ${q(name)}) as ${q(name)}`;
  });
  const sql = `select ${parts.join(', ')}`;
  return async () => (await db.raw(sql)).rows[0] as Record<string, string>;
}

/**
 * What an error body must never carry: stack frames, source paths, driver or SQL text.
 * (Generated field names in the bad-input suite are plain identifiers, so they cannot match.)
 */
export const LEAK =
  /\bat [\w.<>]+ \(|\bat (?:file:|node:|\/)|\.(?:ts|js|mjs):\d+|node_modules|\/work\/|\/usr\/|\bselect\b[^"]{0,80}\bfrom\b|\binsert into\b|\bupdate \w+ set\b|\bdelete from\b|\bviolates\b|\bsyntax error\b|\brelation "|\bcolumn "|\bpg_|\bknex\b|ECONNREFUSED|\bSQLSTATE\b|TypeError|ReferenceError|RangeError|Cannot read propert/i;

export function expectNoLeak(body: unknown, where: string) {
  const text = typeof body === 'string' ? body : JSON.stringify(body);
  const m = LEAK.exec(text);
  if (m) throw new Error(`${where}: the error body leaks "${m[0]}": ${text.slice(0, 500)}`);
}

/** Awaits an answer and throws unless it has `status` (for the set-up steps of a test). */
export async function want(answer: Promise<Answer>, status: number): Promise<Answer> {
  const res = await answer;
  if (res.status !== status) throw new Error(`expected ${status}, got ${res.status}: ${res.text.slice(0, 300)}`);
  return res;
}
