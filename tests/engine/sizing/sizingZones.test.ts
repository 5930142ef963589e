/**
 * Sizing respects pressure zones (sizing/sizeSystem.ts, step 3: a PRV or a variable-speed booster
 * that holds its outlet cuts a fixture's path there). Invented two-zone document in US units.
 * The claims are structural, checked with the engine's own analysis of the sized document: a
 * fixture below a holding PRV keeps the same residual whatever size the pipe above the PRV takes,
 * so that fixture never governs the pipe above; without the PRV it does.
 */
import { describe, expect, it } from 'vitest';
import { analyzeSystem, type SystemDocumentInput } from '../../../src/engine';
import { sizeSystem } from '../../../src/engine/sizing/sizeSystem';
import { expectClose } from '../../helpers/expectClose';

/** The PRV's outlet is the same number at any trunk size; 1e-9 covers round-off only. */
const RTOL = 1e-9;

/**
 * 50 psi supply → 150 ft copper trunk (sizable, drawn at 2 in) → tee:
 *   low zone: PRV-L set 35 psi at the inlet of a locked 1 in branch → a lavatory 10 ft up, 8 gpm drawn
 *     (no automatic reducer loss at the tee: that loss sits below the PRV and depends on the trunk's
 *     size, so it would tie the branch to the trunk for a reason that is not the zone's);
 *   high zone: a 1 in branch (sizable) up 40 ft → a lavatory, 4 gpm drawn.
 */
function twoZones(withPrv: boolean): SystemDocumentInput {
  return {
    schemaVersion: 2,
    id: 'sizing-zones',
    name: 'Sizing with zones',
    service: 'cold',
    unitSystem: 'US',
    waterTemperature: 60,
    source: { kind: 'utility-main', nodeId: 'src', staticPressureLow: 50, staticPressureHigh: 55, pressureBasis: 'invented' },
    devices: withPrv ? [{ id: 'prv-l', kind: 'prv', label: 'PRV-L', segmentId: 'low', loss: { kind: 'fixed', loss: 0 }, prv: { setPressure: 35 } }] : [],
    nodes: [
      { id: 'src', elevation: 0 },
      { id: 'tee', label: 'Tee', elevation: 0 },
      {
        id: 'a',
        label: 'Low-zone lavatory',
        elevation: 10,
        continuousDemand: 8,
        checkedFixtures: [{ id: 'lav-low', fixtureTypeId: 'lavatory-private', label: 'Low lavatory' }],
      },
      {
        id: 'b',
        label: 'High-zone lavatory',
        elevation: 40,
        continuousDemand: 4,
        checkedFixtures: [{ id: 'lav-high', fixtureTypeId: 'lavatory-private', label: 'High lavatory' }],
      },
    ],
    segments: [
      { id: 'trunk', label: 'Trunk', from: 'src', to: 'tee', material: 'copper-l', size: '2', length: 150 },
      { id: 'low', label: 'Low branch', from: 'tee', to: 'a', material: 'copper-l', size: '1', length: 60, sizeLocked: true, reducerAuto: false },
      { id: 'high', label: 'High branch', from: 'tee', to: 'b', material: 'copper-l', size: '1', length: 60 },
    ],
  };
}

describe('sizing respects pressure zones', () => {
  it('below a holding PRV the fixture keeps its residual whatever the trunk becomes, and does not govern the trunk', () => {
    const r = sizeSystem(twoZones(true));
    expect(r.feasible).toBe(true);
    expect(r.verified).toBe(true);
    const trunk = r.segments.find((s) => s.segmentId === 'trunk')!;
    console.log('with PRV: trunk', trunk.before, '→', trunk.after, JSON.stringify(trunk.governing));
    expect(trunk.after).not.toBe(trunk.before);
    expect(trunk.governing).not.toEqual(expect.objectContaining({ fixtureId: 'lav-low' }));
    const low = r.margins.find((m) => m.fixtureId === 'lav-low')!;
    expectClose(low.afterPa!, low.beforePa, { rtol: RTOL }, 'low-zone margin unchanged by the trunk size');
    // The sized document, analysed: the low zone is still fed at the PRV's set pressure.
    const a = analyzeSystem(r.document!);
    const zone = a.zones!.find((z) => z.id === 'prv-l')!;
    expect(zone.status).toBe('pass');
    expect(a.segments.find((s) => s.id === 'low')!.devices[0].loss).toBeGreaterThan(0);
  });

  it('without the PRV the same fixture feels the trunk and its margin moves with the trunk size', () => {
    const r = sizeSystem(twoZones(false));
    expect(r.feasible).toBe(true);
    const trunk = r.segments.find((s) => s.segmentId === 'trunk')!;
    console.log('without PRV: trunk', trunk.before, '→', trunk.after, JSON.stringify(trunk.governing));
    const low = r.margins.find((m) => m.fixtureId === 'lav-low')!;
    expect(Math.abs(low.afterPa! - low.beforePa)).toBeGreaterThan(1000);
  });
});
