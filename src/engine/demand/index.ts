export { HUNTER_TABLE_IPC, HUNTER_TABLE_IPC_SOURCE, HUNTER_TABLE_IPC_VERIFIED } from './hunterTable';
export type { HunterTableRow } from './hunterTable';
export { hunterDesignFlowGpm, hunterDesignFlow } from './hunterDesignFlow';
export type { DemandCurve, HunterDesignFlowGpm } from './hunterDesignFlow';
export { hunterBinomialDemand } from './hunterBinomial';
export type { FixtureUseGroup } from './hunterBinomial';
export { DEMAND_METHODS } from './methods';
export type { DemandMethod, DemandMethodInfo } from './methods';
