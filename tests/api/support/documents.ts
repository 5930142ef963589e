import { randomUUID } from 'node:crypto';

/**
 * A small invented two-storey system (US units) for API tests: main → 1" copper L service →
 * riser to level 2 → a lavatory on each level. Invented data; the numbers are not a reference.
 */
export function smallDocument(overrides: { elbowCount?: number } = {}) {
  return {
    schemaVersion: 2,
    id: randomUUID(),
    name: 'Test cold water',
    service: 'cold',
    unitSystem: 'US',
    waterTemperature: 60,
    source: { kind: 'utility-main', nodeId: 'main', staticPressureLow: 55, staticPressureHigh: 65, pressureBasis: 'Invented test figure' },
    devices: [{ id: 'meter', kind: 'meter', label: '1 in meter', segmentId: 'service', loss: { kind: 'fixed', loss: 3 } }],
    nodes: [
      { id: 'main', label: 'Main', elevation: 0, fixtureGroups: [], checkedFixtures: [] },
      {
        id: 'l1',
        label: 'Level 1',
        elevation: 2,
        fixtureGroups: [{ fixtureTypeId: 'lavatory-private', count: 1 }],
        checkedFixtures: [{ id: 'lav-1', fixtureTypeId: 'lavatory-private', label: 'Lavatory, level 1' }],
      },
      {
        id: 'l2',
        label: 'Level 2',
        elevation: 12,
        fixtureGroups: [{ fixtureTypeId: 'lavatory-private', count: 1 }],
        checkedFixtures: [{ id: 'lav-2', fixtureTypeId: 'lavatory-private', label: 'Lavatory, level 2' }],
      },
    ],
    segments: [
      {
        id: 'service',
        from: 'main',
        to: 'l1',
        material: 'copper-l',
        size: '1',
        length: 60,
        fittings: [{ typeId: 'elbow-90-standard', count: overrides.elbowCount ?? 2 }],
      },
      { id: 'riser', from: 'l1', to: 'l2', material: 'copper-l', size: '3/4', length: 14, fittings: [] },
    ],
  };
}
