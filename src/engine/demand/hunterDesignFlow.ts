import { requireNonNegative } from '../guards';
import { M3S_PER_GPM } from '../units';
import { HUNTER_TABLE_IPC } from './hunterTable';

export type DemandCurve = 'flush-tank' | 'flush-valve';

export interface HunterDesignFlowGpm {
  gpm: number;
  /** True when wsfu lies outside the rows of the curve (see hunterDesignFlowGpm). */
  extrapolated: boolean;
}

type CurvePoints = readonly (readonly [number, number])[];

/** The two columns of the table as (wsfu, gpm) points, built once (immutable). */
const FLUSH_TANK_POINTS: CurvePoints = Object.freeze(HUNTER_TABLE_IPC.map((r) => Object.freeze([r.wsfu, r.flushTankGpm] as const)));
const FLUSH_VALVE_POINTS: CurvePoints = Object.freeze(
  HUNTER_TABLE_IPC.filter((r) => r.flushValveGpm !== null).map((r) => Object.freeze([r.wsfu, r.flushValveGpm as number] as const)),
);

function curvePoints(curve: DemandCurve): CurvePoints {
  if (curve === 'flush-tank') return FLUSH_TANK_POINTS;
  if (curve === 'flush-valve') return FLUSH_VALVE_POINTS;
  throw new RangeError(`hunterDesignFlowGpm: unknown demand curve ${String(curve)}`);
}

/**
 * Design flow (gpm) for a load in water supply fixture units, read from IPC Table E103.3(3) by
 * linear interpolation between rows, as the code table is read (IPC E103.3 step 3).
 *
 * Outside the rows (documented choices, flagged `extrapolated`):
 * - wsfu = 0 → 0 gpm (no load), not flagged;
 * - 0 < wsfu < first row (1 wsfu for flush tanks, 5 for flush valves) → the first row's flow is held
 *   (conservative: one fixture in use draws the first row's flow whatever its weight);
 * - wsfu > 5000 → straight line through the last two rows.
 *
 * @param wsfu total water supply fixture units downstream (≥ 0)
 * @param curve 'flush-tank' or 'flush-valve' column
 */
export function hunterDesignFlowGpm(wsfu: number, curve: DemandCurve): HunterDesignFlowGpm {
  requireNonNegative('hunterDesignFlowGpm', 'wsfu', wsfu);
  const pts = curvePoints(curve);
  if (wsfu === 0) return { gpm: 0, extrapolated: false };
  const [w0, q0] = pts[0];
  if (wsfu < w0) return { gpm: q0, extrapolated: true };
  for (let i = 1; i < pts.length; i++) {
    const [w1, q1] = pts[i];
    if (wsfu <= w1) {
      const [wa, qa] = pts[i - 1];
      return { gpm: qa + ((q1 - qa) * (wsfu - wa)) / (w1 - wa), extrapolated: false };
    }
  }
  const [wa, qa] = pts[pts.length - 2];
  const [wb, qb] = pts[pts.length - 1];
  return { gpm: qb + ((qb - qa) * (wsfu - wb)) / (wb - wa), extrapolated: true };
}

/** hunterDesignFlowGpm in SI: design flow in m³/s. */
export function hunterDesignFlow(wsfu: number, curve: DemandCurve): { flowM3s: number; extrapolated: boolean } {
  const { gpm, extrapolated } = hunterDesignFlowGpm(wsfu, curve);
  return { flowM3s: gpm * M3S_PER_GPM, extrapolated };
}
