import { requirePositive } from '../guards';

/**
 * Crane TP-410 fully turbulent friction factor f_T of clean commercial steel pipe, by nominal size
 * (Crane Co., *Flow of Fluids Through Valves, Fittings, and Pipe*, Technical Paper No. 410, 2009
 * edition, table "Friction factors for clean commercial steel pipe with flow in zone of complete
 * turbulence"; as transcribed in CalebBell/fluids 1.3.1 `Crane_fts`, "still in table at least to 2013").
 * Columns: nominal pipe size in inches, f_T.
 */
export const CRANE_FT_2009: readonly (readonly [nominalIn: number, fT: number])[] = [
  [0.5, 0.026],
  [0.75, 0.024],
  [1, 0.022],
  [1.25, 0.021],
  [1.5, 0.02],
  [2, 0.019],
  [2.5, 0.018],
  [3, 0.017],
  [4, 0.016],
  [5, 0.015],
  [6, 0.015],
  [8, 0.014],
  [10, 0.013],
];

export interface CraneFtLookup {
  fT: number;
  /** True when the size lies outside the table (1/2–10 in) and the end value was held. */
  extrapolated: boolean;
}

/**
 * f_T for a nominal size, with the extrapolation stated: linear interpolation in nominal size
 * between table rows (Crane tabulates only these sizes); below 1/2 in and above 10 in the end
 * value is held constant and `extrapolated` is set.
 */
export function craneFtLookup(nominalSizeIn: number): CraneFtLookup {
  requirePositive('craneFt', 'nominalSizeIn', nominalSizeIn);
  const first = CRANE_FT_2009[0];
  const last = CRANE_FT_2009[CRANE_FT_2009.length - 1];
  if (nominalSizeIn < first[0]) return { fT: first[1], extrapolated: true };
  if (nominalSizeIn > last[0]) return { fT: last[1], extrapolated: true };
  for (let i = 1; i < CRANE_FT_2009.length; i++) {
    const [d1, f1] = CRANE_FT_2009[i];
    if (nominalSizeIn <= d1) {
      const [d0, f0] = CRANE_FT_2009[i - 1];
      return { fT: f0 + ((f1 - f0) * (nominalSizeIn - d0)) / (d1 - d0), extrapolated: false };
    }
  }
  return { fT: last[1], extrapolated: false };
}

/** f_T by nominal size in inches (see craneFtLookup for the interpolation and end treatment). */
export function craneFt(nominalSizeIn: number): number {
  return craneFtLookup(nominalSizeIn).fT;
}

/**
 * Crane TP-410 loss coefficient K = N·f_T, where N is the fitting's L/D multiple.
 * @param N equivalent length in pipe diameters (dimensionless, > 0)
 * @param nominalSizeIn nominal pipe size, in
 * @returns K referred to the velocity in the pipe of that size
 */
export function craneK(N: number, nominalSizeIn: number): number {
  requirePositive('craneK', 'N', N);
  return N * craneFt(nominalSizeIn);
}
