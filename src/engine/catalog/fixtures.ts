/**
 * Fixture types: water supply fixture units (IPC Table E103.3(2), 2018) and minimum flow pressure
 * and flow at the fixture (IPC 2018 Table 604.3). Entries with any value that could not be checked
 * against a printed copy of the table carry `verified: false` and say which value in `source`.
 */
import { PA_PER_PSI, M3S_PER_GPM } from '../units';
import { NOT_VERIFIED } from './notVerified';
import type { DemandCurve } from '../demand/hunterDesignFlow';

export interface FixtureType {
  id: string;
  label: string;
  occupancy: 'private' | 'public' | 'assembly';
  control: string;
  wsfu: { cold: number | null; hot: number | null; total: number };
  demandCurve: DemandCurve;
  minFlowPressurePa: number;
  flowRateM3s: number;
  source: string;
  /** false when a value (named in `source`) could not be checked against a printed copy of its table. */
  verified: boolean;
}

const WSFU_SEEN = 'WSFU: IPC Table E103.3(2) (2018)';
// Rows from "Shower head" onward: the printed 2018 page as retrieved stops after the service sink.
const WSFU_MEM = `WSFU: IPC Table E103.3(2) (2018), ${NOT_VERIFIED}`;
const P604_SEEN = 'flow and pressure: IPC 2018 Table 604.3';
// The urinal and flushometer-valve rows were read in a copy of IPC Table 604.3 that does not print its
// edition; its other rows are the same as the printed 2018 page.
const P604_UNDATED = 'flow and pressure: IPC Table 604.3 (copy without an edition label; its other rows match the 2018 printing)';

interface Row {
  id: string;
  label: string;
  occupancy: FixtureType['occupancy'];
  control: string;
  wsfu: [cold: number | null, hot: number | null, total: number];
  curve: DemandCurve;
  psi: number;
  gpm: number;
  source: string;
  /** set when a value could not be checked (WSFU rows the retrieved 2018 page did not show) */
  unverified?: true;
}

const ROWS: readonly Row[] = [
  {
    id: 'bathroom-group-flush-tank-private',
    label: 'Bathroom group, flush tank',
    occupancy: 'private',
    control: 'flush tank',
    wsfu: [2.7, 1.5, 3.6],
    curve: 'flush-tank',
    psi: 20,
    gpm: 4,
    source: `${WSFU_SEEN}; flow and pressure: the group's governing outlet, bathtub with balanced-pressure or thermostatic valve (4 gpm, 20 psi), IPC 2018 Table 604.3`,
  },
  {
    id: 'bathroom-group-flush-valve-private',
    label: 'Bathroom group, flushometer valve',
    occupancy: 'private',
    control: 'flushometer valve',
    wsfu: [6.0, 3.0, 8.0],
    curve: 'flush-valve',
    psi: 35,
    gpm: 25,
    source: `${WSFU_SEEN}; flow and pressure: the group's governing outlet, water closet siphonic flushometer valve (25 gpm, 35 psi), IPC Table 604.3 (copy without an edition label; its other rows match the 2018 printing)`,
  },
  {
    id: 'bathtub-private',
    label: 'Bathtub',
    occupancy: 'private',
    control: 'faucet',
    wsfu: [1.0, 1.0, 1.4],
    curve: 'flush-tank',
    psi: 20,
    gpm: 4,
    source: `${WSFU_SEEN}; ${P604_SEEN} (bathtub, balanced-pressure or thermostatic mixing valve)`,
  },
  {
    id: 'bathtub-public',
    label: 'Bathtub',
    occupancy: 'public',
    control: 'faucet',
    wsfu: [3.0, 3.0, 4.0],
    curve: 'flush-tank',
    psi: 20,
    gpm: 4,
    source: `${WSFU_SEEN}; ${P604_SEEN} (bathtub, balanced-pressure or thermostatic mixing valve)`,
  },
  {
    id: 'bidet-private',
    label: 'Bidet',
    occupancy: 'private',
    control: 'faucet',
    wsfu: [1.5, 1.5, 2.0],
    curve: 'flush-tank',
    psi: 20,
    gpm: 2,
    source: `${WSFU_SEEN}; ${P604_SEEN} (bidet, thermostatic mixing valve)`,
  },
  {
    id: 'combination-fixture-private',
    label: 'Combination fixture',
    occupancy: 'private',
    control: 'faucet',
    wsfu: [2.25, 2.25, 3.0],
    curve: 'flush-tank',
    psi: 8,
    gpm: 4,
    source: `${WSFU_SEEN}; ${P604_SEEN}`,
  },
  {
    id: 'dishwasher-private',
    label: 'Dishwasher, residential',
    occupancy: 'private',
    control: 'automatic',
    wsfu: [null, 1.4, 1.4],
    curve: 'flush-tank',
    psi: 8,
    gpm: 2.75,
    source: `${WSFU_SEEN}; ${P604_SEEN}`,
  },
  {
    id: 'drinking-fountain',
    label: 'Drinking fountain',
    occupancy: 'public',
    control: '3/8 in valve',
    wsfu: [0.25, null, 0.25],
    curve: 'flush-tank',
    psi: 8,
    gpm: 0.75,
    source: `${WSFU_SEEN} (offices etc.); ${P604_SEEN}`,
  },
  {
    id: 'kitchen-sink-private',
    label: 'Kitchen sink',
    occupancy: 'private',
    control: 'faucet',
    wsfu: [1.0, 1.0, 1.4],
    curve: 'flush-tank',
    psi: 8,
    gpm: 1.75,
    source: `${WSFU_SEEN}; ${P604_SEEN} (sink, residential)`,
  },
  {
    id: 'laundry-tray-private',
    label: 'Laundry tray (1–3)',
    occupancy: 'private',
    control: 'faucet',
    wsfu: [1.0, 1.0, 1.4],
    curve: 'flush-tank',
    psi: 8,
    gpm: 4,
    source: `${WSFU_SEEN}; ${P604_SEEN}`,
  },
  {
    id: 'lavatory-private',
    label: 'Lavatory',
    occupancy: 'private',
    control: 'faucet',
    wsfu: [0.5, 0.5, 0.7],
    curve: 'flush-tank',
    psi: 8,
    gpm: 0.8,
    source: `${WSFU_SEEN}; ${P604_SEEN}`,
  },
  {
    id: 'lavatory-public',
    label: 'Lavatory',
    occupancy: 'public',
    control: 'faucet',
    wsfu: [1.5, 1.5, 2.0],
    curve: 'flush-tank',
    psi: 8,
    gpm: 0.4,
    source: `${WSFU_SEEN}; ${P604_SEEN}`,
  },
  {
    id: 'service-sink',
    label: 'Service sink',
    occupancy: 'public',
    control: 'faucet',
    wsfu: [2.25, 2.25, 3.0],
    curve: 'flush-tank',
    psi: 8,
    gpm: 3,
    source: `${WSFU_SEEN} (offices etc.); ${P604_SEEN} (sink, service)`,
  },
  {
    id: 'shower-private',
    label: 'Shower head, pressure-balanced or thermostatic valve',
    occupancy: 'private',
    control: 'mixing valve',
    wsfu: [1.0, 1.0, 1.4],
    curve: 'flush-tank',
    psi: 20,
    gpm: 2.5,
    source: `${WSFU_MEM}; ${P604_SEEN} (shower, balanced-pressure or thermostatic)`,
    unverified: true,
  },
  {
    id: 'shower-public',
    label: 'Shower head, pressure-balanced or thermostatic valve',
    occupancy: 'public',
    control: 'mixing valve',
    wsfu: [3.0, 3.0, 4.0],
    curve: 'flush-tank',
    psi: 20,
    gpm: 2.5,
    source: `${WSFU_MEM}; ${P604_SEEN} (shower, balanced-pressure or thermostatic)`,
    unverified: true,
  },
  {
    id: 'urinal-flush-valve-public',
    label: 'Urinal, 3/4 in flush valve',
    occupancy: 'public',
    control: '3/4 in flush valve',
    wsfu: [5.0, null, 5.0],
    curve: 'flush-valve',
    psi: 25,
    gpm: 12,
    source: `${WSFU_MEM}; ${P604_UNDATED} (urinal, valve)`,
    unverified: true,
  },
  {
    id: 'urinal-flush-valve-1in-public',
    label: 'Urinal, 1 in flush valve',
    occupancy: 'public',
    control: '1 in flush valve',
    wsfu: [10.0, null, 10.0],
    curve: 'flush-valve',
    psi: 25,
    gpm: 12,
    source: `${WSFU_MEM}; ${P604_UNDATED} (urinal, valve)`,
    unverified: true,
  },
  {
    id: 'clothes-washer-private',
    label: 'Clothes washer (8 lb)',
    occupancy: 'private',
    control: 'automatic',
    wsfu: [1.0, 1.0, 1.4],
    curve: 'flush-tank',
    psi: 8,
    gpm: 4,
    source: `${WSFU_MEM}; flow: NSPC 10.14.2 sizing flow for a washer (4.0 gpm); pressure: CDA Copper Tube Handbook, at least 8 psi at each fixture (IPC Table 604.3 has no washer row)`,
    unverified: true,
  },
  {
    id: 'water-closet-flush-tank-private',
    label: 'Water closet, gravity tank (close coupled)',
    occupancy: 'private',
    control: 'flush tank',
    wsfu: [2.2, null, 2.2],
    curve: 'flush-tank',
    psi: 20,
    gpm: 3,
    source: `${WSFU_MEM}; ${P604_SEEN} (water closet, tank, close coupled)`,
    unverified: true,
  },
  {
    id: 'water-closet-flush-tank-public',
    label: 'Water closet, gravity tank (close coupled)',
    occupancy: 'public',
    control: 'flush tank',
    wsfu: [5.0, null, 5.0],
    curve: 'flush-tank',
    psi: 20,
    gpm: 3,
    source: `${WSFU_MEM}; ${P604_SEEN} (water closet, tank, close coupled)`,
    unverified: true,
  },
  {
    id: 'water-closet-flushometer-tank',
    label: 'Water closet, flushometer tank',
    occupancy: 'private',
    control: 'flushometer tank',
    wsfu: [2.0, null, 2.0],
    curve: 'flush-tank',
    psi: 20,
    gpm: 1.6,
    source: `${WSFU_MEM} (public or private); ${P604_SEEN} (water closet, flushometer tank)`,
    unverified: true,
  },
  {
    id: 'water-closet-flush-valve-private',
    label: 'Water closet, siphonic flushometer valve',
    occupancy: 'private',
    control: 'flushometer valve',
    wsfu: [6.0, null, 6.0],
    curve: 'flush-valve',
    psi: 35,
    gpm: 25,
    source: `${WSFU_MEM}; ${P604_UNDATED} (water closet, siphonic, flushometer valve)`,
    unverified: true,
  },
  {
    id: 'water-closet-flush-valve-public',
    label: 'Water closet, siphonic flushometer valve',
    occupancy: 'public',
    control: 'flushometer valve',
    wsfu: [10.0, null, 10.0],
    curve: 'flush-valve',
    psi: 35,
    gpm: 25,
    source: `${WSFU_MEM}; ${P604_UNDATED} (water closet, siphonic, flushometer valve)`,
    unverified: true,
  },
  {
    id: 'hose-bibb',
    label: 'Hose bibb / sillcock',
    occupancy: 'private',
    control: 'valve',
    wsfu: [2.5, null, 2.5],
    curve: 'flush-tank',
    psi: 8,
    gpm: 5,
    source:
      'WSFU: UPC 2018 Table 610.3 / A 103.1 hose bibb 2.5 (the IPC table rows seen have no hose bibb); flow and pressure: IPC 2018 Table 604.3 (sillcock, hose bibb)',
  },
];

export const FIXTURE_TYPES: Record<string, FixtureType> = Object.freeze(
  Object.fromEntries(
    ROWS.map((r) => {
      const entry: FixtureType = {
        id: r.id,
        label: r.label,
        occupancy: r.occupancy,
        control: r.control,
        wsfu: Object.freeze({ cold: r.wsfu[0], hot: r.wsfu[1], total: r.wsfu[2] }),
        demandCurve: r.curve,
        minFlowPressurePa: r.psi * PA_PER_PSI,
        flowRateM3s: r.gpm * M3S_PER_GPM,
        source: r.source,
        verified: r.unverified !== true,
      };
      return [r.id, Object.freeze(entry)];
    }),
  ),
);
