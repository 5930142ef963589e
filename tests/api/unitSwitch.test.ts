import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { projectWithRoles, startHarness, type Harness } from './support/harness';
import { smallDocument } from './support/documents';
import { ATTESTATION } from './support/attestation';
import { expectClose } from '../helpers/expectClose';

// Switching a project's unit system converts its drafts on the server, rounded to the places a
// designer writes; issued revisions stay as issued. Conversion factors: 1 psi = 6.894757 kPa and
// 1 ft = 0.3048 m exactly (NIST SP 811, Appendix B.8). Invented test data (support/documents.ts).
const KPA_PER_PSI = 6.894757;
const M_PER_FT = 0.3048;

let h: Harness;
beforeAll(() => {
  h = startHarness();
});
afterAll(() => h.close());

async function withSystem() {
  const p = await projectWithRoles(h);
  const created = await p.designer
    .send('POST', `/api/projects/${p.projectId}/systems`, { name: 'Cold water', service: 'cold', document: smallDocument() })
    .expect(201);
  const base = `/api/projects/${p.projectId}/systems/${created.body.system.id}`;
  return { ...p, base, revision: created.body.revision };
}

describe('switching a project’s unit system', () => {
  it('when a US project switches to SI, then its draft is converted and rounded, analysed again, saved as a new version and audited', async () => {
    const { designer, projectId, project, base, revision } = await withSystem();
    const before = (await designer.get(`${base}/revisions/${revision.id}`).expect(200)).body.revision;
    expect(before.document.unitSystem).toBe('US');
    await designer.send('PATCH', `/api/projects/${projectId}`, { unitSystem: 'SI', version: project.version }).expect(200);

    const after = (await designer.get(`${base}/revisions/${revision.id}`).expect(200)).body.revision;
    expect(after.document.unitSystem).toBe('SI');
    expect(after.version).toBe(before.version + 1);
    // 55 psi → kPa to one place; 60 ft → m to three places (convertUnits.ts PLACES)
    expect(after.document.source.staticPressureLow).toBe(Math.round(55 * KPA_PER_PSI * 10) / 10);
    expect(after.document.segments[0].length).toBe(Math.round(60 * M_PER_FT * 1000) / 1000);
    // catalog sizes are names, not numbers
    expect(after.document.segments[0].size).toBe('1');
    // the same building, in other units: the critical margin agrees within the inputs' rounding (0.1 %)
    expect(after.analysis.ok && before.analysis.ok).toBe(true);
    expect(after.analysis.analysis.units.pressure).toBe('kPa');
    const marginOf = (a: { analysis: { criticalFixtureId: string; fixtures: { id: string; margin: number }[] } }) =>
      a.analysis.fixtures.find((f) => f.id === a.analysis.criticalFixtureId)!.margin;
    expectClose(marginOf(after.analysis), marginOf(before.analysis) * KPA_PER_PSI, { rtol: 1e-3 });

    const audit = await h.db('audit_log').where({ subject_id: revision.id, action: 'revision.units-converted' });
    expect(audit).toHaveLength(1);
    expect(audit[0].details).toMatchObject({ from: 'US', to: 'SI' });
  });

  it('when a project with an issued revision switches, then the issued revision stays in its units and a new draft from it is in the project’s', async () => {
    const { designer, projectId, project, base, revision } = await withSystem();
    await designer.send('POST', `${base}/revisions/${revision.id}/issue`, { version: revision.version, attestation: ATTESTATION }).expect(200);
    await designer.send('PATCH', `/api/projects/${projectId}`, { unitSystem: 'SI', version: project.version }).expect(200);

    const issued = (await designer.get(`${base}/revisions/${revision.id}`).expect(200)).body.revision;
    expect(issued.status).toBe('issued');
    expect(issued.document.unitSystem).toBe('US');
    expect(issued.document.source.staticPressureLow).toBe(55);

    const draft = (await designer.send('POST', `${base}/revisions`, { fromRevisionId: revision.id }).expect(201)).body.revision;
    expect(draft.document.unitSystem).toBe('SI');
    expect(draft.document.source.staticPressureLow).toBe(Math.round(55 * KPA_PER_PSI * 10) / 10);
  });

  it('when the unit system is sent unchanged, then the draft is not touched', async () => {
    const { designer, projectId, project, base, revision } = await withSystem();
    await designer.send('PATCH', `/api/projects/${projectId}`, { unitSystem: 'US', version: project.version }).expect(200);
    const after = (await designer.get(`${base}/revisions/${revision.id}`).expect(200)).body.revision;
    expect(after.version).toBe(revision.version);
  });
});
