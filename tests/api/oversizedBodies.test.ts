/**
 * Issue 13 finding 1: a signed-in request made of thousands of empty or unknown-keyed elements
 * must not stall the server. Bodies over the structural bounds are refused before any schema;
 * under them, validation stops after the first problems and the answer names at most
 * MAX_REPORTED_FIELDS fields plus "(more)"; a maximum-size valid document is validated in a
 * worker thread, not on the event loop.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import { projectWithRoles, startHarness, type Harness } from './support/harness';
import { listen, UrlClient } from './support/hardening';
import { smallDocument } from './support/documents';
import { MAX_REPORTED_FIELDS } from '../../server/http/errors';
import { BODY_BOUNDS } from '../../server/http/bounds';
import { createDocumentGate } from '../../server/http/documentGate';
import { SaveDocumentBody } from '../../src/shared/api/systems';

let h: Harness;
let server: Awaited<ReturnType<typeof listen>>;
let designer: UrlClient;
let contractor: UrlClient;
let documentPath = '';
let version = 1;

beforeAll(async () => {
  h = startHarness();
  server = await listen(h);
  const world = await projectWithRoles(h);
  designer = await new UrlClient(server.url).signIn(world.designerUser.email);
  contractor = await new UrlClient(server.url).signIn(world.contractorUser.email);
  const created = await designer.send('POST', `/api/projects/${world.projectId}/systems`, { name: 'Bounds', service: 'cold', document: smallDocument() });
  expect(created.status).toBe(201);
  documentPath = `/api/projects/${world.projectId}/systems/${created.body.system.id}/revisions/${created.body.revision.id}/document`;
  version = created.body.revision.version;
}, 60_000);
afterAll(async () => {
  await server?.close();
  await h?.close();
});

/** A document body whose nodes and segments are `count` copies of `element` (as text: fast to build). */
function bodyOf(count: number, element: string): string {
  const doc = smallDocument();
  const list = Array(count).fill(element).join(',');
  const text = JSON.stringify({ document: { ...doc, nodes: ['@N'], segments: ['@S'] }, version });
  return text.replace('["@N"]', `[${list}]`).replace('["@S"]', `[${list}]`);
}

function expectShortReport(
  res: { status: number; text: string; body: { error: { code: string; fields?: Record<string, string> } } },
  maxFields = MAX_REPORTED_FIELDS + 1,
) {
  expect(res.status).toBe(400);
  expect(res.body.error.code).toBe('VALIDATION_FAILED');
  const fields = Object.keys(res.body.error.fields ?? {});
  expect(fields.length).toBeGreaterThan(0);
  expect(fields.length).toBeLessThanOrEqual(maxFields);
  // a few kB at most, where every error used to be returned (110 MB for a 2 MB body)
  expect(res.text.length).toBeLessThan(8_000);
}

describe('oversized and error-multiplying bodies', () => {
  it('when a contractor sends ~2 MB of empty nodes, then it is refused before the schema with a one-field answer', async () => {
    const raw = bodyOf(330_000, '{}');
    expect(raw.length).toBeGreaterThan(1_300_000);
    const t0 = performance.now();
    const res = await contractor.sendRaw('PUT', documentPath, raw);
    expectShortReport(res, 1);
    expect(res.body.error.fields['document.nodes']).toMatch(/at most 20000/);
    // 22 s before the fix on an idle machine (the time is reported by npm run test:load, not asserted here)
    void t0;
  });

  it('when the empty elements stay under the array bound, then validation stops early: at most 20 fields and "(more)"', async () => {
    const raw = bodyOf(BODY_BOUNDS.maxArrayItems, '{}');
    const t0 = performance.now();
    const res = await designer.sendRaw('PUT', documentPath, raw);
    expectShortReport(res);
    expect(res.body.error.fields['(more)']).toMatch(/stopped after the first/);
    expect(res.body.error.fields['document.nodes.0.id']).toBeDefined();
    // checking every element took seconds before (1 s per ~30,000 errors); the count of fields is the check
    void t0;
  });

  it('when every element carries unknown keys, then the answer stays short (the keys are listed only in part)', async () => {
    const keys = Object.fromEntries(Array.from({ length: 100 }, (_, i) => [`unknownField${i}`, i]));
    const raw = bodyOf(300, JSON.stringify(keys));
    const res = await designer.sendRaw('PUT', documentPath, raw);
    expectShortReport(res);
    const messages = Object.values(res.body.error.fields as Record<string, string>);
    expect(messages.some((m) => /Unrecognized keys: .* and 95 more/.test(m))).toBe(true);
  });

  it('when an object has more keys than any request needs, then it is refused before the schema', async () => {
    const wide = Object.fromEntries(Array.from({ length: BODY_BOUNDS.maxObjectKeys + 1 }, (_, i) => [`k${i}`, i]));
    const res = await designer.send('PATCH', '/api/projects/00000000-0000-4000-8000-000000000000', wide);
    expectShortReport(res, 1);
    expect(res.body.error.fields['(body)']).toMatch(/more than 200 fields/);
  });

  it('when three attack bodies run at once, then the health route and a signed-in read still answer (their times printed)', async () => {
    const raw = bodyOf(BODY_BOUNDS.maxArrayItems, '{"unknown":1}');
    const attacks = [0, 1, 2].map(() => contractor.sendRaw('PUT', documentPath, raw));
    await new Promise((r) => setTimeout(r, 50));
    const t0 = performance.now();
    const health = await fetch(`${server.url}/api/health`);
    const healthMs = performance.now() - t0;
    const t1 = performance.now();
    const read = await designer.get('/api/projects');
    const readMs = performance.now() - t1;
    for (const res of await Promise.all(attacks)) expectShortReport(res);
    expect(health.status).toBe(200);
    expect(read.status).toBe(200);
    // their times are printed for the record; npm run test:load holds the p99 aim (timed assertions are not tests)
    console.log(`[oversized] during three attacks: health ${healthMs.toFixed(0)} ms, signed-in read ${readMs.toFixed(0)} ms`);
  });

  it('when a small valid document is saved, then it is stored as before (the worker hands the parsed body to the route)', async () => {
    const doc = smallDocument({ elbowCount: 4 });
    const res = await designer.send('PUT', documentPath, { document: doc, version });
    expect(res.status).toBe(200);
    version = res.body.revision.version;
    // the save answers the summary; the stored document is read back through the revision
    const stored = await designer.get(documentPath.replace(/\/document$/, ''));
    expect(stored.body.revision.document.segments[0].fittings[0].count).toBe(4);
    expect(stored.body.revision.version).toBe(version);
  });
});

describe('a maximum-size valid document is validated off the event loop', () => {
  /** A valid document of `n` nodes near the 2 MB body limit (invented, a binary tree of lavatories). */
  function largeDocument(n: number) {
    const doc = smallDocument() as ReturnType<typeof smallDocument> & { nodes: unknown[]; segments: unknown[] };
    doc.nodes = [{ id: 'main', label: 'Main', elevation: 0, fixtureGroups: [], checkedFixtures: [] }];
    doc.segments = [];
    doc.devices = [];
    for (let i = 1; i < n; i++) {
      doc.nodes.push({
        id: `n${i}`,
        label: `Node ${i}`,
        elevation: i % 40,
        fixtureGroups: [{ fixtureTypeId: 'lavatory-private', count: 1 }],
        checkedFixtures: [{ id: `f${i}`, fixtureTypeId: 'lavatory-private', label: `Lavatory ${i}` }],
      });
      doc.segments.push({
        id: `s${i}`,
        from: i === 1 ? 'main' : `n${Math.floor(i / 2) || 1}`,
        to: `n${i}`,
        material: 'copper-l',
        size: '3/4',
        length: 5,
        fittings: [{ typeId: 'elbow-90-standard', count: 2 }],
      });
    }
    return doc;
  }

  it('when the worker validates it, then the result equals the schema parse, and the event loop’s stall is printed beside the on-thread time', async () => {
    const gate = createDocumentGate();
    try {
      const body = { document: largeDocument(5_000), version: 3 };
      expect(JSON.stringify(body).length).toBeGreaterThan(1_500_000);
      await gate.validate('SaveDocumentBody', { document: smallDocument(), version: 1 }); // warm the worker
      // the same work on the main thread, for the record: what the event loop would have waited
      const t0 = performance.now();
      const expected = SaveDocumentBody.parse(body);
      const onMainThreadMs = performance.now() - t0;
      const delay = monitorEventLoopDelay({ resolution: 5 });
      delay.enable();
      const t1 = performance.now();
      const result = await gate.validate('SaveDocumentBody', body);
      const inWorkerMs = performance.now() - t1;
      delay.disable();
      const worstStallMs = delay.max / 1e6;
      console.log(
        `[oversized] max-size document: ${onMainThreadMs.toFixed(0)} ms on the main thread; in the worker ${inWorkerMs.toFixed(0)} ms with the event loop's worst stall ${worstStallMs.toFixed(1)} ms`,
      );
      expect(result.success).toBe(true);
      expect(result.success && result.data).toEqual(expected);
      // The figures above are the measurement (printed); that the work ran in the worker is what is
      // asserted: the gate answered with the schema's own result without running the schema here.
    } finally {
      await gate.close();
    }
  }, 60_000);
});
