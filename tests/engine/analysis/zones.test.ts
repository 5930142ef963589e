/**
 * Pressure zones (analysis/zones.ts) against hand calculations written out here. Invented
 * documents in US units at 60 °F. No fixture groups: no demand, so no friction, and every residual
 * is a start pressure less the climb only — the figures below follow by hand.
 * Elevation head ρ(T)·g per foot from the engine's water properties (IAPWS-95 at 1 atm), about
 * 0.4331 psi/ft at 60 °F (IPC E103.2.2 prints 0.433). Minimum flow pressure of a private
 * lavatory: 8 psi (IPC 2018 Table 604.3).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyzeSystem, type SystemDocumentInput } from '../../../src/engine';
import { zoneFloorsWords } from '../../../src/shared/format/zoneWords';
import { G, M_PER_FT, PA_PER_PSI } from '../../../src/engine/units';
import { waterProperties } from '../../../src/engine/water';
import { expectClose } from '../../helpers/expectClose';
import { clone, oneSegment } from '../support/docs';

const psiPerFt = (waterProperties((60 - 32) / 1.8).density * G * M_PER_FT) / PA_PER_PSI;
/** Every expected figure is computed from the same constants; 1e-9 covers the order of operations. */
const RTOL = 1e-9;
/** IPC 2018 Table 604.3, lavatory. */
const LAV_MIN_PSI = 8;

const lav = (id: string, label: string) => ({ id, fixtureTypeId: 'lavatory-private', label });

/**
 * Source (Level 1, 60 psi low / 70 high) → r1 (1 ft up, a Level 1 lavatory)
 *   → "low" through PRV-2 set 50 psi → a (Level 2 at 10 ft, +3 ft): a lavatory;
 *   → "up" through a variable-speed booster BP-1 set 120 psi → b (Level 3 at 20 ft, +3 ft): a lavatory;
 *       → "top" through PRV-4 set 70 psi → c (Level 4 at 30 ft, +3 ft): a lavatory (a zone inside the booster's).
 */
function zoned(): SystemDocumentInput {
  return {
    schemaVersion: 2,
    id: 'zoned',
    name: 'Two zones and a nested one',
    service: 'cold',
    unitSystem: 'US',
    waterTemperature: 60,
    source: { kind: 'utility-main', nodeId: 'src', staticPressureLow: 60, staticPressureHigh: 70, pressureBasis: 'invented' },
    floors: [
      { id: 'l1', name: 'Level 1', elevation: 0 },
      { id: 'l2', name: 'Level 2', elevation: 10 },
      { id: 'l3', name: 'Level 3', elevation: 20 },
      { id: 'l4', name: 'Level 4', elevation: 30 },
    ],
    devices: [
      { id: 'prv-2', kind: 'prv', label: 'PRV-2', segmentId: 'low', loss: { kind: 'fixed', loss: 0 }, prv: { setPressure: 50 } },
      {
        id: 'bp-1',
        kind: 'booster-pump',
        label: 'BP-1',
        segmentId: 'up',
        loss: { kind: 'fixed', loss: 0 },
        boost: { control: 'variable-speed', setPressure: 120 },
      },
      { id: 'prv-4', kind: 'prv', label: 'PRV-4', segmentId: 'top', loss: { kind: 'fixed', loss: 0 }, prv: { setPressure: 70 } },
    ],
    nodes: [
      { id: 'src', floor: 'l1' },
      { id: 'r1', label: 'Riser base', floor: 'l1', heightAboveFloor: 1, checkedFixtures: [lav('lav1', 'Lavatory L1')] },
      { id: 'a', label: 'Level 2 lavatory', floor: 'l2', heightAboveFloor: 3, checkedFixtures: [lav('lav2', 'Lavatory L2')] },
      { id: 'b', label: 'Level 3 lavatory', floor: 'l3', heightAboveFloor: 3, checkedFixtures: [lav('lav3', 'Lavatory L3')] },
      { id: 'c', label: 'Level 4 lavatory', floor: 'l4', heightAboveFloor: 3, checkedFixtures: [lav('lav4', 'Lavatory L4')] },
    ],
    segments: [
      { id: 'main', from: 'src', to: 'r1', material: 'copper-l', size: '1', length: 5 },
      { id: 'low', from: 'r1', to: 'a', material: 'copper-l', size: '3/4', length: 20 },
      { id: 'up', from: 'r1', to: 'b', material: 'copper-l', size: '3/4', length: 30 },
      { id: 'top', from: 'b', to: 'c', material: 'copper-l', size: '3/4', length: 12 },
    ],
  };
}

describe('pressure zones', () => {
  const a = analyzeSystem(zoned());
  const zones = a.zones!;
  const zone = (id: string) => zones.find((z) => z.id === id)!;

  it('finds one zone per PRV or booster plus the supply, named by the device and its setting, nested where fed from another', () => {
    expect(zones.map((z) => z.name)).toEqual([
      'Zone 1 — from the supply',
      'Zone 2 — PRV-2 (set 50 psi)',
      'Zone 3 — BP-1 (set 120 psi)',
      'Zone 4 — PRV-4 (set 70 psi)',
    ]);
    expect(zones.map((z) => z.parentZoneId)).toEqual([null, 'supply', 'supply', 'bp-1']);
    expect(zones.map((z) => z.entrySegmentId)).toEqual([null, 'low', 'up', 'top']);
    expect(zones.map((z) => z.feed.kind)).toEqual(['supply', 'prv', 'booster-pump', 'prv']);
    expect(zones[0].feed.pressure).toBeNull();
    [50, 120, 70].forEach((set, k) => expectClose(zones[k + 1].feed.pressure!, set, { rtol: RTOL }, 'set pressure'));
    expect(zones.map((z) => z.floors)).toEqual([['Level 1'], ['Level 2'], ['Level 3'], ['Level 4']]);
    expect(zones.map((z) => z.checkedFixtures)).toEqual([1, 1, 1, 1]);
  });

  it('zone 1: the supply less the climb to the riser base', () => {
    // r1 sits 1 ft above the source: 60 − 1 × 0.4331 = 59.567 psi residual (no flow: the low static),
    // 70 − 0.4331 = 69.567 psi high static (within the 80 psi maximum, IPC 604.8).
    const z = zone('supply');
    expect(z.lowestResidual!.nodeId).toBe('r1');
    expectClose(z.lowestResidual!.pressure, 60 - psiPerFt, { rtol: RTOL }, 'lowest residual');
    // The highest residual is at the source itself: 60 psi.
    expect(z.highestResidual!.nodeId).toBe('src');
    expectClose(z.highestResidual!.pressure, 60, { rtol: RTOL }, 'highest residual');
    expectClose(z.highestStatic!.pressure, 70 - psiPerFt, { rtol: RTOL }, 'highest static');
    expect(z.highestStatic!.pass).toBe(true);
    expectClose(z.criticalFixture!.margin, 60 - psiPerFt - LAV_MIN_PSI, { rtol: RTOL }, 'margin');
    expect(z.status).toBe('pass');
  });

  it('zone 2 (PRV): the set pressure less the climb from the valve to the fixture', () => {
    // PRV-2 at r1 (1 ft) holds 50 psi; "a" is at 10 + 3 = 13 ft, 12 ft higher: 50 − 12 × 0.4331 = 44.803 psi,
    // at flow and at no flow (the outlet sits at the set pressure either way). Margin 44.803 − 8 = 36.803.
    const z = zone('prv-2');
    expectClose(z.lowestResidual!.pressure, 50 - 12 * psiPerFt, { rtol: RTOL }, 'residual');
    expectClose(z.highestStatic!.pressure, 50 - 12 * psiPerFt, { rtol: RTOL }, 'static');
    expectClose(z.criticalFixture!.margin, 50 - 12 * psiPerFt - LAV_MIN_PSI, { rtol: RTOL }, 'margin');
    expect(z.lowestElevation).toBe(13);
    expect(z.highestElevation).toBe(13);
    expect(z.status).toBe('pass');
  });

  it('zone 3 (booster): over the maximum static, so the zone fails while its neighbours pass', () => {
    // BP-1 at r1 (1 ft) holds 120 psi; "b" is at 23 ft, 22 ft higher: 120 − 22 × 0.4331 = 110.47 psi > 80.
    const z = zone('bp-1');
    expectClose(z.highestStatic!.pressure, 120 - 22 * psiPerFt, { rtol: RTOL }, 'static');
    expect(z.highestStatic).toMatchObject({ nodeId: 'b', where: 'Level 3 lavatory', maximum: 80, pass: false });
    expect(z.staticFailures).toBe(1);
    expect(z.status).toBe('fail');
    expect(a.verdict.status).toBe('fail');
  });

  it("zone 4 (PRV below the booster): the set pressure less its own climb, not the booster's", () => {
    // PRV-4 at b (23 ft) holds 70 psi; "c" at 33 ft: 70 − 10 × 0.4331 = 65.669 psi.
    const z = zone('prv-4');
    expectClose(z.lowestResidual!.pressure, 70 - 10 * psiPerFt, { rtol: RTOL }, 'residual');
    expect(z.criticalFixture).toMatchObject({ fixtureId: 'lav4', label: 'Lavatory L4', pass: true });
    expect(z.status).toBe('pass');
  });

  it('a system without PRV or booster has one zone holding every fixture', () => {
    const b = analyzeSystem(oneSegment());
    expect(b.zones!.map((z) => z.name)).toEqual(['Zone 1 — from the supply']);
    expect(b.zones![0].checkedFixtures).toBe(b.fixtures.length);
    expect(b.zones![0].status).toBe(b.verdict.status);
  });

  it('a zone with no checked fixture is "not checked", never a pass; its static check can still fail it', () => {
    const d = clone(zoned());
    d.nodes[4].checkedFixtures = [];
    d.nodes[4].fixtureGroups = [{ fixtureTypeId: 'lavatory-private', count: 2 }];
    const z = analyzeSystem(d).zones!.find((x) => x.id === 'prv-4')!;
    expect(z).toMatchObject({ checkedFixtures: 0, fixtureGroups: 1, status: 'not-checked', criticalFixture: null });
    // Same zone with PRV-4 set at 100 psi: 100 − 10 × 0.4331 = 95.67 psi static at "c" > 80: fails.
    d.devices![2].prv = { setPressure: 100 };
    expect(analyzeSystem(d).zones!.find((x) => x.id === 'prv-4')!.status).toBe('fail');
  });

  it('a zone with an incomplete reason on its element is incomplete', () => {
    const d = clone(zoned());
    // "c" loses its floor: its position is missing (an incomplete reason on node "c", in zone 4 only).
    d.nodes[4] = { id: 'c', label: 'Level 4 lavatory', checkedFixtures: [lav('lav4', 'Lavatory L4')] };
    const b = analyzeSystem(d);
    expect(b.verdict.status).toBe('incomplete');
    expect(b.zones!.find((x) => x.id === 'prv-4')!.status).toBe('incomplete');
    expect(b.zones!.find((x) => x.id === 'prv-2')!.status).toBe('pass');
  });

  it('a constant-speed booster names its design gain', () => {
    const d = clone(zoned());
    d.devices![1] = {
      id: 'bp-1',
      kind: 'booster-pump',
      label: 'BP-1',
      segmentId: 'up',
      loss: { kind: 'fixed', loss: 0 },
      boost: { control: 'constant-speed', designGain: 40, shutoffGain: 50 },
    };
    expect(analyzeSystem(d).zones![2].name).toBe('Zone 3 — BP-1 (gain 40 psi)');
  });

  it('a zone whose PRV has no set pressure is an error naming the device', () => {
    const d = clone(zoned());
    delete d.devices![0].prv;
    expect(() => analyzeSystem(d)).toThrow(expect.objectContaining({ code: 'missing-field', elementType: 'device', elementId: 'prv-2', field: 'prv' }));
  });

  it('a zone whose floors are not adjacent names each run of floors, not one span over the floors between', () => {
    // a tap below the booster back down on Level 1: the booster's zone serves Level 1 and Level 3, not Level 2
    const doc = clone(zoned());
    doc.nodes.push({ id: 'b0', label: 'Level 1 boosted lavatory', floor: 'l1', heightAboveFloor: 3, checkedFixtures: [lav('lav5', 'Lavatory L1 boosted')] });
    doc.segments.push({ id: 'down', from: 'b', to: 'b0', material: 'copper-l', size: '3/4', length: 25 });
    const split = analyzeSystem(doc).zones!.find((z) => z.id === 'bp-1')!;
    expect(split.floors).toEqual(['Level 1', 'Level 3']);
    expect(split.floorRuns).toEqual([
      { from: 'Level 1', to: 'Level 1', count: 1 },
      { from: 'Level 3', to: 'Level 3', count: 1 },
    ]);
    expect(zoneFloorsWords(split, 'ft')).toBe('Level 1, Level 3 (2 floors)');
    // adjacent floors stay one span: PRV-4's zone moved to take Level 3 and Level 4
    const doc2 = clone(zoned());
    doc2.nodes.push({ id: 'c3', label: 'Level 3 tap below PRV-4', floor: 'l3', heightAboveFloor: 6, checkedFixtures: [lav('lav6', 'Lavatory L3 reduced')] });
    doc2.segments.push({ id: 'back', from: 'c', to: 'c3', material: 'copper-l', size: '3/4', length: 12 });
    const span = analyzeSystem(doc2).zones!.find((z) => z.id === 'prv-4')!;
    expect(zoneFloorsWords(span, 'ft')).toBe('Level 3 – Level 4 (2 floors)');
    // an analysis stored before runs were recorded reads as it was issued
    expect(zoneFloorsWords({ ...split, floorRuns: undefined }, 'ft')).toBe('Level 1 – Level 3 (2 floors)');
  });

  it("the demo building: every checked fixture in exactly one zone, and the zones' verdicts agree with the system's", () => {
    const demo = analyzeSystem(JSON.parse(readFileSync(new URL('../../../src/engine/examples/alder-finch-cold.json', import.meta.url), 'utf8')));
    const zs = demo.zones!;
    expect(zs.length).toBeGreaterThan(1);
    expect(zs.reduce((n, z) => n + z.checkedFixtures, 0)).toBe(demo.fixtures.length);
    // The critical fixture of the system is the critical fixture of its zone.
    expect(zs.some((z) => z.criticalFixture?.fixtureId === demo.criticalFixtureId)).toBe(true);
    // The demo passes: every zone with a checked fixture passes; the zone of the PRV on the water
    // heater's feed checks none (the hot system checks those fixtures).
    expect(demo.verdict.status).toBe('pass');
    for (const z of zs) expect(z.status).toBe(z.checkedFixtures > 0 ? 'pass' : 'not-checked');
  });
});
