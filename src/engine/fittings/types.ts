/**
 * The registry of fitting types. Each entry carries the data of every method that publishes it,
 * and names the source of each datum in `sources`. Press-connect and push-fit fittings are not in
 * any published table available here, so they are not listed (no K is invented for them).
 */
import { ENTRANCE_REENTRANT_K, ENTRANCE_SHARP_K, EXIT_K } from './expansion';
import { IPC_E103_3_5, IPC_E103_3_5_SOURCE, type EquivalentLengthRow } from './equivalentLength';

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
  /** One line per datum: which method, which table, which edition. */
  sources: string[];
  memo?: 'from memory';
}

const CRANE_2009 = 'Crane TP-410 (2009), K = N·f_T, as transcribed in CalebBell/fluids 1.3.1 fittings.py';
const CRANE_LD_TABLE = 'Crane TP-410 L/D table (older edition), as reproduced on scribd doc 24752539';
const HOOPER = 'Hooper, Chem. Eng. 88(17), 96–100 (1981), two-K table, as transcribed in CalebBell/fluids 1.3.1 `Hooper`';
const DARBY = 'Darby, Chem. Eng. 106(7) (1999) / Chemical Engineering Fluid Mechanics 2nd ed. (2001), three-K table, as transcribed in CalebBell/fluids 1.3.1 `Darby`';

const ENTRIES: Record<FittingTypeId, FittingTypeEntry> = {
  'elbow-90-standard': {
    id: 'elbow-90-standard',
    label: 'Elbow, 90°, standard',
    craneN: 30,
    hooper: { K1: 800, Kinf: 0.4 },
    darby: { K1: 800, Ki: 0.14, Kd: 4.0 },
    equivalentLengthFt: IPC_E103_3_5.elbow90Standard,
    sources: [
      `crane: N = 30, ${CRANE_2009} (crane_standard_bend_losses)`,
      `hooper-2k: elbow 90° standard (R/D 1), screwed, ${HOOPER}`,
      `darby-3k: elbow 90° threaded standard (r/D 1), ${DARBY}`,
      `equivalent-length: 90° standard elbow row, ${IPC_E103_3_5_SOURCE}`,
    ],
  },
  'elbow-90-long-radius': {
    id: 'elbow-90-long-radius',
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
    label: 'Elbow, 45°, standard',
    craneN: 16,
    hooper: { K1: 500, Kinf: 0.2 },
    darby: { K1: 500, Ki: 0.071, Kd: 4.2 },
    equivalentLengthFt: IPC_E103_3_5.elbow45Standard,
    sources: [
      `crane: N = 16, ${CRANE_2009} (crane_standard_bend_losses)`,
      `hooper-2k: elbow 45° standard, all types, ${HOOPER}`,
      `darby-3k: elbow 45° threaded standard, ${DARBY}`,
      `equivalent-length: 45° standard elbow row, ${IPC_E103_3_5_SOURCE}`,
    ],
  },
  'tee-run': {
    id: 'tee-run',
    label: 'Tee, flow through run',
    craneN: 20,
    hooper: { K1: 200, Kinf: 0.1 },
    darby: { K1: 200, Ki: 0.091, Kd: 4.0 },
    equivalentLengthFt: IPC_E103_3_5.couplingOrTeeRun,
    sources: [
      'crane: N = 20, standard tee flow through run, older Crane TP-410 editions — from memory',
      `hooper-2k: tee, run through, screwed, ${HOOPER}`,
      `darby-3k: tee run-through, threaded, ${DARBY}`,
      `equivalent-length: coupling or tee run row, ${IPC_E103_3_5_SOURCE}`,
    ],
    memo: 'from memory',
  },
  'tee-branch': {
    id: 'tee-branch',
    label: 'Tee, flow through branch',
    craneN: 60,
    hooper: { K1: 500, Kinf: 0.7 },
    darby: { K1: 500, Ki: 0.274, Kd: 4.0 },
    equivalentLengthFt: IPC_E103_3_5.teeBranch,
    sources: [
      'crane: N = 60, standard tee flow through branch, older Crane TP-410 editions — from memory',
      `hooper-2k: tee used as elbow, standard, screwed, ${HOOPER}`,
      `darby-3k: tee through branch (as elbow), threaded r/D 1, ${DARBY}`,
      `equivalent-length: standard tee 90° (branch) row, ${IPC_E103_3_5_SOURCE}`,
    ],
    memo: 'from memory',
  },
  'valve-gate': {
    id: 'valve-gate',
    label: 'Gate valve, full bore, open',
    craneN: 8,
    hooper: { K1: 300, Kinf: 0.1 },
    darby: { K1: 300, Ki: 0.037, Kd: 3.9 },
    equivalentLengthFt: IPC_E103_3_5.gateValve,
    sources: [
      `crane: N = 8 (β = 1), ${CRANE_2009} (K_gate_valve_Crane)`,
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
    sources: [
      `crane: N = 3 (full bore), ${CRANE_2009} (K_ball_valve_Crane)`,
      `darby-3k: ball valve (β = 1), ${DARBY}`,
    ],
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
      `crane: N = 340 (full seat), ${CRANE_2009} (K_globe_valve_Crane)`,
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
      `crane: N = 100 (angled seat; 50 for a straight seat), ${CRANE_2009} (K_swing_check_valve_Crane)`,
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
      `crane: N = 600 (straight pattern; 55 angled), ${CRANE_2009} (K_lift_check_valve_Crane)`,
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
      `crane: N = 55 (styles 0 and 2; 150 for style 1), ${CRANE_2009} (K_angle_valve_Crane)`,
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
      `crane: N = 45 (2–8 in), 35 (10–14 in), 25 (16–24 in), centric, ${CRANE_2009} (butterfly_valve_Crane_coeffs); below 2 in the 2–8 in value is used`,
      `hooper-2k: butterfly valve, ${HOOPER}`,
    ],
  },
  coupling: {
    id: 'coupling',
    label: 'Coupling',
    fixedK: 0.04,
    equivalentLengthFt: IPC_E103_3_5.couplingOrTeeRun,
    sources: [
      "fixed K = 0.04: Perry's Chemical Engineers' Handbook, table of typical K after Lapple (table number from memory), as reproduced on a web copy",
      `equivalent-length: coupling or tee run row, ${IPC_E103_3_5_SOURCE}`,
    ],
  },
  'entrance-sharp': {
    id: 'entrance-sharp',
    label: 'Entrance, sharp-edged (flush)',
    fixedK: ENTRANCE_SHARP_K,
    sources: ['fixed K = 0.5: Crane TP-410 (2009); Idelchik 4th ed.; Blevins (1984) — via CalebBell/fluids 1.3.1 entrance_sharp'],
  },
  'entrance-reentrant': {
    id: 'entrance-reentrant',
    label: 'Entrance, inward projecting',
    fixedK: ENTRANCE_REENTRANT_K,
    sources: ['fixed K = 0.78: Crane TP-410 (2009), via CalebBell/fluids 1.3.1 entrance_distance(method="Crane")'],
  },
  exit: {
    id: 'exit',
    label: 'Exit into a vessel',
    fixedK: EXIT_K,
    sources: ['fixed K = 1.0: common practice (whole velocity head lost); CalebBell/fluids 1.3.1 exit_normal'],
  },
};

for (const entry of Object.values(ENTRIES)) {
  Object.freeze(entry.sources);
  Object.freeze(entry);
}

export const FITTING_TYPES: Readonly<Record<FittingTypeId, FittingTypeEntry>> = Object.freeze(ENTRIES);
