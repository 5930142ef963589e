/**
 * The registry of fitting types. Each entry carries the data of every method that publishes it,
 * and names the source of each datum in `sources`.
 * - PEX insert and PEX press fittings: a manufacturer's published equivalent lengths (VIEGA_PEX).
 * - Push-to-connect brass fittings for copper tube: NIST's measured loss of a 3/4 elbow and coupling
 *   (NIST_PUSH); no other size, and no push-fit tee, was published there, so none is listed.
 * - PEX cold-expansion elbows, tees and couplings: not listed. The one maker's manual that publishes
 *   them was retrieved only in part (its flow-through multiport tees), not its elbow, tee and
 *   coupling rows; no value is invented for them.
 * - Copper press-connect fittings: not listed; no published K or equivalent length was found.
 */
import { ENTRANCE_REENTRANT_K, ENTRANCE_SHARP_K, EXIT_K } from './expansion';
import { IPC_E103_3_5, IPC_E103_3_5_SOURCE, type EquivalentLengthRow } from './equivalentLength';
import { NOT_VERIFIED } from '../catalog/notVerified';
import { M_PER_FT } from '../units';

export type FittingTypeId = string;

export interface FittingTypeEntry {
  id: FittingTypeId;
  label: string;
  /** Crane TP-410 L/D multiple N in K = N·f_T. */
  craneN?: number;
  /** Size-dependent N (butterfly valves): the first band whose maxNominalIn ≥ size applies. */
  craneNBySize?: readonly { maxNominalIn: number; N: number }[];
  hooper?: { K1: number; Kinf: number };
  darby?: { K1: number; Ki: number; Kd: number };
  /** Equivalent length in ft by nominal size key ('1/2', '3/4', ...). */
  equivalentLengthFt?: EquivalentLengthRow;
  /** Constant K, used by every method (entrances, exits) or as the last fallback. */
  fixedK?: number;
  /**
   * A constant K published only at some sizes (a measured fitting), by nominal size key; used by every
   * method at those sizes, and no value at any other size (the analysis then names the fitting).
   */
  kBySize?: Readonly<Record<string, number>>;
  /** A published lowest K, with an equivalent length: the K used is never below it (named in the equivalent-length source line). */
  kFloor?: number;
  /** The Reynolds numbers a measured fitting was tested over; outside them fittingK says so (`outsideTestedRe`). */
  testedRe?: { min: number; max: number };
  /** One line per datum: which method, which table, which edition. A line that could not be checked
   * against the printed table says so (NOT_VERIFIED). */
  sources: string[];
  /**
   * The kind of pipe the fitting is made for, where it matters for a substitution: 'metal' for the
   * threaded or soldered elbows, tees and couplings whose data are metal-pipe tables; 'pex' for the
   * PEX lines. Valves, entrances and exits have none (they fit any pipe), and so have the
   * push-to-connect fittings, which are made for copper tube and for plastic pipe of copper tube size.
   */
  pipeFamily?: 'metal' | 'pex';
  /** false when any source line is not verified (see which in `sources`; fittingK reports it per method). */
  verified: boolean;
}

const CRANE_2009 = 'Crane Technical Paper No. 410 (2009), K = N·f_T';
const CRANE_LD_TABLE = 'Crane Technical Paper No. 410, L/D table of an earlier edition (web copy of the printed table)';
const CRANE_1976_TEE =
  'Crane Technical Paper No. 410 (1976), standard tee, as reprinted by permission in Ludwig, Applied Process Design for Chemical and Petrochemical Plants, Vol. 1, 3rd ed., Table 2-2; used here with the 2009 f_T row, which gives K about 0.02 (run) and 0.06 (branch) below the 1976 K';
const HOOPER = 'W. B. Hooper, Chemical Engineering 88(17), 96–100 (24 Aug 1981), two-K table';
const DARBY = 'R. Darby, Chemical Engineering 106(7) (1999) and Chemical Engineering Fluid Mechanics, 2nd ed. (2001), three-K table';

/**
 * PEX fittings, manufacturer data: Viega PEX Installation Manual (IM-PF 724596 0416), §10.2,
 * equivalent feet of SDR 9 PEX tubing — the "PEX Crimp" brass and PolyAlloy lines (an insert with a
 * crimp ring) and the "PEX Press" bronze and polymer lines. The insert lines' smallest-size row has
 * lost its size label in the copy read, so it is left out (and the polymer line's tee columns are
 * N/A there anyway). The manual does not name the ASTM fitting standard of each line, so none is
 * claimed here. Used as "this many feet of the segment's pipe", under every fitting method.
 * Cold-expansion rows were not retrieved from any source and copper press-connect losses were not
 * found anywhere, so neither is listed: no value is invented for them.
 */
const VIEGA_PEX = "Viega PEX Installation Manual (IM-PF 724596 0416) §10.2, equivalent feet of SDR 9 PEX tubing — manufacturer data, one maker's fittings";

interface PexLine {
  /** The fitting line, in Headroom's words. */
  label: string;
  /** The line as the manufacturer's table names it (for the source line). */
  line: string;
  sizes: string;
  elbow: Record<string, number>;
  teeRun: Record<string, number>;
  teeBranch: Record<string, number>;
  coupling: Record<string, number>;
}

/** Keyed by the id stem: `pex-<stem>-<kind>`. Values: the manual's §10.2 table, ft. */
export const PEX_FITTING_LINES: Readonly<Record<string, PexLine>> = {
  'insert-brass': {
    label: 'PEX insert fitting (brass, crimp ring)',
    line: 'PEX Crimp, brass',
    sizes: '1/2–1 in',
    coupling: { '1/2': 2.0, '3/4': 0.6, '1': 1.3 },
    elbow: { '1/2': 9.4, '3/4': 9.4, '1': 10.0 },
    teeRun: { '1/2': 2.2, '3/4': 1.9, '1': 2.3 },
    teeBranch: { '1/2': 10.4, '3/4': 8.9, '1': 11.0 },
  },
  'insert-polymer': {
    label: 'PEX insert fitting (polymer, crimp ring)',
    line: 'PEX Crimp, PolyAlloy',
    sizes: '1/2–1 in',
    coupling: { '1/2': 7.1, '3/4': 4.8, '1': 4.5 },
    elbow: { '1/2': 16.5, '3/4': 17.4, '1': 18.0 },
    teeRun: { '1/2': 7.2, '3/4': 6.6, '1': 6.0 },
    teeBranch: { '1/2': 17.9, '3/4': 17.7, '1': 17.0 },
  },
  'press-bronze': {
    label: 'PEX press fitting (bronze)',
    line: 'PEX Press, bronze',
    sizes: '1/2–2 in',
    coupling: { '1/2': 2.0, '3/4': 1.0, '1': 1.0, '1-1/4': 2.0, '1-1/2': 2.0, '2': 1.0 },
    elbow: { '1/2': 9.4, '3/4': 8.0, '1': 10.0, '1-1/4': 11.0, '1-1/2': 13.0, '2': 19.0 },
    teeRun: { '1/2': 2.2, '3/4': 1.0, '1': 2.0, '1-1/4': 2.0, '1-1/2': 2.0, '2': 2.0 },
    teeBranch: { '1/2': 10.4, '3/4': 9.0, '1': 10.0, '1-1/4': 11.0, '1-1/2': 12.0, '2': 18.0 },
  },
  'press-polymer': {
    label: 'PEX press fitting (polymer)',
    line: 'PEX Press, polymer',
    sizes: '1/2–2 in',
    coupling: { '1/2': 2.6, '3/4': 2.5, '1': 3.1, '1-1/4': 4.0, '1-1/2': 5.2, '2': 8.9 },
    elbow: { '1/2': 12.6, '3/4': 18.9, '1': 17.7, '1-1/4': 18.6, '1-1/2': 29.4, '2': 36.4 },
    teeRun: { '1/2': 3.9, '3/4': 3.6, '1': 3.8, '1-1/4': 6.4, '1-1/2': 7.9, '2': 10.2 },
    teeBranch: { '1/2': 14.0, '3/4': 19.1, '1': 18.4, '1-1/4': 18.7, '1-1/2': 28.3, '2': 37.5 },
  },
};

function pexEntries(): Record<FittingTypeId, Omit<FittingTypeEntry, 'verified'>> {
  const out: Record<FittingTypeId, Omit<FittingTypeEntry, 'verified'>> = {};
  for (const [stem, row] of Object.entries(PEX_FITTING_LINES)) {
    const kinds = [
      ['elbow-90', 'elbow, 90°', row.elbow, 'elbow'],
      ['tee-run', 'tee, flow through run', row.teeRun, 'tee run'],
      ['tee-branch', 'tee, flow through branch', row.teeBranch, 'tee branch'],
      ['coupling', 'coupling', row.coupling, 'coupling'],
    ] as const;
    for (const [suffix, what, lengths, column] of kinds) {
      const id = `pex-${stem}-${suffix}`;
      out[id] = {
        id,
        label: `${row.label}, ${what}`,
        equivalentLengthFt: Object.freeze({ ...lengths }),
        pipeFamily: 'pex',
        sources: [`equivalent-length: ${row.line}, ${column} column, ${row.sizes}, ${VIEGA_PEX}`],
      };
    }
  }
  return out;
}

/**
 * Push-to-connect fittings, measured data: L. Lin, N. Milesi-Ferretti, G. Glaeser, K. Y. Kim,
 * "Measurement and Uncertainty Analysis of Pressure Losses in Push-to-Connect Elbows and Couplings",
 * NIST (abstract read at https://www.nist.gov/node/1887021). One commercially available lead-free
 * brass elbow and one coupling, push-to-connect, "for use with copper or plastic pipe", nominal tube
 * size 3/4, water at Re from about 10^4 to 10^5:
 * - elbow: K falls as Re rises and levels off at 1.0 above Re 40 000 (the correlation below that is in
 *   the paper, not in the abstract read); its equivalent length is 0.8 to 1.1 m over the tested range.
 *   Listed as an equivalent length of 1.1 m, the upper end of that published range, used as that
 *   many metres of the segment's pipe (K = f·L/D, as a manufacturer's equivalent length is), with
 *   the published plateau K = 1.0 as its floor (K only falls towards it as Re rises): neither
 *   published bound is undercut. At Re 10^5 in 3/4 type L copper the length alone gives K ≈ 1.0.
 * - coupling: K = 0.007, independent of Re (the published average); equivalent length 4.5 to 7.5 mm.
 * Only 3/4 was tested, so no other size is listed; no push-fit tee was tested, so none is listed.
 */
const NIST_PUSH =
  'L. Lin, N. Milesi-Ferretti, G. Glaeser, K. Y. Kim, "Measurement and Uncertainty Analysis of Pressure Losses in Push-to-Connect Elbows and Couplings", National Institute of Standards and Technology publication (abstract): lead-free brass push-to-connect fittings for copper or plastic pipe, 3/4 NTS, Re ≈ 10^4–10^5 — measured data, one elbow and one coupling';

interface PushLine {
  /** The fitting line, in Headroom's words. */
  label: string;
  sizes: string;
  /** Equivalent length of the 90° elbow, m, by nominal size key. */
  elbowEquivalentLengthM: Record<string, number>;
  /** The elbow's lowest K (its plateau at high Re). */
  elbowKFloor: number;
  /** K of the coupling by nominal size key. */
  couplingK: Record<string, number>;
  /** The Reynolds numbers of the tests. */
  testedRe: { min: number; max: number };
}

/** Keyed by the id stem: `<stem>-elbow-90`, `<stem>-coupling`. Values: NIST_PUSH, as above. */
export const PUSH_FITTING_LINES: Readonly<Record<string, PushLine>> = {
  'push-brass': {
    label: 'Push-to-connect fitting (lead-free brass)',
    sizes: '3/4 in (the size tested)',
    elbowEquivalentLengthM: { '3/4': 1.1 },
    elbowKFloor: 1.0,
    couplingK: { '3/4': 0.007 },
    testedRe: { min: 1e4, max: 1e5 },
  },
};

/** '1.1 m at 3/4 in' — a value per size, as the source lines print them. */
const bySize = (values: Record<string, number>, unit: string): string =>
  Object.entries(values)
    .map(([key, v]) => `${v}${unit} at ${key} in`)
    .join(', ');

function pushEntries(): Record<FittingTypeId, Omit<FittingTypeEntry, 'verified'>> {
  const out: Record<FittingTypeId, Omit<FittingTypeEntry, 'verified'>> = {};
  for (const [stem, row] of Object.entries(PUSH_FITTING_LINES)) {
    const elbow = `${stem}-elbow-90`;
    out[elbow] = {
      id: elbow,
      label: `${row.label}, elbow, 90°`,
      equivalentLengthFt: Object.freeze(Object.fromEntries(Object.entries(row.elbowEquivalentLengthM).map(([k, m]) => [k, m / M_PER_FT]))),
      kFloor: row.elbowKFloor,
      testedRe: row.testedRe,
      sources: [
        `equivalent-length: elbow, ${bySize(row.elbowEquivalentLengthM, ' m')} (the upper end of the published 0.8–1.1 m), used as metres of the segment's pipe, and K never below ${row.elbowKFloor} (the published level above Re 40 000), ${NIST_PUSH}`,
      ],
    };
    const coupling = `${stem}-coupling`;
    out[coupling] = {
      id: coupling,
      label: `${row.label}, coupling`,
      kBySize: Object.freeze({ ...row.couplingK }),
      testedRe: row.testedRe,
      sources: [`fixed K by size: coupling, ${bySize(row.couplingK, '')} (independent of Re, the published average), ${NIST_PUSH}`],
    };
  }
  return out;
}

const ENTRIES: Record<FittingTypeId, FittingTypeEntry> = withVerified({
  'elbow-90-standard': {
    id: 'elbow-90-standard',
    pipeFamily: 'metal',
    label: 'Elbow, 90°, standard',
    craneN: 30,
    hooper: { K1: 800, Kinf: 0.4 },
    darby: { K1: 800, Ki: 0.14, Kd: 4.0 },
    equivalentLengthFt: IPC_E103_3_5.elbow90Standard,
    sources: [
      `crane: N = 30, standard 90° elbow, ${CRANE_2009}`,
      `hooper-2k: elbow 90° standard (R/D 1), screwed, ${HOOPER}`,
      `darby-3k: elbow 90° threaded standard (r/D 1), ${DARBY}`,
      `equivalent-length: 90° standard elbow row, ${IPC_E103_3_5_SOURCE}`,
    ],
  },
  'elbow-90-long-radius': {
    id: 'elbow-90-long-radius',
    pipeFamily: 'metal',
    label: 'Elbow, 90°, long radius',
    craneN: 20,
    hooper: { K1: 800, Kinf: 0.2 },
    darby: { K1: 800, Ki: 0.071, Kd: 4.2 },
    sources: [
      `crane: N = 20, ${CRANE_LD_TABLE}`,
      `hooper-2k: elbow 90° long radius (R/D 1.5), all types, ${HOOPER}`,
      `darby-3k: elbow 90° threaded long radius (r/D 1.5), ${DARBY}`,
    ],
  },
  'elbow-45-standard': {
    id: 'elbow-45-standard',
    pipeFamily: 'metal',
    label: 'Elbow, 45°, standard',
    craneN: 16,
    hooper: { K1: 500, Kinf: 0.2 },
    darby: { K1: 500, Ki: 0.071, Kd: 4.2 },
    equivalentLengthFt: IPC_E103_3_5.elbow45Standard,
    sources: [
      `crane: N = 16, standard 45° elbow, ${CRANE_2009}`,
      `hooper-2k: elbow 45° standard, all types, ${HOOPER}`,
      `darby-3k: elbow 45° threaded standard, ${DARBY}`,
      `equivalent-length: 45° standard elbow row, ${IPC_E103_3_5_SOURCE}`,
    ],
  },
  'tee-run': {
    id: 'tee-run',
    pipeFamily: 'metal',
    label: 'Tee, flow through run',
    craneN: 20,
    hooper: { K1: 200, Kinf: 0.1 },
    darby: { K1: 200, Ki: 0.091, Kd: 4.0 },
    equivalentLengthFt: IPC_E103_3_5.couplingOrTeeRun,
    sources: [
      `crane: N = 20, flow through run, ${CRANE_1976_TEE}`,
      `hooper-2k: tee, run through, screwed, ${HOOPER}`,
      `darby-3k: tee run-through, threaded, ${DARBY}`,
      `equivalent-length: coupling or tee run row, ${IPC_E103_3_5_SOURCE}`,
    ],
  },
  'tee-branch': {
    id: 'tee-branch',
    pipeFamily: 'metal',
    label: 'Tee, flow through branch',
    craneN: 60,
    hooper: { K1: 500, Kinf: 0.7 },
    darby: { K1: 500, Ki: 0.274, Kd: 4.0 },
    equivalentLengthFt: IPC_E103_3_5.teeBranch,
    sources: [
      `crane: N = 60, flow through branch, ${CRANE_1976_TEE}`,
      `hooper-2k: tee used as elbow, standard, screwed, ${HOOPER}`,
      `darby-3k: tee through branch (as elbow), threaded r/D 1, ${DARBY}`,
      `equivalent-length: standard tee 90° (branch) row, ${IPC_E103_3_5_SOURCE}`,
    ],
  },
  'valve-gate': {
    id: 'valve-gate',
    label: 'Gate valve, full bore, open',
    craneN: 8,
    hooper: { K1: 300, Kinf: 0.1 },
    darby: { K1: 300, Ki: 0.037, Kd: 3.9 },
    equivalentLengthFt: IPC_E103_3_5.gateValve,
    sources: [
      `crane: N = 8 (gate valve, β = 1), ${CRANE_2009}`,
      `hooper-2k: gate valve, full line size (β = 1), ${HOOPER}`,
      `darby-3k: gate valve (β = 1), ${DARBY}`,
      `equivalent-length: gate valve row, ${IPC_E103_3_5_SOURCE}`,
    ],
  },
  'valve-ball-full-port': {
    id: 'valve-ball-full-port',
    label: 'Ball valve, full port, open',
    craneN: 3,
    darby: { K1: 300, Ki: 0.017, Kd: 3.5 },
    sources: [`crane: N = 3 (ball valve, full bore), ${CRANE_2009}`, `darby-3k: ball valve (β = 1), ${DARBY}`],
  },
  'valve-ball-reduced-port': {
    id: 'valve-ball-reduced-port',
    label: 'Ball valve, reduced port (β ≈ 0.9), open',
    hooper: { K1: 500, Kinf: 0.15 },
    sources: [
      `hooper-2k: ball valve, reduced trim (β = 0.9), ${HOOPER}`,
      'crane: not tabulated as a constant N (Crane gives a formula in β and port angle); falls back to hooper-2k',
    ],
  },
  'valve-globe': {
    id: 'valve-globe',
    label: 'Globe valve, open',
    craneN: 340,
    hooper: { K1: 1500, Kinf: 4.0 },
    darby: { K1: 1500, Ki: 1.7, Kd: 3.6 },
    equivalentLengthFt: IPC_E103_3_5.globeValve,
    sources: [
      `crane: N = 340 (globe valve, full seat), ${CRANE_2009}`,
      `hooper-2k: globe valve, standard, ${HOOPER}`,
      `darby-3k: globe valve (β = 1), ${DARBY}`,
      `equivalent-length: globe valve row, ${IPC_E103_3_5_SOURCE}`,
    ],
  },
  'valve-check-swing': {
    id: 'valve-check-swing',
    label: 'Swing check valve',
    craneN: 100,
    hooper: { K1: 1500, Kinf: 1.5 },
    darby: { K1: 1500, Ki: 0.46, Kd: 4.0 },
    equivalentLengthFt: IPC_E103_3_5.swingCheckValve,
    sources: [
      `crane: N = 100 (swing check, angled seat; 50 for a straight seat), ${CRANE_2009}`,
      `hooper-2k: check valve, swing, ${HOOPER}`,
      `darby-3k: swing check valve, ${DARBY}`,
      `equivalent-length: swing check valve row, ${IPC_E103_3_5_SOURCE}`,
    ],
  },
  'valve-check-lift': {
    id: 'valve-check-lift',
    label: 'Lift check valve',
    craneN: 600,
    hooper: { K1: 2000, Kinf: 10.0 },
    darby: { K1: 2000, Ki: 2.85, Kd: 3.8 },
    sources: [
      `crane: N = 600 (lift check, straight pattern; 55 angled), ${CRANE_2009}`,
      `hooper-2k: check valve, lift, ${HOOPER}`,
      `darby-3k: lift check valve, ${DARBY}`,
    ],
  },
  'valve-angle': {
    id: 'valve-angle',
    label: 'Angle valve, open',
    craneN: 55,
    hooper: { K1: 1000, Kinf: 2.0 },
    darby: { K1: 1000, Ki: 0.69, Kd: 4.0 },
    equivalentLengthFt: IPC_E103_3_5.angleValve,
    sources: [
      `crane: N = 55 (angle valve, styles 0 and 2; 150 for style 1), ${CRANE_2009}`,
      `hooper-2k: globe valve, angle or Y-type, ${HOOPER}`,
      `darby-3k: angle valve 90° (β = 1), ${DARBY}`,
      `equivalent-length: angle valve row, ${IPC_E103_3_5_SOURCE}`,
    ],
  },
  'valve-butterfly': {
    id: 'valve-butterfly',
    label: 'Butterfly valve, centric, open',
    craneN: 45,
    craneNBySize: [
      { maxNominalIn: 8, N: 45 },
      { maxNominalIn: 14, N: 35 },
      { maxNominalIn: 24, N: 25 },
    ],
    hooper: { K1: 800, Kinf: 0.25 },
    sources: [
      `crane: N = 45 (2–8 in), 35 (10–14 in), 25 (16–24 in), centric butterfly valve, ${CRANE_2009}; below 2 in the 2–8 in value is used`,
      `hooper-2k: butterfly valve, ${HOOPER}`,
    ],
  },
  coupling: {
    id: 'coupling',
    pipeFamily: 'metal',
    label: 'Coupling',
    fixedK: 0.04,
    equivalentLengthFt: IPC_E103_3_5.couplingOrTeeRun,
    sources: [
      "fixed K = 0.04: Silla, Chemical Process Engineering: Design and Economics (2003), Fig. 8.17; the same value in Perry's Chemical Engineers' Handbook's table of typical K after Lapple",
      `equivalent-length: coupling or tee run row, ${IPC_E103_3_5_SOURCE}`,
    ],
  },
  'entrance-sharp': {
    id: 'entrance-sharp',
    label: 'Entrance, sharp-edged (flush)',
    fixedK: ENTRANCE_SHARP_K,
    sources: [
      'fixed K = 0.5: Crane Technical Paper No. 410 (2009); Idelchik, Handbook of Hydraulic Resistance, 4th ed.; Blevins, Applied Fluid Dynamics Handbook (1984)',
    ],
  },
  'entrance-reentrant': {
    id: 'entrance-reentrant',
    label: 'Entrance, inward projecting',
    fixedK: ENTRANCE_REENTRANT_K,
    sources: ['fixed K = 0.78: inward-projecting entrance, Crane Technical Paper No. 410 (2009)'],
  },
  ...pexEntries(),
  ...pushEntries(),
  exit: {
    id: 'exit',
    label: 'Exit into a vessel',
    fixedK: EXIT_K,
    sources: ['fixed K = 1.0: common practice (the whole velocity head is lost at an exit into a vessel)'],
  },
});

/** Sets each entry's `verified` from its source lines (one rule, no hand-kept flag to drift). */
function withVerified(entries: Record<FittingTypeId, Omit<FittingTypeEntry, 'verified'>>): Record<FittingTypeId, FittingTypeEntry> {
  return Object.fromEntries(Object.entries(entries).map(([id, e]) => [id, { ...e, verified: e.sources.every((line) => !line.includes(NOT_VERIFIED)) }]));
}

for (const entry of Object.values(ENTRIES)) {
  Object.freeze(entry.sources);
  if (entry.testedRe) Object.freeze(entry.testedRe);
  Object.freeze(entry);
}

export const FITTING_TYPES: Readonly<Record<FittingTypeId, FittingTypeEntry>> = Object.freeze(ENTRIES);
