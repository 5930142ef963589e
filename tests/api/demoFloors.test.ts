import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import { nodeElevations, SystemDocumentSchema, type SystemDocument } from '../../src/engine';
import { projectWithRoles, startHarness, type Harness } from './support/harness';
import { ATTESTATION } from './support/attestation';

// The invented demo building ("Alder & Finch") moved onto named floors: a revision issued while its
// nodes had absolute elevations (as the demo seed issued it before the move) and a draft carrying the
// floor-placed demo give the same analysis, number for number, through the API on a real database.

let h: Harness;
beforeAll(() => {
  h = startHarness();
});
afterAll(() => h.close());

const example = (name: string): SystemDocument =>
  SystemDocumentSchema.parse(JSON.parse(fs.readFileSync(new URL(`../../src/engine/examples/${name}`, import.meta.url), 'utf8')));

/** The demo as it was stored before its floors: every node at its absolute elevation, no floors named. */
function onAbsoluteElevations(doc: SystemDocument): SystemDocument {
  const z = nodeElevations(doc);
  return {
    ...doc,
    floors: [],
    nodes: doc.nodes.map(({ floor: _floor, heightAboveFloor: _height, ...n }) => {
      const elevation = z.get(n.id);
      if (elevation === null || elevation === undefined) throw new Error(`the demo node ${n.id} has no elevation`);
      return { ...n, elevation };
    }),
  };
}

interface StoredOutcome {
  ok: boolean;
  analysis: {
    criticalFixtureId: string | null;
    verdict: unknown;
    warnings: { code: string }[];
    si: {
      source: Record<string, unknown>;
      nodes: Record<string, unknown>[];
      segments: Record<string, unknown>[];
      fixtures: Record<string, unknown>[];
    };
  };
}

/** What the two revisions must share: every computed number of the source, nodes, segments and fixtures, the verdict and the warnings. */
const numbersOf = (o: StoredOutcome) => ({
  ok: o.ok,
  criticalFixtureId: o.analysis.criticalFixtureId,
  verdict: o.analysis.verdict,
  warnings: o.analysis.warnings.map((w) => w.code),
  source: o.analysis.si.source,
  nodes: o.analysis.si.nodes,
  segments: o.analysis.si.segments,
  fixtures: o.analysis.si.fixtures,
});

describe('the demo building on named floors', () => {
  for (const [file, service] of [
    ['alder-finch-cold.json', 'cold'],
    ['alder-finch-hot.json', 'hot'],
  ] as const) {
    it(`when ${file} was issued on absolute elevations and its next draft places the nodes on the floors, then both analyses are the same to the last bit`, async () => {
      const onFloors = { ...example(file), id: randomUUID() };
      const placed = onFloors.nodes.filter((n) => n.floor !== undefined).length;
      // the demo places most of its nodes on floors (only the points below Level 1 keep an elevation)
      expect(onFloors.floors.length).toBeGreaterThan(1);
      expect(placed).toBeGreaterThan(onFloors.nodes.length / 2);
      const absolute = onAbsoluteElevations(onFloors);
      expect(absolute.nodes.some((n) => n.floor !== undefined)).toBe(false);

      const p = await projectWithRoles(h);
      const created = (await p.designer.send('POST', `/api/projects/${p.projectId}/systems`, { name: 'Demo', service, document: absolute }).expect(201)).body;
      const base = `/api/projects/${p.projectId}/systems/${created.system.id}`;
      const issued = (
        await p.designer
          .send('POST', `${base}/revisions/${created.revision.id}/issue`, { version: created.revision.version, attestation: ATTESTATION })
          .expect(200)
      ).body.revision;
      expect(issued.status).toBe('issued');
      const draft = (await p.designer.send('POST', `${base}/revisions`, { fromRevisionId: issued.id }).expect(201)).body.revision;
      await p.designer.send('PUT', `${base}/revisions/${draft.id}/document`, { document: onFloors, version: draft.version }).expect(200);

      const issuedNow = (await p.designer.get(`${base}/revisions/${issued.id}`).expect(200)).body.revision;
      const draftNow = (await p.designer.get(`${base}/revisions/${draft.id}`).expect(200)).body.revision;
      // the draft holds the floors; the issued revision its absolute elevations, as it was issued
      expect(draftNow.document.floors.map((f: { name: string }) => f.name)).toEqual(onFloors.floors.map((f) => f.name));
      expect(issuedNow.document.floors).toEqual([]);
      expect(issuedNow.analysis.ok).toBe(true);
      expect(draftNow.analysis.ok).toBe(true);
      const a = numbersOf(issuedNow.analysis as StoredOutcome);
      const b = numbersOf(draftNow.analysis as StoredOutcome);
      expect(a.fixtures.length).toBeGreaterThan(20);
      // JSON numbers from both rows: equal as stored, every node's elevation included
      expect(b).toStrictEqual(a);
      console.log(
        `${file}: ${placed} of ${onFloors.nodes.length} nodes on ${onFloors.floors.length} floors; ${a.nodes.length} nodes, ${a.segments.length} segments, ${a.fixtures.length} fixtures identical`,
      );
    });
  }
});
