/**
 * The riser builder with pressure zones by floor range (building/riserBuilder.ts). The building is
 * the invented apartment tower of apartmentBuilding.ts (10 ft floors, the floor main 9 ft above
 * each floor, the start point at −5 ft, a 10 ft run to the foot); the counts and lengths below are
 * worked by hand from that description, not read back from the generator.
 */
import { describe, expect, it } from 'vitest';
import { analyzeSystem } from '../../../src/engine';
import { buildRiser, type ZoneSpec } from '../../../src/engine/building/riserBuilder';
import { apartmentBuildingDocument, apartmentBuildingSpec } from '../../../src/engine/building/apartmentBuilding';
import { EngineInputError } from '../../../src/engine/errors';
import { G, M_PER_FT, PA_PER_PSI } from '../../../src/engine/units';
import { waterProperties } from '../../../src/engine/water';
import { expectClose } from '../../helpers/expectClose';

const TWO_ZONES: ZoneSpec[] = [
  { fromFloor: 'level-1', toFloor: 'level-12', feed: 'prv', setPressure: 65 },
  { fromFloor: 'level-13', toFloor: 'level-40', feed: 'booster-pump', setPressure: 120 },
];

function zonedSpec(storeys = 40, zones: ZoneSpec[] = TWO_ZONES) {
  return { ...apartmentBuildingSpec(storeys), zones };
}

/** The tower's document with the zoned riser in place of the single one. */
function zonedDocument(storeys = 40, zones: ZoneSpec[] = TWO_ZONES) {
  const doc = apartmentBuildingDocument(storeys);
  const built = buildRiser(zonedSpec(storeys, zones));
  const service = doc.nodes.filter((n) => !('floor' in n));
  const serviceSegs = doc.segments.filter((s) => ['service', 'meter-set', 'backflow-set'].includes(s.id));
  return {
    ...doc,
    nodes: [...service, ...built.nodes],
    segments: [...serviceSegs, ...built.segments],
    placements: built.placements,
    devices: [
      ...doc.devices,
      ...built.devices.map((d) =>
        d.kind === 'prv'
          ? {
              id: d.id,
              kind: 'prv' as const,
              label: d.label,
              segmentId: d.segmentId,
              loss: { kind: 'fixed' as const, loss: 0 },
              prv: { setPressure: d.setPressure },
            }
          : {
              id: d.id,
              kind: 'booster-pump' as const,
              label: d.label,
              segmentId: d.segmentId,
              loss: { kind: 'fixed' as const, loss: 0 },
              boost: { control: 'variable-speed' as const, setPressure: d.setPressure },
            },
      ),
    ],
  };
}

describe('the riser builder with pressure zones', () => {
  it('when floors 1–12 go through a PRV and 13–40 through a booster, then each zone has its own riser, counted by hand', () => {
    const built = buildRiser(zonedSpec());
    // Low zone: a foot to Level 1 and 11 riser segments, plus 4 main segments on each of 12 floors: 12 + 48 = 60.
    // High zone: a foot to its base, an express riser to Level 13, 27 riser segments, 4 mains on each of 28 floors: 2 + 27 + 112 = 141.
    expect(built.segments).toHaveLength(60 + 141);
    // Nodes: low 12 riser + 48 taps = 60; high: the base, 28 riser nodes and 112 taps = 141.
    expect(built.nodes).toHaveLength(60 + 141);
    expect(built.placements).toHaveLength(40 * 4);
    expect(built.devices).toEqual([
      { id: 'zone-1-prv', kind: 'prv', label: 'PRV for Level 1–Level 12', segmentId: 'zone-1-riser-foot', setPressure: 65 },
      { id: 'zone-2-booster', kind: 'booster-pump', label: 'Booster pump for Level 13–Level 40', segmentId: 'zone-2-foot', setPressure: 120 },
    ]);
    const seg = (id: string) => built.segments.find((s) => s.id === id)!;
    // Low-zone foot: 10 ft run + climb from −5 ft to Level 1's main at 9 ft (14 ft) = 24 ft.
    expect(seg('zone-1-riser-foot')).toMatchObject({ from: 'after-backflow', to: 'riser-level-1', length: 24 });
    // High-zone foot: the 10 ft run to its base, level with the start (−5 ft, written as 5 ft below Level 1);
    // then express from −5 ft to Level 13's main at 120 + 9 = 129 ft: 134 ft.
    expect(seg('zone-2-foot')).toMatchObject({ from: 'after-backflow', to: 'zone-2-base', length: 10 });
    expect(built.nodes.find((n) => n.id === 'zone-2-base')).toMatchObject({ floor: 'level-1', heightAboveFloor: -5 });
    expect(seg('zone-2-express')).toMatchObject({ from: 'zone-2-base', to: 'riser-level-13', length: 134 });
    // The express riser has no taps: nothing but the next riser leaves Level 13's riser node from below it.
    expect(built.segments.filter((s) => s.from === 'zone-2-base').map((s) => s.id)).toEqual(['zone-2-express']);
    // Level 12 (low zone's top) and Level 13 (high zone's first) are not joined.
    expect(built.segments.some((s) => s.from === 'riser-level-12' && s.to === 'riser-level-13')).toBe(false);
  });

  it('when analysed, then every apartment on floors 1–12 is in the PRV zone and every one above in the booster zone', () => {
    const a = analyzeSystem(zonedDocument());
    const zones = a.zones!;
    expect(zones.map((z) => z.name)).toEqual([
      'Zone 1 — from the supply',
      'Zone 2 — PRV for Level 1–Level 12 (set 65 psi)',
      'Zone 3 — Booster pump for Level 13–Level 40 (set 120 psi)',
    ]);
    // One checked shower per apartment: 12 floors × 4 and 28 floors × 4.
    expect(zones.map((z) => z.checkedFixtures)).toEqual([0, 48, 112]);
    expect(zones[1].floors[0]).toBe('Level 1');
    expect(zones[1].floors.at(-1)).toBe('Level 12');
    // the floors it serves: its base node beside Level 1's main serves nothing and is not counted
    expect(zones[2].floors).toHaveLength(28);
    expect(zones[2].floors[0]).toBe('Level 13');
    expect(zones[2].floors.at(-1)).toBe('Level 40');
    // Static at Level 13's riser node: the booster holds 120 psi at its foot's inlet, the start point
    // at −5 ft; Level 13's main is at 129 ft, a 134 ft climb (ρ·g from the engine's water at 55 °F,
    // about 0.433 psi/ft; IPC E103.2.2 prints 0.433): 120 − 134 × 0.433 ≈ 61.9 psi.
    const psiPerFt = (waterProperties((55 - 32) / 1.8).density * G * M_PER_FT) / PA_PER_PSI;
    const n13 = a.nodes.find((n) => n.id === 'riser-level-13')!;
    expectClose(n13.staticPressureHigh, 120 - 134 * psiPerFt, { rtol: 1e-9 }, 'static at Level 13');
    // 120 psi cannot lift water 390 ft to Level 40 (about 169 psi of climb): that zone fails, and says why.
    expect(zones[2].status).toBe('fail');
    expect(zones[2].failingFixtures).toBeGreaterThan(0);
  });

  it('when a zone leaves a gap, overlaps, misses its setting or stops short of the top, then the error names the zone', () => {
    const err = (zones: ZoneSpec[]) => {
      try {
        buildRiser(zonedSpec(40, zones));
      } catch (e) {
        expect(e).toBeInstanceOf(EngineInputError);
        return (e as EngineInputError).message;
      }
      throw new Error('expected an error');
    };
    expect(err([TWO_ZONES[0], { ...TWO_ZONES[1], fromFloor: 'level-14' }])).toMatch(/Zone 2 starts at "Level 14".*should start at "Level 13"/);
    expect(err([TWO_ZONES[0], { ...TWO_ZONES[1], fromFloor: 'level-12' }])).toMatch(/Zone 2 starts at "Level 12"/);
    expect(err([{ ...TWO_ZONES[0], setPressure: undefined }, TWO_ZONES[1]])).toMatch(/Zone 1 \(Level 1–Level 12\): enter the PRV's set pressure/);
    expect(err([TWO_ZONES[0]])).toMatch(/zones end at "Level 12".*add a zone/);
    expect(err([{ ...TWO_ZONES[0], fromFloor: 'roof' }, TWO_ZONES[1]])).toMatch(/Zone 1: floor "roof" is not in the floor list/);
  });

  it('when no zones are given, then the riser is as before: one riser and no devices', () => {
    const plain = buildRiser(apartmentBuildingSpec(4));
    expect(plain.devices).toEqual([]);
    expect(plain.segments[0].id).toBe('riser-foot');
    expect(buildRiser({ ...apartmentBuildingSpec(4), zones: [] }).segments).toEqual(plain.segments);
  });
});
