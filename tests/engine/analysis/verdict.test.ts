/**
 * The verdict: pass only when every checked fixture is computed from a complete description and
 * every check is met; incomplete (with its reasons) wins over fail. Invented documents.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyzeSystem, SystemDocumentSchemaV1, upgradeDocument, type SystemDocumentInput } from '../../../src/engine';
import { PA_PER_PSI, G, M_PER_FT } from '../../../src/engine/units';
import { waterProperties } from '../../../src/engine/water';
import { expectClose } from '../../helpers/expectClose';
import { clone, oneSegment } from '../support/docs';

const codes = (doc: unknown) => analyzeSystem(doc).verdict.incomplete.map((r) => r.code);

describe('incomplete, with each reason', () => {
  it('an empty system (a source node only, 0 psi, no basis) is incomplete: no checked fixture, no pressure, no basis', () => {
    const empty = {
      schemaVersion: 2,
      id: 'empty',
      name: 'Empty',
      service: 'cold',
      unitSystem: 'US',
      waterTemperature: 60,
      source: { kind: 'utility-main', nodeId: 'connection', staticPressureLow: 0, staticPressureHigh: 0, pressureBasis: 'Not entered yet' },
      nodes: [{ id: 'connection', label: 'Connection to the main', elevation: 0 }],
      segments: [],
    };
    const a = analyzeSystem(empty);
    expect(a.verdict.status).toBe('incomplete');
    expect(a.verdict.incomplete.map((r) => r.code)).toStrictEqual(['no-checked-fixtures', 'source-pressure-missing', 'source-basis-missing']);
    expect(a.verdict.incomplete[1].message).toBe(
      'The supply static pressure is not entered (low 0.00 psi, high 0.00 psi): enter both from the utility or a gauge reading.',
    );
  });

  it('a system without a checked fixture is incomplete even when everything else is described', () => {
    const d = clone(oneSegment());
    d.nodes[1].checkedFixtures = [];
    expect(codes(d)).toStrictEqual(['no-checked-fixtures']);
  });

  it('a zero-pressure source is incomplete, not a fail', () => {
    const d = clone(oneSegment());
    d.source.staticPressureLow = 0;
    const a = analyzeSystem(d);
    expect(a.verdict.status).toBe('incomplete');
    expect(a.verdict.incomplete.map((r) => r.code)).toStrictEqual(['source-pressure-missing']);
    expect(a.verdict.allFixturesPass).toBe(false); // the numbers fail, but incomplete wins
  });

  it('a checked fixture not connected to the source is incomplete, named by its label', () => {
    const d = clone(oneSegment());
    d.nodes.push({ id: 'far', elevation: 0, checkedFixtures: [{ id: 'sink', fixtureTypeId: 'kitchen-sink-private', label: 'Kitchen sink, unit 4' }] });
    const a = analyzeSystem(d);
    expect(a.verdict.status).toBe('incomplete');
    const r = a.verdict.incomplete.find((x) => x.code === 'fixture-unreachable')!;
    expect(r.elementId).toBe('sink');
    expect(r.message).toBe(
      'The checked fixture "Kitchen sink, unit 4" is not connected to the source: connect the node of "Kitchen sink, unit 4" with a segment.',
    );
    expect(a.verdict.incomplete.map((x) => x.code)).toContain('part-unreachable');
    // every number is still finite (the unreached node has no flow and no pressure computed)
    expect(Number.isFinite(a.fixtures.find((f) => f.id === 'sink')!.residual)).toBe(true);
  });

  it('a node with no elevation, no floor and no rise on its feed segment is incomplete; it is computed level with its upstream node', () => {
    const d = clone(oneSegment());
    delete d.nodes[1].elevation;
    d.nodes[1].label = 'Lavatory stub';
    d.segments[0].label = 'Branch to lavatory';
    const a = analyzeSystem(d);
    expect(a.verdict.status).toBe('incomplete');
    const r = a.verdict.incomplete.find((x) => x.code === 'node-elevation-missing')!;
    expect(r.message).toBe(
      '"Lavatory stub" has no elevation: enter the rise of "Branch to lavatory" (0 for a level run), or the node\'s elevation or floor. It was computed level with the source connection.',
    );
    expect(a.segments[0].rise).toBe(0);
  });

  it('a source without an elevation or floor is incomplete', () => {
    const d = clone(oneSegment());
    delete d.nodes[0].elevation;
    expect(codes(d)).toStrictEqual(['source-elevation-missing']);
  });

  it('a segment without material and size is incomplete, computed with the pipe feeding it', () => {
    const d = clone(oneSegment());
    d.nodes.push({ id: 'next', elevation: 3, checkedFixtures: [{ id: 'lav2', fixtureTypeId: 'lavatory-private' }] });
    d.segments.push({ id: 's2', from: 'end', to: 'next', length: 5 });
    const a = analyzeSystem(d);
    expect(a.verdict.incomplete.map((r) => r.code)).toStrictEqual(['segment-pipe-missing']);
    // borrowed from s1 (3/4 in type L copper): the same inside diameter
    expect(a.si.segments[1].innerDiameter).toBe(a.si.segments[0].innerDiameter);
  });

  it('a booster given by one gain (version 1) is incomplete: its shutoff was assumed', () => {
    const d = clone(oneSegment());
    d.devices = [{ id: 'bp', kind: 'booster-pump', label: 'House booster', segmentId: 's1', loss: { kind: 'fixed', loss: 0 }, boost: { gain: 100 } }];
    const a = analyzeSystem(d);
    const r = a.verdict.incomplete.find((x) => x.code === 'booster-shutoff-missing')!;
    expect(r.elementLabel).toBe('House booster');
    expect(a.staticChecks.boosters).toHaveLength(1);
    expect(a.staticChecks.boosters[0]).toMatchObject({ deviceId: 'bp', label: 'House booster', control: 'constant-speed', assumed: true });
    // Flat curve assumed: the shutoff gain is the one gain given (SI document: kPa).
    expectClose(a.staticChecks.boosters[0].shutoffGain, 100, { rtol: 1e-12 }, 'assumed shutoff');
  });

  it('a complete, passing description is a pass', () => {
    const a = analyzeSystem(oneSegment());
    expect(a.verdict.status).toBe('pass');
    expect(a.verdict.incomplete).toStrictEqual([]);
  });
});

/**
 * A four-storey building entered step by step: every node created without a position, the rise of
 * each riser segment typed (10 ft a storey), a shower 4 ft above each floor. Invented data.
 */
function fourStoreys(): SystemDocumentInput {
  const nodes: SystemDocumentInput['nodes'] = [{ id: 'main', label: 'Main', elevation: 0 }];
  const segments: SystemDocumentInput['segments'] = [];
  let below = 'main';
  for (let f = 1; f <= 4; f++) {
    nodes.push({ id: `r${f}`, label: `Riser, level ${f}` });
    segments.push({ id: `riser-${f}`, label: `Riser to level ${f}`, from: below, to: `r${f}`, material: 'copper-l', size: '1', length: 10, rise: 10 });
    nodes.push({
      id: `sh${f}`,
      label: `Shower, level ${f}`,
      fixtureGroups: [{ fixtureTypeId: 'shower-private', count: 1 }],
      checkedFixtures: [{ id: `shower-${f}`, fixtureTypeId: 'shower-private', label: `Shower, level ${f}` }],
    });
    segments.push({ id: `branch-${f}`, from: `r${f}`, to: `sh${f}`, material: 'copper-l', size: '1/2', length: 8, rise: 4 });
    below = `r${f}`;
  }
  return {
    schemaVersion: 2,
    id: 'four',
    name: 'Four storeys',
    service: 'cold',
    unitSystem: 'US',
    waterTemperature: 60,
    source: { kind: 'utility-main', nodeId: 'main', staticPressureLow: 45, staticPressureHigh: 55, pressureBasis: 'invented' },
    devices: [{ id: 'meter', kind: 'meter', label: 'Meter', segmentId: 'riser-1', loss: { kind: 'fixed', loss: 8 } }],
    nodes,
    segments,
  };
}

describe('the four-storey building with the rises typed', () => {
  it('places each node by the rises and fails at the top shower, as with the elevations typed by hand', () => {
    const byRises = analyzeSystem(fourStoreys());
    expect(byRises.verdict.status).toBe('fail');
    const top = byRises.fixtures.find((f) => f.id === 'shower-4')!;
    expectClose(top.elevation, 44, { rtol: 1e-12 }, 'top shower at 4 × 10 + 4 ft');
    expect(top.pass).toBe(false);

    // The same building with absolute elevations typed by hand gives the same residuals.
    const byHand = clone(fourStoreys());
    for (const n of byHand.nodes) {
      if (n.id.startsWith('r')) n.elevation = Number(n.id.slice(1)) * 10;
      if (n.id.startsWith('sh')) n.elevation = Number(n.id.slice(2)) * 10 + 4;
    }
    for (const s of byHand.segments) delete s.rise;
    const a = analyzeSystem(byHand);
    expectClose(a.fixtures.find((f) => f.id === 'shower-4')!.residual, top.residual, { rtol: 1e-9 }, 'same residual');

    // Hand check of the elevation term: 44 ft of water at 60 °F is ρ·g·13.4112 m.
    const rho = waterProperties((60 - 32) / 1.8).density;
    const headPsi = (rho * G * 44 * M_PER_FT) / PA_PER_PSI; // ≈ 19.06 psi
    const climb = byRises.segments
      .filter((s) => ['riser-1', 'riser-2', 'riser-3', 'riser-4', 'branch-4'].includes(s.id))
      .reduce((sum, s) => sum + s.riseLoss, 0);
    expectClose(climb, headPsi, { rtol: 1e-12 }, 'rise losses on the path');
  });

  it('the same building stored by version 1 with every elevation left at the source and the rises typed: follow-rises gives the true fail', () => {
    const v1 = clone(fourStoreys()) as Record<string, unknown> & { nodes: Record<string, unknown>[] };
    v1.schemaVersion = 1;
    for (const n of v1.nodes) n.elevation = 0;
    const doc = SystemDocumentSchemaV1.parse(v1);
    const followed = analyzeSystem(upgradeDocument(doc, { riseConflict: 'follow-rises' }));
    expect(followed.verdict.status).toBe('fail');
    expectClose(followed.fixtures.find((f) => f.id === 'shower-4')!.elevation, 44, { rtol: 1e-12 }, 'top shower follows the rises');
    // keep-elevations reproduces what version 1 analysed (the flat building passes): for issued revisions only.
    const kept = analyzeSystem(upgradeDocument(doc, { riseConflict: 'keep-elevations' }));
    expect(kept.verdict.status).toBe('pass');
  });
});

describe('plain messages', () => {
  it('every warning of the demo building carries the name the user typed (or a description), and no detail names an internal id', () => {
    const doc = JSON.parse(readFileSync(new URL('../../../src/engine/examples/alder-finch-cold.json', import.meta.url), 'utf8')) as SystemDocumentInput;
    const a = analyzeSystem(doc);
    expect(a.warnings.length).toBeGreaterThan(0);
    const ids = new Set<string>([...doc.segments.map((s) => s.id), ...doc.nodes.map((n) => n.id), ...(doc.devices ?? []).map((d) => d.id)]);
    for (const w of a.warnings) {
      if (w.elementId !== null) expect(w.elementLabel, `${w.code} ${w.elementId}`).toEqual(expect.any(String));
      for (const id of ids) {
        // ids in this document are short codes like "seg-12"; a label may contain a word equal to one only by chance
        if (id.length > 3) expect(w.detail ?? '', `${w.code} detail names ${id}`).not.toContain(`"${id}"`);
      }
      expect(w.detail ?? '').not.toMatch(/\(s\)/); // proper plurals
    }
  });
});
