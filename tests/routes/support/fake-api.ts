/**
 * The network boundary of the walk's route tests: a fake `fetch` that answers the API calls the
 * walk makes (project, system, revision, the seeded and the project's catalog, the CSRF token,
 * saving the document) the way the server does. Every answer is checked against the shared
 * response schema before it is sent, and every body the page sends against the shared request
 * schema, so the fake cannot drift from the API contract. The catalog is built from the engine's
 * own catalog modules, as the server's seed does (server/services/catalogRows.ts), and the
 * revision carries the demo document with the engine's analysis, as the server stores it.
 *
 * A save can be held (`holdSaves`) so a test can look at the page while the request is out, and
 * another person's save can be played (`someoneElseSaves`) so the next save answers 409.
 */
import type { z } from 'zod';
import { ENGINE_VERSION, safeAnalyzeSystem, SystemDocumentSchema } from '../../../src/engine';
import type { SystemDocument } from '../../../src/engine';
import { MeResponse } from '../../../src/shared/api/auth';
import { ApiErrorBody } from '../../../src/shared/api/errors';
import { ProjectDetailResponse } from '../../../src/shared/api/projects';
import type { ProjectRole } from '../../../src/shared/api/projects';
import { RevisionResponse, SaveDocumentBody, SaveDocumentResponse, SystemDetailResponse } from '../../../src/shared/api/systems';
import type { RevisionStatus, RevisionSummary, RevisionVerdict } from '../../../src/shared/api/systems';
import { ProjectCatalogResponse } from '../../../src/shared/api/catalog';
import { ReviewResponse, ReviewsResponse } from '../../../src/shared/api/summaries';
import type { Review, ReviewComment } from '../../../src/shared/api/summaries';
import { ReplyBody } from '../../../src/shared/api/reviewLoop';
import { reviewUrls } from '../../../src/features/reviews/api/urls';
import { CatalogResponse } from '../../../src/features/systems/api/get-catalog';
import { catalogUrls } from '../../../src/features/catalog/api/urls';
import { systemUrls } from '../../../src/features/systems/api/urls';
import { catalogRows } from '../../../server/services/catalogRows';
import demoJson from '../../../src/engine/examples/alder-finch-cold.json';

/** The invented demo scenario's cold-water system (Alder & Finch, 410 Quarry Lane, Wrenmoor). */
export function demoDocument(): SystemDocument {
  // a fresh copy each time: a test's edits never reach another test
  return SystemDocumentSchema.parse(JSON.parse(JSON.stringify(demoJson)));
}

export type Call = { url: string; method: string; headers: Record<string, string>; body: unknown };
type Answer = { status: number; body?: unknown };

export const CSRF_TOKEN = 'route-test-csrf-token';
const STAMP = '2025-03-04T09:30:00.000Z';

export interface FakeApiOptions {
  status?: RevisionStatus;
  myRole?: ProjectRole | null;
  /** hold every save's answer until `releaseSaves()` */
  holdSaves?: boolean;
  /** the draft's document (the demo when not given) */
  document?: SystemDocument;
  /**
   * the system's issued revision 2 was returned by the inspector with these comments: the system
   * carries the "returned" marker, its reviews are answered, and replies are taken (PUT …/reply)
   */
  returned?: { items: { itemType: ReviewComment['itemType']; itemId: string | null; comment: string }[]; comment?: string };
}

function verdictOf(analysis: ReturnType<typeof safeAnalyzeSystem>): RevisionVerdict {
  if (!analysis.ok)
    return { ok: false, status: null, allPass: null, criticalFixtureId: null, criticalMargin: null, warningCount: 0, errorMessage: analysis.error.message };
  const a = analysis.analysis;
  const v = a.verdict;
  return {
    ok: true,
    status: v.status,
    allPass: v.status === 'pass',
    criticalFixtureId: a.criticalFixtureId,
    criticalMargin: a.fixtures.find((f) => f.id === a.criticalFixtureId)?.margin ?? null,
    warningCount: a.warnings.length,
    errorMessage: null,
  };
}

/** Checks an answer against its shared schema and gives back the body as sent (a drift throws here). */
function checked<S extends z.ZodType>(schema: S, body: unknown, status = 200): Answer {
  schema.parse(body);
  return { status, body };
}

/** The seeded catalog rows as the API presents them (server/services/catalog.ts), ordered by kind and label. */
function seededEntries() {
  return catalogRows()
    .map((r) => ({ kind: r.kind, id: r.id, label: r.label, source: r.source, fromMemory: r.from_memory, data: JSON.parse(JSON.stringify(r.data)) }))
    .sort((a, b) => a.kind.localeCompare(b.kind) || a.label.localeCompare(b.label));
}

const apiError = (status: number, code: string, message: string) => checked(ApiErrorBody, { error: { code, message } }, status);

export function fakeApi(options: FakeApiOptions = {}) {
  const ids = {
    projectId: '5b0c2f8e-3d1a-4c6b-9e2f-0a7d1c3b5e91',
    systemId: '8e4a6c1d-2b3f-4a5e-8c7d-1f0e9a2b3c4d',
    revisionId: 'c3d2e1f0-9a8b-4c7d-8e6f-5a4b3c2d1e0f',
  };
  const status = options.status ?? 'draft';
  const myRole = options.myRole === undefined ? 'designer' : options.myRole;
  const server = { document: options.document ?? (demoDocument() as SystemDocument), version: 1 };
  const calls: Call[] = [];
  /** requests to addresses this fake does not know (answered 404, as the server would) */
  const unknown: Call[] = [];
  const held: (() => void)[] = [];
  let holding = options.holdSaves ?? false;

  // the returned review of the issued revision 2 (the draft, revision 3, answers it)
  const returnedIds = { revisionId: '9f8e7d6c-5b4a-4392-8170-6f5e4d3c2b1a', reviewId: '1a2b3c4d-5e6f-4a8b-9c0d-1e2f3a4b5c6d' };
  const returnedReview: Review | null = options.returned
    ? {
        id: returnedIds.reviewId,
        projectId: ids.projectId,
        systemId: ids.systemId,
        systemName: 'Domestic cold water',
        revisionId: returnedIds.revisionId,
        revisionNumber: 2,
        revisionStatus: 'issued',
        reviewer: { id: '2b3c4d5e-6f7a-4b8c-9d0e-1f2a3b4c5d6e', name: 'Imogen Hale', email: 'imogen@example.test' },
        sentBy: 'Dana Okafor',
        status: 'returned',
        comment: options.returned.comment ?? '',
        items: options.returned.items.map((it, i) => ({ id: String(i + 1), ...it, reply: null })),
        version: 2,
        receivedAt: STAMP,
        decidedAt: STAMP,
        answeredIn: null,
        packageId: null,
        acceptanceRecord: null,
      }
    : null;
  const marker = () =>
    returnedReview
      ? {
          reviewId: returnedReview.id,
          revisionId: returnedReview.revisionId,
          revisionNumber: 2,
          reviewerName: returnedReview.reviewer.name,
          decidedAt: STAMP,
          comments: returnedReview.items.length,
          answered: returnedReview.items.filter((c) => c.reply).length,
        }
      : null;

  const summary = (): RevisionSummary => ({
    id: ids.revisionId,
    number: 3,
    status,
    version: server.version,
    updatedAt: STAMP,
    issuedAt: status === 'draft' ? null : STAMP,
    issuedBy: status === 'draft' ? null : 'Dana Okafor',
    inputHash: status === 'draft' ? null : 'f'.repeat(64),
    verdict: verdictOf(safeAnalyzeSystem(server.document)),
  });
  const revisionBody = () => {
    const analysis = safeAnalyzeSystem(server.document);
    return {
      revision: {
        ...summary(),
        // a JSON round trip, as the document and analysis come out of PostgreSQL's jsonb
        document: JSON.parse(JSON.stringify(server.document)),
        analysis: JSON.parse(JSON.stringify(analysis.ok ? { ok: true, analysis: analysis.analysis } : { ok: false, error: analysis.error.toJSON() })),
        engineVersion: ENGINE_VERSION,
        note: null,
      },
    };
  };

  const routes: { method: string; url: string; answer: (call: Call) => Answer | Promise<Answer> }[] = [
    { method: 'GET', url: '/api/csrf-token', answer: () => ({ status: 200, body: { token: CSRF_TOKEN } }) },
    {
      method: 'GET',
      url: '/api/auth/me',
      answer: () =>
        checked(MeResponse, {
          user: {
            id: '0d9c8b7a-6f5e-4d3c-8b2a-1f0e9d8c7b6a',
            email: 'dana@example.test',
            name: 'Dana Okafor',
            isAdmin: false,
            accountRole: 'designer',
            status: 'active',
            version: 1,
            createdAt: STAMP,
          },
        }),
    },
    {
      method: 'GET',
      url: `/api/projects/${ids.projectId}`,
      answer: () =>
        checked(ProjectDetailResponse, {
          project: {
            id: ids.projectId,
            name: 'Alder & Finch',
            address: '410 Quarry Lane, Wrenmoor',
            codeBasis: 'Demo: invented scenario',
            unitSystem: 'US',
            notes: '',
            archived: false,
            version: 1,
            createdAt: STAMP,
            updatedAt: STAMP,
            myRole,
          },
          members: [],
        }),
    },
    {
      method: 'GET',
      url: systemUrls.detail(ids.projectId, ids.systemId),
      answer: () =>
        checked(SystemDetailResponse, {
          system: {
            id: ids.systemId,
            projectId: ids.projectId,
            name: 'Domestic cold water',
            service: 'cold',
            createdAt: STAMP,
            latest: summary(),
            returned: marker(),
          },
          revisions: [summary()],
        }),
    },
    { method: 'GET', url: systemUrls.revision(ids.projectId, ids.systemId, ids.revisionId), answer: () => checked(RevisionResponse, revisionBody()) },
    {
      method: 'GET',
      url: systemUrls.catalog(),
      answer: () => checked(CatalogResponse, { entries: seededEntries() }),
    },
    // the demo project has no catalog entries of its own
    { method: 'GET', url: catalogUrls.project(ids.projectId), answer: () => checked(ProjectCatalogResponse, { entries: seededEntries(), projectEntries: [] }) },
    {
      method: 'PUT',
      url: systemUrls.document(ids.projectId, ids.systemId, ids.revisionId),
      answer: async (call) => {
        if (holding) await new Promise<void>((resolve) => held.push(resolve));
        if (call.headers['x-csrf-token'] !== CSRF_TOKEN) return apiError(403, 'CSRF_FAILED', 'The form expired.');
        if (status !== 'draft') return apiError(409, 'CONFLICT', `Revision 3 is ${status}; it cannot change. Start a new draft from it.`);
        const body = SaveDocumentBody.parse(call.body);
        if (body.version !== server.version)
          return apiError(409, 'STALE_VERSION', 'Someone else changed this since you opened it. Reload to see their change.');
        server.document = body.document;
        server.version += 1;
        // the server answers the revision's summary only
        return checked(SaveDocumentResponse, { revision: summary() });
      },
    },
    ...(returnedReview
      ? [
          {
            method: 'GET',
            url: reviewUrls.revision(ids.projectId, ids.systemId, returnedIds.revisionId),
            answer: () => checked(ReviewsResponse, { reviews: [returnedReview] }),
          },
          ...returnedReview.items.map((item) => ({
            method: 'PUT',
            url: reviewUrls.reply(ids.projectId, returnedReview.id, item.id),
            answer: (call: Call): Answer => {
              if (call.headers['x-csrf-token'] !== CSRF_TOKEN) return apiError(403, 'CSRF_FAILED', 'The form expired.');
              if (myRole !== 'designer') return apiError(403, 'FORBIDDEN', 'Only the project’s designers answer review comments.');
              const body = ReplyBody.parse(call.body);
              item.reply = { text: body.reply, by: 'Dana Okafor', at: STAMP };
              return checked(ReviewResponse, { review: returnedReview });
            },
          })),
        ]
      : []),
  ];

  const impl = async (input: RequestInfo | URL, init: RequestInit = {}): Promise<Response> => {
    const call: Call = {
      url: String(input),
      method: init.method ?? 'GET',
      headers: { ...(init.headers as Record<string, string> | undefined) },
      body: typeof init.body === 'string' ? JSON.parse(init.body) : undefined,
    };
    calls.push(call);
    const route = routes.find((r) => r.method === call.method && r.url === call.url);
    if (!route) unknown.push(call);
    const answer = route ? await route.answer(call) : apiError(404, 'NOT_FOUND', 'Not found.');
    return new Response(answer.body === undefined ? null : JSON.stringify(answer.body), {
      status: answer.status,
      headers: { 'content-type': 'application/json' },
    });
  };

  return {
    ids,
    fetch: impl as typeof fetch,
    calls,
    unknown,
    /** the saves the page sent (PUT of the document), answered or not */
    saves: () => calls.filter((c) => c.method === 'PUT' && c.url === systemUrls.document(ids.projectId, ids.systemId, ids.revisionId)),
    /** the document and version the fake server holds now */
    server,
    releaseSaves() {
      holding = false;
      held.splice(0).forEach((resolve) => resolve());
    },
    /** another designer saves the draft: the server's version moves on, so the page's next save is stale */
    someoneElseSaves(change: (doc: SystemDocument) => SystemDocument = (doc) => doc) {
      server.document = change(server.document);
      server.version += 1;
    },
  };
}

export type FakeApi = ReturnType<typeof fakeApi>;
