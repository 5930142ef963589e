import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { Client, makeUser, projectWithRoles, signedIn, startHarness, type Harness } from './support/harness';
import { smallDocument } from './support/documents';
import { tinyPdf, upload } from './support/fieldChangeFixtures';
import { ATTESTATION } from './support/attestation';

/**
 * Every API route × every kind of caller → exactly one expected status. The test reads the
 * routes the app registered and fails when one has no row here, so a new route cannot ship
 * without its access decided.
 */
type Who = 'anonymous' | 'administrator' | 'designer' | 'contractor' | 'inspector' | 'nonMember';
const WHO: Who[] = ['anonymous', 'administrator', 'designer', 'contractor', 'inspector', 'nonMember'];

interface World {
  projectId: string;
  h: Harness;
  systemId: string;
  revisionId: string;
  designer: Client;
  /** the project's own inspector (other rows make more members inspectors, so never pick "the first") */
  inspectorId: string;
}
interface Row {
  method: string;
  path: string;
  expect: Record<Who, number>;
  /** the concrete request: URL and body valid enough that only access decides the status */
  request: (w: World) => Promise<{ url: string; body?: unknown }>;
}

const all = (status: number): Record<Who, number> => Object.fromEntries(WHO.map((w) => [w, status])) as Record<Who, number>;
const signedInOnly = (status: number) => ({ ...all(status), anonymous: 401 });
const adminOnly = (status: number) => ({ ...all(403), anonymous: 401, administrator: status });
/** members read; a non-member is told nothing (404); administrators manage membership */
const membersRead = { anonymous: 401, administrator: 200, designer: 200, contractor: 200, inspector: 200, nonMember: 404 };
/** administrators who are not members may see membership, not the design */
const membersRead403 = { ...membersRead, administrator: 403 };
const designersWrite = (status: number, admin = 403) => ({
  anonymous: 401,
  administrator: admin,
  designer: status,
  contractor: 403,
  inspector: 403,
  nonMember: 404,
});

/** One issued system for the summary rows, made on first use. */
let issued: Promise<{ base: string; revisionId: string }> | null = null;
function issuedOnce(w: World) {
  issued ??= (async () => {
    const created = (
      await w.designer.send('POST', `/api/projects/${w.projectId}/systems`, { name: 'Matrix issued', service: 'cold', document: smallDocument() }).expect(201)
    ).body;
    const base = `/api/projects/${w.projectId}/systems/${created.system.id}/revisions/${created.revision.id}`;
    await w.designer.send('POST', `${base}/issue`, { version: 1, attestation: ATTESTATION }).expect(200);
    return { base, revisionId: created.revision.id as string };
  })();
  return issued;
}

/** A review returned with one item comment by an inspector of the project, on its own issued system (made once). */
let returnedReview: Promise<{ id: string; commentId: string }> | null = null;
function returnedReviewOnce(w: World) {
  returnedReview ??= (async () => {
    const created = (
      await w.designer.send('POST', `/api/projects/${w.projectId}/systems`, { name: 'Matrix returned', service: 'cold', document: smallDocument() }).expect(201)
    ).body;
    const base = `/api/projects/${w.projectId}/systems/${created.system.id}/revisions/${created.revision.id}`;
    await w.designer.send('POST', `${base}/issue`, { version: 1, attestation: ATTESTATION }).expect(200);
    const [review] = await w.h
      .db('reviews')
      .insert({
        project_id: w.projectId,
        revision_id: created.revision.id,
        reviewer_id: w.inspectorId,
        status: 'returned',
        comment: 'Matrix return',
        decided_at: w.h.db.fn.now(),
      })
      .returning('id');
    const [comment] = await w.h.db('review_comments').insert({ review_id: review.id, item_type: 'general', comment: 'Matrix comment' }).returning('id');
    return { id: review.id as string, commentId: String(comment.id) };
  })();
  return returnedReview;
}
let packageSystem: Promise<string> | null = null;
/** A review accepted through the API by the project's inspector (it stores the acceptance record), made once. */
let acceptedReview: Promise<{ id: string }> | null = null;
function acceptedReviewOnce(w: World) {
  acceptedReview ??= (async () => {
    const created = (
      await w.designer.send('POST', `/api/projects/${w.projectId}/systems`, { name: 'Matrix accepted', service: 'cold', document: smallDocument() }).expect(201)
    ).body;
    const base = `/api/projects/${w.projectId}/systems/${created.system.id}/revisions/${created.revision.id}`;
    await w.designer.send('POST', `${base}/issue`, { version: 1, attestation: ATTESTATION }).expect(200);
    const [review] = await w.h.db('reviews').insert({ project_id: w.projectId, revision_id: created.revision.id, reviewer_id: w.inspectorId }).returning('id');
    await clients.inspector.send('PATCH', `/api/projects/${w.projectId}/reviews/${review.id}`, { decision: 'accepted', version: 1 }).expect(200);
    return { id: review.id as string };
  })();
  return acceptedReview;
}

/** only the project's contractors (issue 6: field changes are theirs to start and edit) */
const contractorsWrite = (status: number) => ({ anonymous: 401, administrator: 403, designer: 403, contractor: status, inspector: 403, nonMember: 404 });

/** A fresh issued system with a field change by the project's contractor: a draft, changed, or proposed. */
async function freshFieldChange(w: World, stage: 'draft' | 'changed' | 'proposed' = 'draft') {
  const created = (
    await w.designer
      .send('POST', `/api/projects/${w.projectId}/systems`, { name: 'Matrix field change', service: 'cold', document: smallDocument() })
      .expect(201)
  ).body;
  const sys = `/api/projects/${w.projectId}/systems/${created.system.id}`;
  await w.designer.send('POST', `${sys}/revisions/${created.revision.id}/issue`, { version: 1, attestation: ATTESTATION }).expect(200);
  const fcBase = `${sys}/field-changes`;
  let fc = (await clients.contractor.send('POST', fcBase, { revisionId: created.revision.id, title: 'Matrix substitution' }).expect(201)).body.fieldChange;
  const url = `${fcBase}/${fc.id}`;
  if (stage !== 'draft') {
    const document = structuredClone(fc.document);
    document.segments[0].fittings = [{ typeId: 'elbow-90-standard', count: 5 }];
    fc = (await clients.contractor.send('PATCH', url, { document, version: fc.version }).expect(200)).body.fieldChange;
  }
  if (stage === 'proposed') fc = (await clients.contractor.send('POST', `${url}/propose`, { version: fc.version }).expect(200)).body.fieldChange;
  return { fcBase, url, id: fc.id as string, version: fc.version as number, revisionId: created.revision.id as string };
}
/** One draft field change with one attachment, shared by the reading rows. */
let sharedFieldChange: Promise<Awaited<ReturnType<typeof freshFieldChange>> & { attachmentUrl: string }> | null = null;
function fieldChangeOnce(w: World) {
  sharedFieldChange ??= (async () => {
    const fc = await freshFieldChange(w);
    const attachment = (await upload(clients.contractor, fc.url, tinyPdf(), 'sheet.pdf', 'application/pdf').expect(201)).body.attachment;
    return { ...fc, attachmentUrl: attachment.url as string };
  })();
  return sharedFieldChange;
}

/** A project fitting-type entry made by the project's designer (a fresh one when it is to be removed). */
let sharedEntry: Promise<string> | null = null;
function matrixEntry(w: World, fresh = false): Promise<string> {
  const make = async () =>
    (
      await w.designer
        .send('POST', `/api/projects/${w.projectId}/catalog/entries`, {
          kind: 'fitting-type',
          label: 'Matrix entry',
          source: 'Invented matrix sheet',
          data: { k: 0.5 },
        })
        .expect(201)
    ).body.entry.id as string;
  if (fresh) return make();
  sharedEntry ??= make();
  return sharedEntry;
}

const ROWS: Row[] = [
  { method: 'GET', path: '/api/health', expect: all(200), request: async () => ({ url: '/api/health' }) },
  { method: 'GET', path: '/api/csrf-token', expect: all(200), request: async () => ({ url: '/api/csrf-token' }) },
  {
    method: 'POST',
    path: '/api/auth/sign-in',
    expect: all(401),
    request: async () => ({ url: '/api/auth/sign-in', body: { email: 'nobody@test.example', password: 'wrong password' } }),
  },
  // "forgot my password" (issue 7): open to everyone, the same answer for every address; a made-up link is refused alike
  {
    method: 'POST',
    path: '/api/auth/password-reset',
    expect: all(202),
    request: async () => ({ url: '/api/auth/password-reset', body: { email: `nobody-${randomUUID()}@test.example` } }),
  },
  {
    method: 'POST',
    path: '/api/auth/password-reset/confirm',
    expect: all(400),
    request: async () => ({ url: '/api/auth/password-reset/confirm', body: { token: randomUUID(), password: 'a long enough password' } }),
  },
  { method: 'GET', path: '/api/auth/me', expect: signedInOnly(200), request: async () => ({ url: '/api/auth/me' }) },
  { method: 'GET', path: '/api/invitations/:token', expect: all(404), request: async () => ({ url: `/api/invitations/${randomUUID()}` }) },
  {
    method: 'POST',
    path: '/api/invitations/:token',
    expect: all(404),
    request: async () => ({ url: `/api/invitations/${randomUUID()}`, body: { password: 'a long enough password' } }),
  },
  { method: 'GET', path: '/api/users', expect: adminOnly(200), request: async () => ({ url: '/api/users' }) },
  {
    method: 'POST',
    path: '/api/users',
    expect: adminOnly(201),
    request: async () => ({ url: '/api/users', body: { email: `m-${randomUUID()}@test.example`, name: 'Matrix Person', accountRole: 'inspector' } }),
  },
  {
    method: 'PATCH',
    path: '/api/users/:userId',
    expect: adminOnly(200),
    request: async ({ h }) => {
      const u = await makeUser(h.db);
      return { url: `/api/users/${u.id}`, body: { name: 'Renamed Person', version: 1 } };
    },
  },
  {
    method: 'POST',
    path: '/api/users/:userId/invitations',
    expect: adminOnly(201),
    request: async ({ h }) => ({ url: `/api/users/${(await makeUser(h.db, { status: 'invited' })).id}/invitations` }),
  },
  { method: 'GET', path: '/api/catalog', expect: signedInOnly(200), request: async () => ({ url: '/api/catalog' }) },
  { method: 'GET', path: '/api/projects', expect: signedInOnly(200), request: async () => ({ url: '/api/projects' }) },
  // ---- a project's own catalog entries (issue 4): members read, designers write
  {
    method: 'GET',
    path: '/api/projects/:projectId/catalog',
    expect: membersRead403,
    request: async ({ projectId }) => ({ url: `/api/projects/${projectId}/catalog` }),
  },
  {
    method: 'POST',
    path: '/api/projects/:projectId/catalog/entries',
    expect: designersWrite(201),
    request: async ({ projectId }) => ({
      url: `/api/projects/${projectId}/catalog/entries`,
      body: { kind: 'fitting-type', label: 'Matrix elbow', source: 'Invented matrix sheet', data: { k: 0.5 } },
    }),
  },
  {
    method: 'PATCH',
    path: '/api/projects/:projectId/catalog/entries/:kind/:entryId',
    expect: designersWrite(200),
    request: async (w) => {
      const entry = await matrixEntry(w);
      const { version } = await w.h.db('catalog_entries').where({ project_id: w.projectId, kind: 'fitting-type', id: entry }).first('version');
      return { url: `/api/projects/${w.projectId}/catalog/entries/fitting-type/${entry}`, body: { label: `Matrix ${randomUUID().slice(0, 6)}`, version } };
    },
  },
  {
    method: 'DELETE',
    path: '/api/projects/:projectId/catalog/entries/:kind/:entryId',
    expect: designersWrite(204),
    request: async (w) => ({ url: `/api/projects/${w.projectId}/catalog/entries/fitting-type/${await matrixEntry(w, true)}` }),
  },
  {
    method: 'POST',
    path: '/api/projects',
    // project creation is for designer accounts and administrators (the non-member here has a designer account)
    expect: { anonymous: 401, administrator: 201, designer: 201, contractor: 403, inspector: 403, nonMember: 201 },
    request: async () => ({ url: '/api/projects', body: { name: `Matrix ${randomUUID().slice(0, 8)}` } }),
  },
  { method: 'GET', path: '/api/projects/:projectId', expect: membersRead, request: async ({ projectId }) => ({ url: `/api/projects/${projectId}` }) },
  {
    method: 'PATCH',
    path: '/api/projects/:projectId',
    expect: designersWrite(200),
    request: async ({ h, projectId }) => {
      const { version } = await h.db('projects').where({ id: projectId }).first('version');
      return { url: `/api/projects/${projectId}`, body: { notes: `edited ${randomUUID()}`, version } };
    },
  },
  {
    method: 'GET',
    path: '/api/projects/:projectId/members',
    expect: membersRead,
    request: async ({ projectId }) => ({ url: `/api/projects/${projectId}/members` }),
  },
  {
    method: 'POST',
    path: '/api/projects/:projectId/members',
    expect: designersWrite(201, 201),
    request: async ({ h, projectId }) => ({ url: `/api/projects/${projectId}/members`, body: { email: (await makeUser(h.db)).email, role: 'contractor' } }),
  },
  {
    method: 'PATCH',
    path: '/api/projects/:projectId/members/:userId',
    expect: designersWrite(200, 200),
    request: async ({ h, projectId }) => {
      const u = await makeUser(h.db);
      await h.db('project_members').insert({ project_id: projectId, user_id: u.id, role: 'contractor' });
      return { url: `/api/projects/${projectId}/members/${u.id}`, body: { role: 'inspector' } };
    },
  },
  {
    method: 'DELETE',
    path: '/api/projects/:projectId/members/:userId',
    expect: designersWrite(204, 204),
    request: async ({ h, projectId }) => {
      const u = await makeUser(h.db);
      await h.db('project_members').insert({ project_id: projectId, user_id: u.id, role: 'contractor' });
      return { url: `/api/projects/${projectId}/members/${u.id}` };
    },
  },
  {
    method: 'GET',
    path: '/api/projects/:projectId/systems',
    expect: membersRead403,
    request: async ({ projectId }) => ({ url: `/api/projects/${projectId}/systems` }),
  },
  {
    method: 'POST',
    path: '/api/projects/:projectId/systems',
    expect: designersWrite(201),
    request: async ({ projectId }) => ({ url: `/api/projects/${projectId}/systems`, body: { name: 'Matrix system', service: 'cold' } }),
  },
  {
    method: 'GET',
    path: '/api/projects/:projectId/systems/:systemId',
    expect: membersRead403,
    request: async (w) => ({ url: `/api/projects/${w.projectId}/systems/${w.systemId}` }),
  },
  {
    method: 'GET',
    path: '/api/projects/:projectId/systems/:systemId/compare',
    expect: membersRead403,
    request: async (w) => ({ url: `/api/projects/${w.projectId}/systems/${w.systemId}/compare?a=${w.revisionId}&b=${w.revisionId}` }),
  },
  {
    method: 'GET',
    path: '/api/projects/:projectId/systems/:systemId/revisions/:revisionId',
    expect: membersRead403,
    request: async (w) => ({ url: `/api/projects/${w.projectId}/systems/${w.systemId}/revisions/${w.revisionId}` }),
  },
  // the result for the engineer's report (issue 17): members read it, as they read the revision
  {
    method: 'GET',
    path: '/api/projects/:projectId/systems/:systemId/revisions/:revisionId/export/:table.csv',
    expect: membersRead403,
    request: async (w) => ({ url: `/api/projects/${w.projectId}/systems/${w.systemId}/revisions/${w.revisionId}/export/fixtures.csv` }),
  },
  {
    method: 'GET',
    path: '/api/projects/:projectId/systems/:systemId/revisions/:revisionId/export.xlsx',
    expect: membersRead403,
    request: async (w) => ({ url: `/api/projects/${w.projectId}/systems/${w.systemId}/revisions/${w.revisionId}/export.xlsx` }),
  },
  {
    method: 'PUT',
    path: '/api/projects/:projectId/systems/:systemId/revisions/:revisionId/document',
    expect: designersWrite(200),
    request: async (w) => {
      const { version, document } = await w.h.db('revisions').where({ id: w.revisionId }).first('version', 'document');
      return { url: `/api/projects/${w.projectId}/systems/${w.systemId}/revisions/${w.revisionId}/document`, body: { document, version } };
    },
  },
  {
    method: 'POST',
    path: '/api/projects/:projectId/systems/:systemId/revisions/:revisionId/issue',
    expect: designersWrite(200),
    request: async (w) => {
      // a fresh system each time: issuing is once per draft
      const created = (
        await w.designer.send('POST', `/api/projects/${w.projectId}/systems`, { name: 'To issue', service: 'cold', document: smallDocument() }).expect(201)
      ).body;
      return {
        url: `/api/projects/${w.projectId}/systems/${created.system.id}/revisions/${created.revision.id}/issue`,
        body: { version: 1, attestation: ATTESTATION },
      };
    },
  },
  {
    method: 'POST',
    path: '/api/projects/:projectId/systems/:systemId/revisions',
    expect: designersWrite(201),
    request: async (w) => {
      const created = (
        await w.designer.send('POST', `/api/projects/${w.projectId}/systems`, { name: 'To redraft', service: 'cold', document: smallDocument() }).expect(201)
      ).body;
      const base = `/api/projects/${w.projectId}/systems/${created.system.id}`;
      await w.designer.send('POST', `${base}/revisions/${created.revision.id}/issue`, { version: 1, attestation: ATTESTATION }).expect(200);
      return { url: `${base}/revisions`, body: { fromRevisionId: created.revision.id } };
    },
  },
  // ---- issued summaries, e-mail, reviews, audit (issue 5); they share one issued revision
  {
    method: 'GET',
    path: '/api/projects/:projectId/systems/:systemId/revisions/:revisionId/summary',
    expect: membersRead403,
    request: async (w) => ({ url: `${(await issuedOnce(w)).base}/summary` }),
  },
  {
    method: 'GET',
    path: '/api/projects/:projectId/systems/:systemId/revisions/:revisionId/summary.pdf',
    expect: membersRead403,
    request: async (w) => ({ url: `${(await issuedOnce(w)).base}/summary.pdf` }),
  },
  {
    method: 'POST',
    path: '/api/projects/:projectId/systems/:systemId/revisions/:revisionId/summary/send',
    expect: designersWrite(202),
    request: async (w) => {
      const { base } = await issuedOnce(w);
      return { url: `${base}/summary/send`, body: { inspectorIds: [w.inspectorId] } };
    },
  },
  {
    method: 'POST',
    path: '/api/projects/:projectId/systems/:systemId/revisions/:revisionId/summary/retry',
    expect: designersWrite(200),
    request: async (w) => {
      // only a failed summary is made again: fail it before each call (after the send row, which needs it ready)
      const { base, revisionId } = await issuedOnce(w);
      const row = await w.h.db('summaries').where({ revision_id: revisionId }).first('header');
      await w.h.db('summaries').where({ revision_id: revisionId }).delete();
      await w.h
        .db('summaries')
        .insert({ revision_id: revisionId, project_id: w.projectId, header: JSON.stringify(row.header), status: 'failed', error: 'matrix' });
      return { url: `${base}/summary/retry` };
    },
  },
  {
    method: 'GET',
    path: '/api/projects/:projectId/systems/:systemId/revisions/:revisionId/messages',
    expect: designersWrite(200),
    request: async (w) => ({ url: `${(await issuedOnce(w)).base}/messages` }),
  },
  {
    method: 'POST',
    path: '/api/projects/:projectId/messages/:messageId/retry',
    expect: designersWrite(200),
    request: async (w) => {
      const [row] = await w.h
        .db('outbox')
        .insert({
          kind: 'invitation',
          project_id: w.projectId,
          to_address: 'matrix@test.example',
          subject: 'Matrix',
          text_body: 'Matrix',
          status: 'failed',
          attempts: 3,
          max_attempts: 3,
          last_error: 'matrix',
        })
        .returning('id');
      return { url: `/api/projects/${w.projectId}/messages/${row.id}/retry` };
    },
  },
  {
    method: 'GET',
    path: '/api/projects/:projectId/systems/:systemId/revisions/:revisionId/reviews',
    expect: membersRead403,
    request: async (w) => ({ url: `${(await issuedOnce(w)).base}/reviews` }),
  },
  {
    method: 'GET',
    path: '/api/projects/:projectId/reviews',
    expect: membersRead403,
    request: async ({ projectId }) => ({ url: `/api/projects/${projectId}/reviews` }),
  },
  {
    method: 'PATCH',
    path: '/api/projects/:projectId/reviews/:reviewId',
    // only the inspector the summary was sent to decides
    expect: { anonymous: 401, administrator: 403, designer: 403, contractor: 403, inspector: 200, nonMember: 404 },
    request: async (w) => {
      const { revisionId } = await issuedOnce(w);
      await w.h.db('reviews').where({ revision_id: revisionId, reviewer_id: w.inspectorId }).delete();
      const [row] = await w.h.db('reviews').insert({ project_id: w.projectId, revision_id: revisionId, reviewer_id: w.inspectorId }).returning('id');
      return { url: `/api/projects/${w.projectId}/reviews/${row.id}`, body: { decision: 'accepted', version: 1 } };
    },
  },
  { method: 'GET', path: '/api/inbox', expect: signedInOnly(200), request: async () => ({ url: '/api/inbox' }) },
  // ---- the review loop (issue 17): the designer answers a returned review; members read the answers and the acceptance record
  {
    method: 'PUT',
    path: '/api/projects/:projectId/reviews/:reviewId/comments/:commentId/reply',
    expect: designersWrite(200),
    request: async (w) => {
      const review = await returnedReviewOnce(w);
      return {
        url: `/api/projects/${w.projectId}/reviews/${review.id}/comments/${review.commentId}/reply`,
        body: { reply: `Answered ${randomUUID().slice(0, 6)}` },
      };
    },
  },
  {
    method: 'POST',
    path: '/api/projects/:projectId/submissions',
    expect: designersWrite(202),
    request: async (w) => {
      // its own issued system: the summary/retry row fails the shared one's summary on purpose
      packageSystem ??= (async () => {
        const created = (
          await w.designer
            .send('POST', `/api/projects/${w.projectId}/systems`, { name: 'Matrix package', service: 'cold', document: smallDocument() })
            .expect(201)
        ).body;
        await w.designer
          .send('POST', `/api/projects/${w.projectId}/systems/${created.system.id}/revisions/${created.revision.id}/issue`, {
            version: 1,
            attestation: ATTESTATION,
          })
          .expect(200);
        return created.system.id as string;
      })();
      return { url: `/api/projects/${w.projectId}/submissions`, body: { systemIds: [await packageSystem], inspectorIds: [w.inspectorId] } };
    },
  },
  {
    method: 'GET',
    path: '/api/projects/:projectId/systems/:systemId/revisions/:revisionId/answers',
    expect: membersRead403,
    request: async (w) => ({ url: `${(await issuedOnce(w)).base}/answers` }),
  },
  {
    method: 'GET',
    path: '/api/projects/:projectId/reviews/:reviewId/acceptance.pdf',
    expect: membersRead403,
    request: async (w) => ({ url: `/api/projects/${w.projectId}/reviews/${(await acceptedReviewOnce(w)).id}/acceptance.pdf` }),
  },
  {
    method: 'GET',
    path: '/api/projects/:projectId/audit',
    expect: designersWrite(200),
    request: async ({ projectId }) => ({ url: `/api/projects/${projectId}/audit` }),
  },
  // the matrix's app runs without HEADROOM_DEV_MAIL: the development mail routes answer 404 to
  // everyone (tests/api/mail.test.ts checks them switched on: administrators only)
  { method: 'GET', path: '/api/dev/mail', expect: all(404), request: async () => ({ url: '/api/dev/mail' }) },
  { method: 'GET', path: '/api/dev/mail/:mailId', expect: all(404), request: async () => ({ url: '/api/dev/mail/1' }) },
  { method: 'GET', path: '/api/dev/mail/:mailId/attachments/:index', expect: all(404), request: async () => ({ url: '/api/dev/mail/1/attachments/0' }) },
  // ---- field changes (issue 6)
  {
    method: 'GET',
    path: '/api/projects/:projectId/field-changes',
    expect: membersRead403,
    request: async ({ projectId }) => ({ url: `/api/projects/${projectId}/field-changes` }),
  },
  {
    method: 'GET',
    path: '/api/projects/:projectId/systems/:systemId/field-changes',
    expect: membersRead403,
    request: async (w) => ({ url: (await fieldChangeOnce(w)).fcBase }),
  },
  {
    method: 'POST',
    path: '/api/projects/:projectId/systems/:systemId/field-changes',
    expect: contractorsWrite(201),
    request: async (w) => {
      const fc = await fieldChangeOnce(w);
      return { url: fc.fcBase, body: { revisionId: fc.revisionId, title: 'Matrix start' } };
    },
  },
  {
    method: 'GET',
    path: '/api/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId',
    expect: membersRead403,
    request: async (w) => ({ url: (await fieldChangeOnce(w)).url }),
  },
  {
    method: 'PATCH',
    path: '/api/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId',
    expect: contractorsWrite(200),
    request: async (w) => {
      const fc = await fieldChangeOnce(w);
      const { version } = await w.h.db('field_changes').where({ id: fc.id }).first('version');
      return { url: fc.url, body: { title: `Edited ${randomUUID().slice(0, 6)}`, version } };
    },
  },
  {
    method: 'GET',
    path: '/api/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId/comparison',
    expect: membersRead403,
    request: async (w) => ({ url: `${(await fieldChangeOnce(w)).url}/comparison` }),
  },
  {
    method: 'POST',
    path: '/api/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId/propose',
    expect: contractorsWrite(200),
    request: async (w) => {
      const fc = await freshFieldChange(w, 'changed');
      return { url: `${fc.url}/propose`, body: { version: fc.version } };
    },
  },
  {
    method: 'POST',
    path: '/api/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId/accept',
    expect: designersWrite(200),
    request: async (w) => {
      const fc = await freshFieldChange(w, 'proposed');
      return { url: `${fc.url}/accept`, body: { version: fc.version } };
    },
  },
  {
    method: 'POST',
    path: '/api/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId/decline',
    expect: designersWrite(200),
    request: async (w) => {
      const fc = await freshFieldChange(w, 'proposed');
      return { url: `${fc.url}/decline`, body: { version: fc.version, reason: 'Matrix' } };
    },
  },
  {
    method: 'POST',
    path: '/api/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId/attachments',
    // the matrix sends JSON: a contractor passes the role check and then the upload refuses a body
    // that is not multipart (400); real uploads are in tests/api/fieldChanges.attachments.test.ts
    expect: contractorsWrite(400),
    request: async (w) => ({ url: `${(await fieldChangeOnce(w)).url}/attachments`, body: {} }),
  },
  {
    method: 'GET',
    path: '/api/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId/attachments/:attachmentId',
    expect: membersRead403,
    request: async (w) => ({ url: (await fieldChangeOnce(w)).attachmentUrl }),
  },
  {
    method: 'DELETE',
    path: '/api/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId/attachments/:attachmentId',
    expect: contractorsWrite(204),
    request: async (w) => {
      const fc = await fieldChangeOnce(w);
      const a = (await upload(clients.contractor, fc.url, tinyPdf(), 'to-remove.pdf', 'application/pdf').expect(201)).body.attachment;
      return { url: a.url };
    },
  },
  // last: it ends the callers' sessions
  { method: 'POST', path: '/api/auth/sign-out', expect: signedInOnly(204), request: async () => ({ url: '/api/auth/sign-out' }) },
];

let h: Harness;
let world: World;
const clients = {} as Record<Who, Client>;

beforeAll(async () => {
  h = startHarness();
  const p = await projectWithRoles(h);
  const created = (
    await p.designer.send('POST', `/api/projects/${p.projectId}/systems`, { name: 'Matrix cold', service: 'cold', document: smallDocument() }).expect(201)
  ).body;
  world = { h, projectId: p.projectId, systemId: created.system.id, revisionId: created.revision.id, designer: p.designer, inspectorId: p.inspectorUser.id };
  clients.designer = p.designer;
  clients.contractor = await signedIn(h, p.contractorUser);
  clients.inspector = await signedIn(h, p.inspectorUser);
  clients.administrator = await signedIn(h, await makeUser(h.db, { isAdmin: true }));
  clients.nonMember = await signedIn(h, await makeUser(h.db, { accountRole: 'designer' }));
  clients.anonymous = new Client(h);
  await clients.anonymous.refreshToken();
});
afterAll(() => h.close());

describe('the access matrix', () => {
  it('when the app registers a route, then the matrix has exactly one row for it', () => {
    const registered = h.headroom.apiRoutes.map((r) => `${r.method} ${r.path}`).sort();
    const covered = ROWS.map((r) => `${r.method} ${r.path}`).sort();
    expect(registered.filter((r) => !covered.includes(r))).toEqual([]);
    expect(covered.filter((r) => !registered.includes(r))).toEqual([]);
    expect(new Set(covered).size).toBe(covered.length);
  });

  for (const row of ROWS) {
    it(`${row.method} ${row.path} answers each caller as the matrix says`, async () => {
      const got = {} as Record<Who, number>;
      for (const who of WHO) {
        const { url, body } = await row.request(world);
        const res = row.method === 'GET' ? await clients[who].get(url) : await clients[who].send(row.method, url, body);
        got[who] = res.status;
        if (res.status >= 400) expect(res.body.error?.code, `${who}: error body`).toBeTypeOf('string');
      }
      expect(got).toEqual(row.expect);
    });
  }
});
