import { describe, expect, it } from 'vitest';
import { expectClose } from '../../helpers/expectClose';
import { FIXTURE_TYPES } from '../../../src/engine/catalog/fixtures';
import { NOT_VERIFIED } from '../../../src/engine/catalog/notVerified';

const PSI = 6894.757293168361;
const GPM = 3.785411784e-3 / 60;
// Table values are printed to 0.05 gpm / 1 psi; converted exactly.
const EXACT = { rtol: 1e-12 };

describe('WSFU, IPC Table E103.3(2) (2018) — rows read in a copy ([SEEN], REFERENCES §7a)', () => {
  const seen: [string, number | null, number | null, number][] = [
    ['bathroom-group-flush-tank-private', 2.7, 1.5, 3.6],
    ['bathroom-group-flush-valve-private', 6.0, 3.0, 8.0],
    ['bathtub-private', 1.0, 1.0, 1.4],
    ['bathtub-public', 3.0, 3.0, 4.0],
    ['bidet-private', 1.5, 1.5, 2.0],
    ['combination-fixture-private', 2.25, 2.25, 3.0],
    ['dishwasher-private', null, 1.4, 1.4],
    ['drinking-fountain', 0.25, null, 0.25],
    ['kitchen-sink-private', 1.0, 1.0, 1.4],
    ['laundry-tray-private', 1.0, 1.0, 1.4],
    ['lavatory-private', 0.5, 0.5, 0.7],
    ['lavatory-public', 1.5, 1.5, 2.0],
    ['service-sink', 2.25, 2.25, 3.0],
  ];
  for (const [id, cold, hot, total] of seen) {
    it(`${id}: ${cold ?? '—'} / ${hot ?? '—'} / ${total}`, () => {
      expect(FIXTURE_TYPES[id].wsfu).toEqual({ cold, hot, total });
    });
  }
});

describe('minimum flow pressure and flow, IPC 2018 Table 604.3 (REFERENCES §8a)', () => {
  const rows: [string, number, number, string][] = [
    ['lavatory-private', 0.8, 8, 'Lavatory, private [SEEN]'],
    ['lavatory-public', 0.4, 8, 'Lavatory, public [SEEN]'],
    ['bathtub-private', 4, 20, 'Bathtub, balanced-pressure or thermostatic [SEEN]'],
    ['shower-private', 2.5, 20, 'Shower, balanced-pressure or thermostatic [SEEN]'],
    ['kitchen-sink-private', 1.75, 8, 'Sink, residential [SEEN]'],
    ['dishwasher-private', 2.75, 8, 'Dishwasher, residential [SEEN]'],
    ['hose-bibb', 5, 8, 'Sillcock, hose bibb [SEEN]'],
    ['water-closet-flush-tank-private', 3, 20, 'Water closet, tank, close coupled [SEEN; also IRC 2018 P2903.1]'],
    ['water-closet-flushometer-tank', 1.6, 20, 'Water closet, flushometer tank [SEEN; also IRC 2018 P2903.1]'],
    ['water-closet-flush-valve-public', 25, 35, 'Water closet, siphonic, flushometer valve (IPC Table 604.3, undated copy; REFERENCES §13a)'],
    ['urinal-flush-valve-public', 12, 25, 'Urinal, valve (IPC Table 604.3, undated copy; REFERENCES §13a)'],
  ];
  for (const [id, gpm, psi, label] of rows) {
    it(`${id}: ${gpm} gpm at ${psi} psi (${label})`, () => {
      expectClose(FIXTURE_TYPES[id].flowRateM3s, gpm * GPM, EXACT);
      expectClose(FIXTURE_TYPES[id].minFlowPressurePa, psi * PSI, EXACT);
    });
  }
});

describe('FIXTURE_TYPES catalog', () => {
  it('has the ids the engine contract names', () => {
    for (const id of [
      'lavatory-private',
      'water-closet-flush-tank-private',
      'water-closet-flush-valve-public',
      'shower-private',
      'bathtub-private',
      'kitchen-sink-private',
      'dishwasher-private',
      'clothes-washer-private',
      'hose-bibb',
      'urinal-flush-valve-public',
      'lavatory-public',
      'service-sink',
      'drinking-fountain',
      'bathroom-group-flush-tank-private',
    ])
      expect(FIXTURE_TYPES[id], id).toBeDefined();
  });
  for (const [id, f] of Object.entries(FIXTURE_TYPES)) {
    it(`${id}: source named, flagged where not verified, consistent values`, () => {
      expect(f.id).toBe(id);
      expect(f.source).toMatch(/IPC|UPC|NSPC/);
      expect(f.source.includes(NOT_VERIFIED)).toBe(!f.verified);
      expect(f.wsfu.total).toBeGreaterThan(0);
      expect(f.minFlowPressurePa).toBeGreaterThan(0);
      expect(f.flowRateM3s).toBeGreaterThan(0);
      // Flushometer-valve fixtures are read on the flush-valve curve (IPC Table E103.3(3)).
      expect(f.demandCurve === 'flush-valve').toBe(/flushometer valve|flush valve/.test(f.control));
    });
  }
});
