import { describe, expect, it } from 'vitest';
import { analyzeSystem } from '../../../src/engine';
import { apartmentBuildingDocument } from '../../../src/engine/building/apartmentBuilding';
import { expectClose } from '../../helpers/expectClose';

// The building is invented (apartmentBuilding.ts). The hand-entered twin below writes the same
// pipes as plain segments with typed rises, the way a designer enters them one by one.

describe('a building from floors and typical units, analysed', () => {
  it('when the 4-storey, 16-apartment building is analysed, then the top floor’s farthest shower governs and it fails', () => {
    const a = analyzeSystem(apartmentBuildingDocument(4));
    expect(a.verdict.status).toBe('fail');
    expect(a.criticalFixtureId).toBe('level-4-u4.shower');
    const critical = a.fixtures.find((f) => f.id === a.criticalFixtureId)!;
    expect(critical.label).toBe('Apt Level 4-4 · shower valve');
    expect(critical.margin).toBeLessThan(0);
    // Every apartment's shower is checked: 16.
    expect(a.fixtures).toHaveLength(16);
    // Elevation comes from the floors: level 4 at 30 ft, the valve 6.5 ft above it.
    expect(critical.elevation).toBe(36.5);
  });

  it('when one apartment on one floor is entered segment by segment with typed rises, then the analysis is the same as the builder’s', () => {
    const built = apartmentBuildingDocument(1);
    // Keep only the first apartment of level 1 in the builder's version.
    const one = {
      ...built,
      segments: built.segments.filter((s) => !/^main-level-1-[234]$/.test(s.id)),
      nodes: built.nodes.filter((n) => !/^main-level-1-[234]$/.test(n.id)),
      placements: built.placements.filter((p) => p.id === 'level-1-u1'),
    };
    const byHand = {
      ...built,
      floors: [],
      unitTypes: undefined,
      placements: undefined,
      nodes: [
        { id: 'main', label: 'Utility main', elevation: -5 },
        { id: 'meter-in', elevation: -5 },
        { id: 'after-meter', elevation: -5 },
        { id: 'after-backflow', elevation: -5 },
        { id: 'riser-level-1' },
        { id: 'main-level-1-1' },
        { id: 'm' },
        { id: 'wc', fixtureGroups: [{ fixtureTypeId: 'water-closet-flush-tank-private', count: 1 }] },
        { id: 'lav', fixtureGroups: [{ fixtureTypeId: 'lavatory-private', count: 1 }] },
        {
          id: 'sh',
          fixtureGroups: [{ fixtureTypeId: 'shower-private', count: 1 }],
          checkedFixtures: [{ id: 'level-1-u1.shower', fixtureTypeId: 'shower-private' }],
        },
        { id: 'sink', fixtureGroups: [{ fixtureTypeId: 'kitchen-sink-private', count: 1 }] },
        { id: 'dw', fixtureGroups: [{ fixtureTypeId: 'dishwasher-private', count: 1 }] },
        { id: 'cw', fixtureGroups: [{ fixtureTypeId: 'clothes-washer-private', count: 1 }] },
      ],
      segments: [
        ...built.segments.slice(0, 3),
        // riser foot: from -5 ft to level 1's main at 9 ft: rise 14 ft, 24 ft of pipe
        {
          id: 'riser-foot',
          from: 'after-backflow',
          to: 'riser-level-1',
          material: 'copper-l',
          size: '2',
          length: 24,
          rise: 14,
          fittings: [
            { typeId: 'elbow-90-standard', count: 2 },
            { typeId: 'tee-run', count: 1 },
          ],
        },
        {
          id: 'main-1',
          from: 'riser-level-1',
          to: 'main-level-1-1',
          material: 'copper-l',
          size: '1-1/4',
          length: 8,
          rise: 0,
          fittings: [{ typeId: 'tee-run', count: 1 }],
        },
        // the apartment: branch down from the main (9 ft) to the manifold (8 ft), then to each fixture
        {
          id: 'b',
          from: 'main-level-1-1',
          to: 'm',
          material: 'pex-sdr9',
          size: '1',
          length: 10,
          rise: -1,
          fittings: [
            { typeId: 'tee-branch', count: 1 },
            { typeId: 'valve-ball-full-port', count: 1 },
            { typeId: 'elbow-90-standard', count: 2 },
          ],
        },
        { id: 'to-wc', from: 'm', to: 'wc', material: 'pex-sdr9', size: '1/2', length: 12, rise: -7, fittings: [{ typeId: 'elbow-90-standard', count: 2 }] },
        { id: 'to-lav', from: 'm', to: 'lav', material: 'pex-sdr9', size: '1/2', length: 14, rise: -6, fittings: [{ typeId: 'elbow-90-standard', count: 2 }] },
        { id: 'to-sh', from: 'm', to: 'sh', material: 'pex-sdr9', size: '1/2', length: 18, rise: -1.5, fittings: [{ typeId: 'elbow-90-standard', count: 3 }] },
        {
          id: 'to-sink',
          from: 'm',
          to: 'sink',
          material: 'pex-sdr9',
          size: '1/2',
          length: 20,
          rise: -6,
          fittings: [{ typeId: 'elbow-90-standard', count: 2 }],
        },
        { id: 'to-dw', from: 'm', to: 'dw', material: 'pex-sdr9', size: '1/2', length: 22, rise: -7, fittings: [{ typeId: 'elbow-90-standard', count: 2 }] },
        { id: 'to-cw', from: 'm', to: 'cw', material: 'pex-sdr9', size: '1/2', length: 16, rise: -4.5, fittings: [{ typeId: 'elbow-90-standard', count: 2 }] },
      ],
    };
    const a = analyzeSystem(one);
    const b = analyzeSystem(byHand);
    const fa = a.fixtures[0];
    const fb = b.fixtures[0];
    // Same pipes, same climb: the residuals agree to rounding of the two elevation sums (rtol 1e-9).
    expectClose(fb.residual, fa.residual, { rtol: 1e-9 });
    expectClose(fb.elevation, fa.elevation, { rtol: 1e-12 });
    expect(b.source.designFlow).toBe(a.source.designFlow);
  });
});
