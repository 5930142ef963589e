/** Small hand-made system documents for the analysis tests (invented data). */
import type { SystemDocumentInput } from '../../../src/engine/model/schema';

/** Source → one copper segment → one node with a lavatory: the smallest complete system (SI). */
export function oneSegment(overrides: Partial<SystemDocumentInput> = {}): SystemDocumentInput {
  return {
    schemaVersion: 2,
    id: 'one',
    name: 'One segment',
    service: 'cold',
    unitSystem: 'SI',
    waterTemperature: 20,
    source: { kind: 'utility-main', nodeId: 'src', staticPressureLow: 400, staticPressureHigh: 450, pressureBasis: 'test' },
    devices: [],
    nodes: [
      { id: 'src', elevation: 0 },
      {
        id: 'end',
        elevation: 3,
        continuousDemand: 0.5,
        checkedFixtures: [{ id: 'lav', fixtureTypeId: 'lavatory-private' }],
      },
    ],
    segments: [
      {
        id: 's1',
        from: 'src',
        to: 'end',
        material: 'copper-l',
        size: '3/4',
        length: 20,
        fittings: [{ typeId: 'elbow-90-standard', count: 2 }],
      },
    ],
    ...overrides,
  };
}

/** A source feeding a chain a → b → c with a side branch a → d; demand by continuous flows. */
export function smallTree(): SystemDocumentInput {
  return {
    schemaVersion: 2,
    id: 'tree',
    name: 'Small tree',
    service: 'cold',
    unitSystem: 'SI',
    waterTemperature: 15,
    source: { kind: 'utility-main', nodeId: 'src', staticPressureLow: 500, staticPressureHigh: 550, pressureBasis: 'test' },
    devices: [],
    nodes: [
      { id: 'src', elevation: 0 },
      { id: 'a', elevation: 1 },
      { id: 'b', elevation: 4, continuousDemand: 0.2, checkedFixtures: [{ id: 'fb', fixtureTypeId: 'lavatory-private' }] },
      { id: 'c', elevation: 7, continuousDemand: 0.3, checkedFixtures: [{ id: 'fc', fixtureTypeId: 'kitchen-sink-private' }] },
      { id: 'd', elevation: 1, continuousDemand: 0.4, checkedFixtures: [{ id: 'fd', fixtureTypeId: 'hose-bibb' }] },
    ],
    segments: [
      { id: 'sa', from: 'src', to: 'a', material: 'copper-l', size: '1-1/4', length: 10, fittings: [] },
      { id: 'sb', from: 'a', to: 'b', material: 'copper-l', size: '1', length: 6, fittings: [{ typeId: 'tee-run', count: 1 }] },
      { id: 'sc', from: 'b', to: 'c', material: 'pex-sdr9', size: '3/4', length: 8, fittings: [{ typeId: 'elbow-90-standard', count: 2 }] },
      { id: 'sd', from: 'a', to: 'd', material: 'pex-sdr9', size: '3/4', length: 25, fittings: [{ typeId: 'tee-branch', count: 1 }] },
    ],
  };
}

export function clone<T>(x: T): T {
  return structuredClone(x);
}
