/**
 * The data a test needs, made through the product's own API before the test's screens are used, so
 * that every test stands alone: no test relies on another's success or on what a previous test left
 * in the shared database. Names carry a fresh suffix so a reused database does not collide.
 */
import fs from 'node:fs';
import { randomUUID } from 'node:crypto';
import { expect, request, type APIRequestContext } from '@playwright/test';
import { DEMO, DEMO_PASSWORD } from './helpers';

const baseURL = process.env.E2E_BASE_URL ?? 'http://127.0.0.1:5480';

/** A short suffix unique to one call: names made by a test never meet another test's. */
export const fresh = () => `${Date.now().toString(36)}${randomUUID().slice(0, 4)}`;

/** A signed-in API session (its own cookies) that carries the CSRF token on every state-changing call. */
export class Api {
  private token = '';
  private constructor(private readonly context: APIRequestContext) {}

  static async anonymous(): Promise<Api> {
    const api = new Api(await request.newContext({ baseURL }));
    await api.refreshToken();
    return api;
  }

  static async as(email: string, password = DEMO_PASSWORD): Promise<Api> {
    const api = await Api.anonymous();
    const res = await api.context.post('/api/auth/sign-in', { headers: { 'x-csrf-token': api.token }, data: { email, password } });
    expect(res.status(), `sign-in of ${email}`).toBe(200);
    // the session id changed: the token bound to the old one no longer passes
    await api.refreshToken();
    return api;
  }

  private async refreshToken() {
    const res = await this.context.get('/api/csrf-token');
    expect(res.status()).toBe(200);
    this.token = (await res.json()).token;
  }

  async get<T = Record<string, unknown>>(url: string): Promise<T> {
    const res = await this.context.get(url);
    expect(res.status(), `GET ${url}: ${await res.text()}`).toBe(200);
    return (await res.json()) as T;
  }

  /** A state-changing call that must answer `status`; returns the JSON answer. */
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  async send(method: 'POST' | 'PUT' | 'PATCH' | 'DELETE', url: string, data: unknown, status: number): Promise<any> {
    const res = await this.context.fetch(url, { method, headers: { 'x-csrf-token': this.token }, data: data as object });
    expect(res.status(), `${method} ${url}: ${await res.text()}`).toBe(status);
    const text = await res.text();
    return text ? JSON.parse(text) : null;
  }

  /** A multipart upload of one file in the field "file"; must answer 201. */
  async upload(url: string, fileName: string, content: Buffer): Promise<void> {
    const res = await this.context.post(url, {
      headers: { 'x-csrf-token': this.token },
      multipart: { file: { name: fileName, mimeType: 'application/pdf', buffer: content } },
    });
    expect(res.status(), `upload to ${url}: ${await res.text()}`).toBe(201);
  }

  async dispose() {
    await this.context.dispose();
  }
}

export interface MadeProject {
  id: string;
  name: string;
  /** the project page's address in the app */
  path: string;
}

/** A project of the demo designer's, with the given demo members (invented "Wrenmoor" names). */
export async function newProject(
  members: { email: string; role: 'contractor' | 'inspector' | 'designer' }[] = [],
  label = 'Wrenmoor Depot',
): Promise<MadeProject & { designer: Api }> {
  const designer = await Api.as(DEMO.designer);
  const name = `${label} ${fresh()}`;
  const created = await designer.send('POST', '/api/projects', { name, address: '12 Kiln Row, Wrenmoor' }, 201);
  const id: string = created.project.id;
  for (const member of members) await designer.send('POST', `/api/projects/${id}/members`, member, 201);
  return { id, name, path: `/projects/${id}`, designer };
}

/** The demo cold-water building (the example the demo seed uses), as a new document. */
export function demoColdDocument(): Record<string, unknown> {
  const file = new URL('../src/engine/examples/alder-finch-cold.json', import.meta.url);
  return { ...JSON.parse(fs.readFileSync(file, 'utf8')), id: randomUUID() };
}

export interface MadeSystem {
  projectId: string;
  systemId: string;
  revisionId: string;
  /** the API base of the revision */
  base: string;
  /** the revision's result step in the app */
  resultPath: string;
}

/** The preparer's attestation every issue carries (an invented name and licence number of the demo). */
export const E2E_ATTESTATION = { name: 'Dana Whitlow', licenceNumber: 'PE 40417', basis: 'prepared', confirmed: true } as const;

/** A system made from `document` in the project; issued as revision 1 unless `issue` is false. */
export async function newSystem(designer: Api, projectId: string, name: string, document: unknown = demoColdDocument(), issue = true): Promise<MadeSystem> {
  const created = await designer.send('POST', `/api/projects/${projectId}/systems`, { name, service: 'cold', document }, 201);
  const systemId: string = created.system.id;
  const revisionId: string = created.revision.id;
  const base = `/api/projects/${projectId}/systems/${systemId}/revisions/${revisionId}`;
  if (issue) await designer.send('POST', `${base}/issue`, { version: created.revision.version, attestation: E2E_ATTESTATION }, 200);
  return { projectId, systemId, revisionId, base, resultPath: `/projects/${projectId}/systems/${systemId}/revisions/${revisionId}/result` };
}

/** The password of accounts made by newUser (invented; long, and on no common-password list). */
export const NEW_USER_PASSWORD = 'kiln row depot lantern 47';

/** A new active account of `role`, made by the demo administrator; signs in with NEW_USER_PASSWORD. */
export async function newUser(role: 'designer' | 'contractor' | 'inspector', name: string): Promise<{ id: string; email: string; name: string }> {
  const admin = await Api.as(DEMO.admin);
  const email = `${name.toLowerCase().replace(/[^a-z]+/g, '.')}.${fresh()}@wrenmoor.example`;
  const created = await admin.send('POST', '/api/users', { email, name, accountRole: role }, 201);
  await admin.dispose();
  const token = new URL(created.invitation.url).pathname.split('/').pop()!;
  const person = await Api.anonymous();
  await person.send('POST', `/api/invitations/${token}`, { password: NEW_USER_PASSWORD }, 200);
  await person.dispose();
  return { id: created.user.id, email, name };
}

/** Uploads one file to a field change as the contractor's data sheet (multipart, field "file"). */
export async function attach(api: Api, fieldChangeApiPath: string, fileName: string, content: Buffer): Promise<void> {
  await api.upload(`${fieldChangeApiPath}/attachments`, fileName, content);
}

export interface MadeFieldChange {
  project: MadeProject;
  system: MadeSystem;
  contractor: Api;
  designer: Api;
  id: string;
  /** its page in the app */
  path: string;
  /** its API path */
  api: string;
  version: number;
}

/**
 * The demo contractor's field change on a fresh project holding the issued demo building: the level 7
 * floor main in PEX (same nominal size) and a long-radius first elbow on the riser feed, with the
 * data sheet attached, proposed to the designer. Invented demo input.
 */
export async function proposedFieldChange(title: string, dataSheet: Buffer): Promise<MadeFieldChange> {
  const project = await newProject([{ email: DEMO.contractor, role: 'contractor' }], 'Quarry Lane');
  const system = await newSystem(project.designer, project.id, 'Domestic cold water');
  const contractor = await Api.as(DEMO.contractor);
  const fcBase = `/api/projects/${project.id}/systems/${system.systemId}/field-changes`;
  const created = (await contractor.send('POST', fcBase, { revisionId: system.revisionId, title }, 201)).fieldChange;
  const api = `${fcBase}/${created.id}`;
  const issued = (
    await contractor.get<{ revision: { document: { segments: { id: string; material: string; size: string; fittings: { typeId: string }[] }[] } } }>(
      system.base,
    )
  ).revision.document;
  const document = structuredClone(issued);
  const floor7 = document.segments.find((s) => s.id === 'floor-7')!;
  floor7.material = 'pex-sdr9';
  floor7.size = '1-1/4';
  document.segments.find((s) => s.id === 'dist-2')!.fittings[0].typeId = 'elbow-90-long-radius';
  const updated = (await contractor.send('PATCH', api, { document, version: created.version }, 200)).fieldChange;
  await attach(contractor, api, 'long-radius-press-elbow.pdf', dataSheet);
  const proposed = (await contractor.send('POST', `${api}/propose`, { version: updated.version }, 200)).fieldChange;
  return { project, system, contractor, designer: project.designer, id: created.id, api, path: api.replace(/^\/api/, ''), version: proposed.version };
}
