/**
 * What each fitting-loss method is, as the Methods table of a report prints it: label, published
 * source and whether the method's data were checked against the printed source. Each fitting's own
 * line (FITTING_TYPES[…].sources) names the table row used; this is the method as a whole.
 */
import { NOT_VERIFIED } from '../catalog/notVerified';
import { IPC_E103_3_5_SOURCE } from './equivalentLength';
import type { FittingMethod } from './fittingK';

export interface FittingMethodInfo {
  id: FittingMethod;
  label: string;
  source: string;
  verified: boolean;
}

export const FITTING_METHODS: Readonly<Record<FittingMethod, FittingMethodInfo>> = Object.freeze({
  crane: {
    id: 'crane',
    label: 'K = N·f_T, with f_T by nominal size',
    source: 'Crane Technical Paper No. 410, Flow of Fluids Through Valves, Fittings, and Pipe (2009); each fitting type names its own row',
    verified: true,
  },
  'hooper-2k': {
    id: 'hooper-2k',
    label: 'Two-constant K = K1/Re + K∞·(1 + 1/D[in])',
    source: 'W. B. Hooper, Chemical Engineering 88(17), 96–100 (1981)',
    verified: true,
  },
  'darby-3k': {
    id: 'darby-3k',
    label: 'Three-constant K = K1/Re + Ki·(1 + Kd/D[in]^0.3)',
    source: 'R. Darby, Chemical Engineering 106(7) (1999); Darby, Chemical Engineering Fluid Mechanics, 2nd ed. (2001)',
    verified: true,
  },
  'equivalent-length': {
    id: 'equivalent-length',
    label: 'Equivalent length of pipe, K = f·Le/D',
    source: IPC_E103_3_5_SOURCE,
    verified: !IPC_E103_3_5_SOURCE.includes(NOT_VERIFIED),
  },
});
