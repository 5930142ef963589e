import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { makeUser, projectWithRoles, signedIn, startHarness, type Harness } from './support/harness';
import { makeFingerprint } from './support/hardening';
import { analyzeSystem, SystemDocumentSchema } from '../../src/engine';
import { smallDocument } from './support/documents';
import { fittingFromProjectEntry, fixtureFromProjectEntry, pipeFromProjectEntry, projectOptionValue } from '../../src/features/catalog/lib/apply-entries';
import type { ProjectEntryOf } from '../../src/shared/api/catalog';

let h: Harness;
beforeAll(() => {
  h = startHarness();
});
afterAll(() => h.close());

/**
 * An invented project pipe (demo data, not a product): PE-RT tube with two sizes. The inside
 * diameters are made up for the test; 0.0000015 m roughness and C 150 are the common-practice
 * figures for smooth plastic pipe (from memory), used only as plausible inputs.
 */
const pipeBody = () => ({
  kind: 'material',
  label: `Invented PE-RT tube ${randomUUID().slice(0, 4)}`,
  source: "Invented data sheet 'Tube PR-7', 2025 (test data)",
  data: {
    velocityClass: 'plastic',
    roughnessM: 0.0000015,
    hazenWilliamsC: 150,
    sizes: [
      { key: '20 mm', innerDiameterM: 0.0162 },
      { key: '25 mm', innerDiameterM: 0.0204 },
    ],
  },
});

describe('a project’s own catalog entries', () => {
  it('when a designer adds a pipe material, then the project’s catalog lists it after the seeded entries, with its source, and the audit log records it', async () => {
    const p = await projectWithRoles(h);
    const created = (await p.designer.send('POST', `/api/projects/${p.projectId}/catalog/entries`, pipeBody()).expect(201)).body.entry;
    expect(created).toMatchObject({ kind: 'material', projectId: p.projectId, version: 1, source: "Invented data sheet 'Tube PR-7', 2025 (test data)" });
    expect(created.data.sizes).toEqual([
      { key: '20 mm', innerDiameterM: 0.0162 },
      { key: '25 mm', innerDiameterM: 0.0204 },
    ]);

    const contractor = await signedIn(h, p.contractorUser);
    const listed = (await contractor.get(`/api/projects/${p.projectId}/catalog`).expect(200)).body;
    expect(listed.projectEntries.map((e: { id: string }) => e.id)).toEqual([created.id]);
    expect(listed.entries.some((e: { id: string }) => e.id === 'copper-l')).toBe(true);
    expect(listed.entries.some((e: { id: string }) => e.id === created.id)).toBe(false);

    const audit = await h.db('audit_log').where({ project_id: p.projectId, action: 'catalog.entry-added' }).select('subject_id', 'details');
    expect(audit).toHaveLength(1);
    expect(audit[0].subject_id).toBe(created.id);
    expect(audit[0].details).toMatchObject({ kind: 'material', source: created.source });
  });

  it('when a project pipe is copied into a system document, then the server stores it and its analysis matches the engine run on the same document', async () => {
    const p = await projectWithRoles(h);
    const entry = (await p.designer.send('POST', `/api/projects/${p.projectId}/catalog/entries`, pipeBody()).expect(201)).body
      .entry as ProjectEntryOf<'material'>;
    const doc = smallDocument();
    doc.segments[1] = { ...doc.segments[1], material: undefined, size: undefined, custom: pipeFromProjectEntry(entry, '20 mm', 'US')! } as never;
    delete (doc.segments[1] as Record<string, unknown>).material;
    delete (doc.segments[1] as Record<string, unknown>).size;
    const created = (
      await p.designer.send('POST', `/api/projects/${p.projectId}/systems`, { name: 'With a project pipe', service: 'cold', document: doc }).expect(201)
    ).body;
    const revision = (await p.designer.get(`/api/projects/${p.projectId}/systems/${created.system.id}/revisions/${created.revision.id}`).expect(200)).body
      .revision;
    const local = analyzeSystem(SystemDocumentSchema.parse(revision.document));
    expect(revision.document.segments[1].custom.innerDiameter).toBeCloseTo(0.0162 / 0.0254, 12);
    // the server's stored analysis and the engine here: the same document, the same engine → the same margin
    expect(local.segments.find((s) => s.id === 'riser')!.innerDiameter).toBeCloseTo(0.0162 / 0.0254, 9);
    expect(revision.analysis.ok).toBe(true);
    expect(revision.analysis.analysis.fixtures.map((f: { margin: number }) => f.margin)).toEqual(local.fixtures.map((f) => f.margin));
  });

  it('when project fitting and fixture types are copied into a system document, then the server stores them and its analysis equals the engine run on the same document', async () => {
    const p = await projectWithRoles(h);
    // Invented entries (test data): a valve K of 3.2 and a fixture type with 2 cold fixture units.
    const valve = (
      await p.designer
        .send('POST', `/api/projects/${p.projectId}/catalog/entries`, {
          kind: 'fitting-type',
          label: 'Invented angle valve',
          source: 'Invented sheet AV-1 (test data)',
          data: { k: 3.2 },
        })
        .expect(201)
    ).body.entry as ProjectEntryOf<'fitting-type'>;
    const sink = (
      await p.designer
        .send('POST', `/api/projects/${p.projectId}/catalog/entries`, {
          kind: 'fixture-type',
          label: 'Invented bar sink',
          source: 'Invented sheet BS-3 (test data)',
          data: { occupancy: 'private', demandCurve: 'flush-tank', wsfu: { cold: 2, hot: 1.5, total: 3 }, minFlowPressurePa: 55000, flowRateM3s: 0.0001 },
        })
        .expect(201)
    ).body.entry as ProjectEntryOf<'fixture-type'>;
    const doc = smallDocument();
    doc.segments[1].fittings = [{ typeId: projectOptionValue(valve.id), count: 2, custom: fittingFromProjectEntry(valve) }] as never;
    doc.nodes[2].fixtureGroups = [{ fixtureTypeId: projectOptionValue(sink.id), count: 3, custom: fixtureFromProjectEntry(sink) }] as never;
    const created = (
      await p.designer.send('POST', `/api/projects/${p.projectId}/systems`, { name: 'With project fittings', service: 'cold', document: doc }).expect(201)
    ).body;
    const revision = (await p.designer.get(`/api/projects/${p.projectId}/systems/${created.system.id}/revisions/${created.revision.id}`).expect(200)).body
      .revision;
    expect(revision.document.segments[1].fittings[0].custom).toEqual({ label: 'Invented angle valve', k: 3.2, source: 'Invented sheet AV-1 (test data)' });
    expect(revision.document.nodes[2].fixtureGroups[0].custom).toMatchObject({ wsfuCold: 2, wsfuTotal: 3, flushValve: false });
    const local = analyzeSystem(SystemDocumentSchema.parse(revision.document));
    expect(revision.analysis.ok).toBe(true);
    const stored = revision.analysis.analysis;
    // the same document and the same engine on both sides: equal after the JSON round trip
    expect(stored.segments).toEqual(JSON.parse(JSON.stringify(local.segments)));
    expect(stored.fixtures).toEqual(JSON.parse(JSON.stringify(local.fixtures)));
    expect(stored.segments.find((s: { id: string }) => s.id === 'riser').fittingsK).toBe(2 * 3.2);
    // 3 sinks × 2 cold fixture units reach the riser (cold service)
    expect(stored.segments.find((s: { id: string }) => s.id === 'riser').wsfu).toBe(6);
    expect(stored.warnings.filter((w: { code: string }) => w.code === 'project-data-used').map((w: { elementId: string }) => w.elementId)).toEqual([
      'l2',
      'riser',
    ]);
  });

  it('when a contractor, an inspector, an administrator or an outsider adds an entry, then it is refused (403, or 404 for the outsider) and nothing is written', async () => {
    const p = await projectWithRoles(h);
    const callers = [await signedIn(h, p.contractorUser), await signedIn(h, p.inspectorUser), await signedIn(h, await makeUser(h.db, { isAdmin: true }))];
    const outsider = await signedIn(h, await makeUser(h.db, { accountRole: 'designer' }));
    const fingerprint = await makeFingerprint(h.db);
    const before = await fingerprint();
    const url = `/api/projects/${p.projectId}/catalog/entries`;
    for (const c of callers) await c.send('POST', url, pipeBody()).expect(403);
    expect((await outsider.send('POST', url, pipeBody()).expect(404)).body.error.code).toBe('NOT_FOUND');
    await outsider.get(`/api/projects/${p.projectId}/catalog`).expect(404);
    expect(await fingerprint()).toEqual(before);
  });

  it('when another project reads its catalog, then it does not see this project’s entries, and cannot change or remove them', async () => {
    const a = await projectWithRoles(h);
    const b = await projectWithRoles(h);
    const entry = (await a.designer.send('POST', `/api/projects/${a.projectId}/catalog/entries`, pipeBody()).expect(201)).body.entry;
    expect((await b.designer.get(`/api/projects/${b.projectId}/catalog`).expect(200)).body.projectEntries).toEqual([]);
    // b's designer names a's entry under b's project: there is no such entry there
    await b.designer.send('PATCH', `/api/projects/${b.projectId}/catalog/entries/material/${entry.id}`, { label: 'Taken', version: 1 }).expect(404);
    await b.designer.send('DELETE', `/api/projects/${b.projectId}/catalog/entries/material/${entry.id}`).expect(404);
    expect((await a.designer.get(`/api/projects/${a.projectId}/catalog`).expect(200)).body.projectEntries[0].label).toBe(entry.label);
  });

  it('when bad bodies are sent, then 400 names each bad field and nothing is written', async () => {
    const p = await projectWithRoles(h);
    const fingerprint = await makeFingerprint(h.db);
    const before = await fingerprint();
    const url = `/api/projects/${p.projectId}/catalog/entries`;
    const noSource = (await p.designer.send('POST', url, { ...pipeBody(), source: '  ' }).expect(400)).body.error;
    expect(Object.keys(noSource.fields)).toEqual(['source']);
    const body = pipeBody();
    const badSizes = (
      await p.designer
        .send('POST', url, {
          ...body,
          data: {
            ...body.data,
            sizes: [
              { key: '20 mm', innerDiameterM: -1 },
              { key: '20 mm', innerDiameterM: 0.02 },
            ],
          },
        })
        .expect(400)
    ).body.error;
    expect(Object.keys(badSizes.fields)).toContain('data.sizes.0.innerDiameterM');
    const fixture = (
      await p.designer
        .send('POST', url, {
          kind: 'fixture-type',
          label: 'Wash fountain',
          source: 'Invented sheet',
          data: { occupancy: 'public', demandCurve: 'flush-tank', wsfu: { cold: 1, hot: 1, total: '2' }, minFlowPressurePa: 55_000, flowRateM3s: 0.0001 },
        })
        .expect(400)
    ).body.error;
    expect(Object.keys(fixture.fields)).toEqual(['data.wsfu.total']);
    const unknownKind = (await p.designer.send('POST', url, { kind: 'valve', label: 'x', source: 'y', data: {} }).expect(400)).body.error;
    expect(Object.keys(unknownKind.fields)).toEqual(['kind']);
    const extra = (
      await p.designer.send('POST', url, { kind: 'fitting-type', label: 'Press tee', source: 'Invented sheet', data: { k: 0.9, typo: 1 } }).expect(400)
    ).body.error;
    expect(Object.keys(extra.fields)).toEqual(['data']);
    expect(await fingerprint()).toEqual(before);
  });

  it('when two designers change one entry from the same version, then one succeeds and the other gets 409; a removal is audited', async () => {
    const p = await projectWithRoles(h);
    const entry = (
      await p.designer
        .send('POST', `/api/projects/${p.projectId}/catalog/entries`, {
          kind: 'fitting-type',
          label: 'Invented press elbow',
          source: 'Invented sheet E-1, 2025',
          data: { k: 0.6 },
        })
        .expect(201)
    ).body.entry;
    const url = `/api/projects/${p.projectId}/catalog/entries/fitting-type/${entry.id}`;
    const changed = (await p.designer.send('PATCH', url, { data: { k: 0.7 }, version: 1 }).expect(200)).body.entry;
    expect(changed).toMatchObject({ version: 2, data: { k: 0.7 }, label: 'Invented press elbow' });
    expect((await p.designer.send('PATCH', url, { label: 'Stale', version: 1 }).expect(409)).body.error.code).toBe('STALE_VERSION');
    const badData = (await p.designer.send('PATCH', url, { data: { k: -1 }, version: 2 }).expect(400)).body.error;
    expect(Object.keys(badData.fields)).toEqual(['data.k']);
    await p.designer.send('DELETE', url).expect(204);
    await p.designer.send('DELETE', url).expect(404);
    const actions = (await h.db('audit_log').where({ project_id: p.projectId, subject_id: entry.id }).orderBy('id').select('action')).map((r) => r.action);
    expect(actions).toEqual(['catalog.entry-added', 'catalog.entry-changed', 'catalog.entry-removed']);
  });

  it('when every kind is added, then each is listed with its data as given (in SI)', async () => {
    const p = await projectWithRoles(h);
    const url = `/api/projects/${p.projectId}/catalog/entries`;
    const bodies = [
      pipeBody(),
      { kind: 'fitting-type', label: 'Invented press tee, branch', source: 'Invented sheet T-2', data: { k: 1.4 } },
      {
        kind: 'fixture-type',
        label: 'Invented wash fountain',
        source: 'Invented sheet W-3',
        data: { occupancy: 'public', demandCurve: 'flush-tank', wsfu: { cold: 1.5, hot: 1.5, total: 2 }, minFlowPressurePa: 55_000, flowRateM3s: 0.0001 },
      },
      {
        kind: 'device-template',
        label: 'Invented filter housing',
        source: 'Invented curve F-4',
        data: {
          kind: 'filter',
          points: [
            { flowM3s: 0.001, lossPa: 7000 },
            { flowM3s: 0.002, lossPa: 25_000 },
          ],
        },
      },
    ];
    for (const b of bodies) await p.designer.send('POST', url, b).expect(201);
    const own = (await p.designer.get(`/api/projects/${p.projectId}/catalog`).expect(200)).body.projectEntries as { kind: string; data: unknown }[];
    expect(own.map((e) => e.kind).sort()).toEqual(['device-template', 'fitting-type', 'fixture-type', 'material']);
    for (const b of bodies) expect(own.find((e) => e.kind === b.kind)?.data).toEqual(b.data);
  });
});
