/**
 * IPC Table E103.3(3), "Table for estimating demand": water supply fixture units → demand (gpm),
 * for systems predominantly with flush tanks and with flushometer valves (Hunter's curves).
 *
 * Source status: the rows flagged `seen` were read in a copy of the table (flush tanks: 1, 2, 4, 8,
 * 12, 15, 30, 50 wsfu; flush valves: 5, 7, 10, 15, 20, 30, 50 wsfu); the other rows could not be
 * checked against a printed copy and are flagged unverified. The flush-tank column from 60 to 300 wsfu
 * and at 400, 750 and 1000 wsfu equals the Illinois Plumbing Code's Hunter-curve table (77 Ill. Adm.
 * Code 890, Appendix A, Table N), a state table on the same curve — support, not proof, of those rows.
 * The ft³/min column of the code table is omitted.
 */
import { NOT_VERIFIED } from '../catalog/notVerified';

export interface HunterTableRow {
  wsfu: number;
  flushTankGpm: number;
  /** null where the code table has no flush-valve entry (below 5 wsfu). */
  flushValveGpm: number | null;
  flushTankSeen: boolean;
  flushValveSeen: boolean;
}

export const HUNTER_TABLE_IPC_SOURCE = `IPC Table E103.3(3) (2018), table for estimating demand; rows other than flush tank 1–50 wsfu (8 rows) and flush valve 5–50 wsfu (7 rows) ${NOT_VERIFIED}`;

/** false: most rows of the table could not be checked against a printed copy. */
export const HUNTER_TABLE_IPC_VERIFIED = false;

const SEEN_TANK = new Set([1, 2, 4, 8, 12, 15, 30, 50]);
const SEEN_VALVE = new Set([5, 7, 10, 15, 20, 30, 50]);

const RAW: readonly (readonly [number, number, number | null])[] = [
  [1, 3.0, null],
  [2, 5.0, null],
  [3, 6.5, null],
  [4, 8.0, null],
  [5, 9.4, 15.0],
  [6, 10.7, 17.4],
  [7, 11.8, 19.8],
  [8, 12.8, 22.2],
  [9, 13.7, 24.6],
  [10, 14.6, 27.0],
  [11, 15.4, 27.8],
  [12, 16.0, 28.6],
  [13, 16.5, 29.4],
  [14, 17.0, 30.2],
  [15, 17.5, 31.0],
  [16, 18.0, 31.8],
  [17, 18.4, 32.6],
  [18, 18.8, 33.4],
  [19, 19.2, 34.2],
  [20, 19.6, 35.0],
  [25, 21.5, 38.0],
  [30, 23.3, 42.0],
  [35, 24.9, 44.0],
  [40, 26.3, 46.0],
  [45, 27.7, 48.0],
  [50, 29.1, 50.0],
  [60, 32.0, 54.0],
  [70, 35.0, 58.0],
  [80, 38.0, 61.2],
  [90, 41.0, 64.3],
  [100, 43.5, 67.5],
  [120, 48.0, 73.0],
  [140, 52.5, 77.0],
  [160, 57.0, 81.0],
  [180, 61.0, 85.5],
  [200, 65.0, 90.0],
  [225, 70.0, 95.5],
  [250, 75.0, 101.0],
  [275, 80.0, 104.5],
  [300, 85.0, 108.0],
  [400, 105.0, 127.0],
  [500, 124.0, 143.0],
  [750, 170.0, 177.0],
  [1000, 208.0, 208.0],
  [1250, 239.0, 239.0],
  [1500, 269.0, 269.0],
  [1750, 297.0, 297.0],
  [2000, 325.0, 325.0],
  [2500, 380.0, 380.0],
  [3000, 433.0, 433.0],
  [4000, 525.0, 525.0],
  [5000, 593.0, 593.0],
];

export const HUNTER_TABLE_IPC: readonly HunterTableRow[] = Object.freeze(
  RAW.map(([wsfu, flushTankGpm, flushValveGpm]) =>
    Object.freeze({
      wsfu,
      flushTankGpm,
      flushValveGpm,
      flushTankSeen: SEEN_TANK.has(wsfu),
      flushValveSeen: flushValveGpm !== null && SEEN_VALVE.has(wsfu),
    }),
  ),
);
