/**
 * The apartment building used to measure entry of a whole building (invented data, US units):
 * 60 psi low / 72 psi high static at the main, the connection 5 ft below level 1; a 2 in type K
 * service 40 ft long; a 1-1/2 in displacement meter and a reduced-pressure backflow assembly with
 * loss curves; a type L copper riser with floors 10 ft apart; a 1-1/4 in floor main on every
 * floor; 4 apartments a floor, each on a 1 in PEX branch of 10 / 25 / 40 / 55 ft with a water
 * closet (flush tank), lavatory, shower, kitchen sink, dishwasher and clothes washer.
 *
 * The meter's loss points are the AWWA C700 maximum-loss figures for a 1-1/2 in displacement meter
 * as printed on a utility's data sheet (see the device templates); the backflow assembly's curve is
 * invented for this example. Everything else is an invented design, not a recommendation.
 */
import type { RiserBuilderSpec } from './riserBuilder';
import { buildRiser, floorsFromTable } from './riserBuilder';
import type { UnitType } from './schema';

export const APARTMENT_A: UnitType = {
  id: 'apartment-a',
  name: 'Apartment A',
  nodes: [
    { id: 'manifold', label: 'apartment manifold', heightAboveFloor: 8, fixtureGroups: [], checkedFixtures: [] },
    {
      id: 'wc',
      label: 'water closet',
      heightAboveFloor: 1,
      fixtureGroups: [{ fixtureTypeId: 'water-closet-flush-tank-private', count: 1 }],
      checkedFixtures: [],
    },
    { id: 'lav', label: 'lavatory', heightAboveFloor: 2, fixtureGroups: [{ fixtureTypeId: 'lavatory-private', count: 1 }], checkedFixtures: [] },
    {
      id: 'shower',
      label: 'shower valve',
      heightAboveFloor: 6.5,
      fixtureGroups: [{ fixtureTypeId: 'shower-private', count: 1 }],
      checkedFixtures: [{ id: 'shower', fixtureTypeId: 'shower-private', label: 'shower valve' }],
    },
    { id: 'sink', label: 'kitchen sink', heightAboveFloor: 2, fixtureGroups: [{ fixtureTypeId: 'kitchen-sink-private', count: 1 }], checkedFixtures: [] },
    { id: 'dw', label: 'dishwasher', heightAboveFloor: 1, fixtureGroups: [{ fixtureTypeId: 'dishwasher-private', count: 1 }], checkedFixtures: [] },
    { id: 'cw', label: 'clothes washer', heightAboveFloor: 3.5, fixtureGroups: [{ fixtureTypeId: 'clothes-washer-private', count: 1 }], checkedFixtures: [] },
  ],
  segments: [
    {
      id: 'branch',
      label: 'branch',
      from: 'inlet',
      to: 'manifold',
      material: 'pex-sdr9',
      size: '1',
      length: 10,
      fittings: [
        { typeId: 'tee-branch', count: 1 },
        { typeId: 'valve-ball-full-port', count: 1 },
        { typeId: 'elbow-90-standard', count: 2 },
      ],
    },
    { id: 'to-wc', from: 'manifold', to: 'wc', material: 'pex-sdr9', size: '1/2', length: 12, fittings: [{ typeId: 'elbow-90-standard', count: 2 }] },
    { id: 'to-lav', from: 'manifold', to: 'lav', material: 'pex-sdr9', size: '1/2', length: 14, fittings: [{ typeId: 'elbow-90-standard', count: 2 }] },
    { id: 'to-shower', from: 'manifold', to: 'shower', material: 'pex-sdr9', size: '1/2', length: 18, fittings: [{ typeId: 'elbow-90-standard', count: 3 }] },
    { id: 'to-sink', from: 'manifold', to: 'sink', material: 'pex-sdr9', size: '1/2', length: 20, fittings: [{ typeId: 'elbow-90-standard', count: 2 }] },
    { id: 'to-dw', from: 'manifold', to: 'dw', material: 'pex-sdr9', size: '1/2', length: 22, fittings: [{ typeId: 'elbow-90-standard', count: 2 }] },
    { id: 'to-cw', from: 'manifold', to: 'cw', material: 'pex-sdr9', size: '1/2', length: 16, fittings: [{ typeId: 'elbow-90-standard', count: 2 }] },
  ],
};

/** Branch lengths of the four apartments of a floor, nearest first (ft). */
export const APARTMENT_BRANCH_LENGTHS_FT = [10, 25, 40, 55] as const;

/**
 * Branch lengths beyond the fourth apartment continue the same 15 ft step (a longer corridor):
 * the 40-storey, 320-apartment benchmark building has 8 a floor.
 */
export function apartmentBuildingSpec(storeys: number, apartmentsPerFloor = 4): RiserBuilderSpec {
  const lengths = Array.from({ length: apartmentsPerFloor }, (_, k) => APARTMENT_BRANCH_LENGTHS_FT[k] ?? 10 + 15 * k);
  const floors = floorsFromTable(
    Array.from({ length: storeys }, (_, i) => (i === 0 ? { name: 'Level 1', elevation: 0 } : { name: `Level ${i + 1}` })),
    10,
  );
  return {
    floors,
    startNodeId: 'after-backflow',
    startElevation: -5,
    riser: {
      material: 'copper-l',
      sizes: [{ fromFloor: floors[0].id, size: '2' }],
      fromFloor: floors[0].id,
      toFloor: floors[floors.length - 1].id,
      footLength: 10,
      footFittings: [{ typeId: 'elbow-90-standard', count: 2 }],
    },
    floorMain: { material: 'copper-l', size: '1-1/4', heightAboveFloor: 9 },
    units: lengths.map((len, k) => ({
      unitTypeId: APARTMENT_A.id,
      labelPattern: `Apt {floor}-${k + 1}`,
      mainLength: k === 0 ? 8 : 15,
      inletLength: len,
    })),
    unitTypes: [APARTMENT_A],
  };
}

/** The whole system document (schemaVersion 2, with floors, unit types and placements). */
export function apartmentBuildingDocument(storeys: number, apartmentsPerFloor = 4) {
  const spec = apartmentBuildingSpec(storeys, apartmentsPerFloor);
  const built = buildRiser(spec);
  return {
    schemaVersion: 2 as const,
    id: `apartments-${storeys}x${apartmentsPerFloor}`,
    name: `${storeys}-storey apartment building, cold water (invented example)`,
    service: 'cold' as const,
    unitSystem: 'US' as const,
    waterTemperature: 55,
    source: {
      kind: 'utility-main' as const,
      nodeId: 'main',
      staticPressureLow: 60,
      staticPressureHigh: 72,
      pressureBasis: 'Invented example: utility letter, static range at the main',
    },
    floors: built.floors,
    devices: [
      {
        id: 'meter',
        kind: 'meter' as const,
        label: '1-1/2 in displacement meter',
        segmentId: 'meter-set',
        loss: {
          kind: 'curve' as const,
          points: [
            { flow: 16, loss: 0.4 },
            { flow: 20, loss: 0.8 },
            { flow: 30, loss: 1.8 },
            { flow: 40, loss: 3.3 },
            { flow: 50, loss: 4.9 },
            { flow: 60, loss: 7.2 },
            { flow: 80, loss: 12.8 },
            { flow: 90, loss: 16.1 },
            { flow: 100, loss: 20.0 },
          ],
        },
      },
      {
        id: 'backflow',
        kind: 'backflow-preventer' as const,
        label: 'Reduced-pressure backflow assembly',
        segmentId: 'backflow-set',
        loss: {
          kind: 'curve' as const,
          points: [
            { flow: 10, loss: 9 },
            { flow: 50, loss: 10 },
            { flow: 100, loss: 12 },
            { flow: 150, loss: 14.5 },
          ],
        },
      },
    ],
    nodes: [
      { id: 'main', label: 'Utility main', elevation: -5 },
      { id: 'meter-in', label: 'Meter inlet', elevation: -5 },
      { id: 'after-meter', label: 'After the meter', elevation: -5 },
      { id: 'after-backflow', label: 'After the backflow assembly', elevation: -5 },
      ...built.nodes,
    ],
    segments: [
      {
        id: 'service',
        label: 'Building service',
        from: 'main',
        to: 'meter-in',
        material: 'copper-k',
        size: '2',
        length: 40,
        fittings: [{ typeId: 'elbow-90-standard', count: 2 }],
      },
      {
        id: 'meter-set',
        label: 'Meter set',
        from: 'meter-in',
        to: 'after-meter',
        material: 'copper-k',
        size: '2',
        length: 3,
        fittings: [{ typeId: 'valve-ball-full-port', count: 2 }],
      },
      {
        id: 'backflow-set',
        label: 'Backflow assembly set',
        from: 'after-meter',
        to: 'after-backflow',
        material: 'copper-l',
        size: '2',
        length: 4,
        fittings: [],
      },
      ...built.segments,
    ],
    unitTypes: spec.unitTypes,
    placements: built.placements,
  };
}
