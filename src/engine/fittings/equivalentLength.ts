/**
 * Equivalent lengths of fittings and valves in feet of pipe, by nominal size key, as plumbing codes
 * tabulate them.
 *
 * IPC Table E103.3(5) / UPC Table A 104.4(1), "Allowance in equivalent length of pipe for friction
 * loss in valves and threaded fittings" (galvanized steel). NOT VERIFIED: the UPC table's heading
 * was read but its body was not; the IPC table number is unconfirmed; the rows agree with a CIDWT (2008)
 * irrigation table seen on a web page that is not cited, re-aligned by one column. The angle-valve row
 * has no seen source at all. Every use says so (NOT_VERIFIED in the source line).
 */
import { NOT_VERIFIED } from '../catalog/notVerified';

export type EquivalentLengthRow = Readonly<Record<string, number>>;

const SIZES = ['3/8', '1/2', '3/4', '1', '1-1/4', '1-1/2', '2', '2-1/2', '3', '4', '5', '6'] as const;

function row(values: readonly number[]): EquivalentLengthRow {
  const out: Record<string, number> = {};
  SIZES.forEach((size, i) => {
    out[size] = values[i];
  });
  return Object.freeze(out);
}

export const IPC_E103_3_5_SOURCE = `plumbing-code allowance in equivalent length of pipe for threaded (galvanized steel) fittings, ft (IPC Appendix E / UPC Table A 104.4(1)), ${NOT_VERIFIED}`;

export const IPC_E103_3_5 = {
  elbow90Standard: row([1.0, 2.0, 2.5, 3.0, 4.0, 5.0, 7.0, 8.0, 10, 14, 17, 20]),
  elbow45Standard: row([0.6, 1.2, 1.5, 1.8, 2.4, 3.0, 4.0, 5.0, 6.0, 8.0, 10, 12]),
  teeBranch: row([1.5, 3.0, 4.0, 5.0, 6.0, 7.0, 10, 12, 15, 21, 25, 30]),
  couplingOrTeeRun: row([0.3, 0.6, 0.8, 0.9, 1.2, 1.5, 2.0, 2.5, 3.0, 4.0, 5.0, 6.0]),
  gateValve: row([0.2, 0.4, 0.5, 0.6, 0.8, 1.0, 1.3, 1.6, 2.0, 2.7, 3.3, 4.0]),
  globeValve: row([8, 15, 20, 25, 35, 45, 55, 65, 80, 125, 140, 165]),
  angleValve: row([4, 8, 12, 15, 18, 22, 28, 34, 40, 55, 70, 80]),
  swingCheckValve: row([3, 5, 7, 8, 11, 14, 19, 22, 27, 38, 46, 54]),
} as const;
