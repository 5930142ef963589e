import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SystemDocumentSchema } from '../../src/engine';
import { mergeFieldChange } from '../../server/services/fieldChangeMerge';
import { startHarness, type Harness } from './support/harness';
import { smallDocument } from './support/documents';
import { edited, fieldChangeWorld, startFieldChange } from './support/fieldChangeFixtures';

let h: Harness;
beforeAll(() => {
  h = startHarness();
});
afterAll(() => h.close());

type Doc = ReturnType<typeof SystemDocumentSchema.parse>;
const parsed = (d: unknown): Doc => SystemDocumentSchema.parse(d);

// The lengths, pressures, sizes and fitting counts below are invented inputs: these tests check the
// merge's bookkeeping (which field ends up where), not a published hydraulic value.
describe('field changes: carried onto the designer’s draft (merge rules)', () => {
  const issued = parsed(smallDocument());
  const proposed = edited(issued, (d) => {
    d.segments[1].material = 'pex-sdr9';
    d.segments[1].size = '1';
    d.segments[0].fittings = [{ typeId: 'elbow-90-standard', count: 6 }];
  });

  it('when the draft changed other things, then the field change’s fields are taken and the designer’s kept', () => {
    const draft = edited(issued, (d) => {
      d.segments[1].length = issued.segments[1].length + 5;
      d.source.staticPressureLow = issued.source.staticPressureLow - 2;
    });
    const { document, conflicts } = mergeFieldChange(issued, proposed, draft);
    expect(conflicts).toEqual({});
    expect(document.segments[1]).toMatchObject({ material: 'pex-sdr9', size: '1', length: issued.segments[1].length + 5 });
    expect(document.segments[0].fittings).toEqual([{ typeId: 'elbow-90-standard', count: 6 }]);
    expect(document.source.staticPressureLow).toBe(issued.source.staticPressureLow - 2);
    // the draft given is not changed in place
    expect(draft.segments[1].material).toBe(issued.segments[1].material);
  });

  it('when the draft changed the same field differently, then it is a conflict naming the field', () => {
    const draft = edited(issued, (d) => void (d.segments[1].size = '1-1/4'));
    const { conflicts } = mergeFieldChange(issued, proposed, draft);
    expect(Object.keys(conflicts)).toEqual([`document.segments.${issued.segments[1].id}.size`]);
  });

  it('when the draft already made the same change, then there is nothing to merge and no conflict', () => {
    const { document, conflicts } = mergeFieldChange(issued, proposed, structuredClone(proposed));
    expect(conflicts).toEqual({});
    expect(document).toEqual(proposed);
  });

  it('when the draft removed the segment the field change changes, then it is a conflict', () => {
    const leaf = issued.segments.find((s) => !issued.segments.some((t) => t.from === s.to))!;
    const proposedLeaf = edited(issued, (d) => void (d.segments.find((s) => s.id === leaf.id)!.length = leaf.length + 3));
    const draft = edited(issued, (d) => void (d.segments = d.segments.filter((s) => s.id !== leaf.id)));
    const { conflicts } = mergeFieldChange(issued, proposedLeaf, draft);
    expect(Object.keys(conflicts)).toEqual([`document.segments.${leaf.id}`]);
  });
});

describe('field changes: accepted while the system has a draft', () => {
  async function proposedOnDraftedSystem() {
    const w = await fieldChangeWorld(h);
    const revisions = `/api/projects/${w.projectId}/systems/${w.systemId}/revisions`;
    const draft = (await w.designer.send('POST', revisions, { fromRevisionId: w.revisionId }).expect(201)).body.revision;
    const { fieldChange, url } = await startFieldChange(w.contractor, w.fcBase, w.revisionId);
    return { w, revisions, draft, fieldChange, url };
  }

  it('when the draft changed something else, then accepting carries the contractor’s changes onto that draft, which records the field change', async () => {
    const { w, revisions, draft, fieldChange, url } = await proposedOnDraftedSystem();
    const designerEdit = edited(draft.document as Doc, (d) => void (d.source.staticPressureLow -= 1));
    const savedDraft = (await w.designer.send('PUT', `${revisions}/${draft.id}/document`, { document: designerEdit, version: draft.version }).expect(200)).body
      .revision;
    const change = edited(fieldChange.document as Doc, (d) => {
      d.segments[1].material = 'pex-sdr9';
      d.segments[1].size = '1';
    });
    const saved = (await w.contractor.send('PATCH', url, { document: change, version: fieldChange.version }).expect(200)).body.fieldChange;
    const proposed = (await w.contractor.send('POST', `${url}/propose`, { version: saved.version }).expect(200)).body.fieldChange;

    const accepted = (await w.designer.send('POST', `${url}/accept`, { version: proposed.version }).expect(200)).body;
    expect(accepted.revision).toMatchObject({ id: draft.id, number: draft.number, status: 'draft', version: savedDraft.version + 1 });
    expect(accepted.revision.document.source.staticPressureLow).toBe(designerEdit.source.staticPressureLow);
    expect(accepted.revision.document.segments[1]).toMatchObject({ material: 'pex-sdr9', size: '1' });
    expect(accepted.revision.origin).toMatchObject({ fieldChangeId: fieldChange.id, number: fieldChange.number, baseRevisionNumber: 1 });
    expect(accepted.revision.origin.changes.join(' ')).toContain('PEX tubing, SDR 9');
    // still one draft
    const list = (await w.designer.get(`/api/projects/${w.projectId}/systems/${w.systemId}`).expect(200)).body.revisions;
    expect(list.filter((r: { status: string }) => r.status === 'draft')).toHaveLength(1);
  });

  it('when the draft changed the same field differently, then 409 names it, nothing is merged and the field change stays proposed', async () => {
    const { w, revisions, draft, fieldChange, url } = await proposedOnDraftedSystem();
    const designerEdit = edited(draft.document as Doc, (d) => void (d.segments[1].size = '1-1/4'));
    const savedDraft = (await w.designer.send('PUT', `${revisions}/${draft.id}/document`, { document: designerEdit, version: draft.version }).expect(200)).body
      .revision;
    const change = edited(fieldChange.document as Doc, (d) => void (d.segments[1].size = '1'));
    const saved = (await w.contractor.send('PATCH', url, { document: change, version: fieldChange.version }).expect(200)).body.fieldChange;
    const proposed = (await w.contractor.send('POST', `${url}/propose`, { version: saved.version }).expect(200)).body.fieldChange;

    const res = await w.designer.send('POST', `${url}/accept`, { version: proposed.version });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('CONFLICT');
    expect(Object.keys(res.body.error.fields)).toEqual([`document.segments.${designerEdit.segments[1].id}.size`]);
    const after = (await w.designer.get(`${revisions}/${draft.id}`).expect(200)).body.revision;
    expect(after.version).toBe(savedDraft.version);
    // the save answers the revision's summary: the draft holds exactly what the designer saved
    expect(after.document).toEqual(JSON.parse(JSON.stringify(designerEdit)));
    expect(after.origin).toBeNull();
    expect((await w.designer.get(url).expect(200)).body.fieldChange.status).toBe('proposed');
  });
});
