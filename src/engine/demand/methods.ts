/**
 * What each demand method is, as the Methods table of a report prints it: label, published source and
 * whether its data were checked against the printed source.
 */
import { NOT_VERIFIED } from '../catalog/notVerified';
import { HUNTER_TABLE_IPC_SOURCE, HUNTER_TABLE_IPC_VERIFIED } from './hunterTable';

export type DemandMethod = 'hunter-table' | 'hunter-binomial';

export interface DemandMethodInfo {
  id: DemandMethod;
  label: string;
  source: string;
  verified: boolean;
}

export const DEMAND_METHODS: Readonly<Record<DemandMethod, DemandMethodInfo>> = Object.freeze({
  'hunter-table': {
    id: 'hunter-table',
    label: 'Fixture units to design flow (Hunter curves), linear interpolation',
    source: HUNTER_TABLE_IPC_SOURCE,
    verified: HUNTER_TABLE_IPC_VERIFIED,
  },
  'hunter-binomial': {
    id: 'hunter-binomial',
    label: "Hunter's binomial method, 99th percentile",
    // Only the 99th-percentile criterion was read in a published copy; the method's algebra and any
    // fixture q, t, T values entered are the designer's.
    source: `R. B. Hunter, Methods of Estimating Loads in Plumbing Systems, NBS Report BMS65 (1940); the binomial form as implemented is ${NOT_VERIFIED}`,
    verified: false,
  },
});
