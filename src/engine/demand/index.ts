export { HUNTER_TABLE_IPC } from './hunterTable';
export type { HunterTableRow } from './hunterTable';
export { hunterDesignFlowGpm, hunterDesignFlow } from './hunterDesignFlow';
export type { DemandCurve, HunterDesignFlowGpm } from './hunterDesignFlow';
export { hunterBinomialDemand } from './hunterBinomial';
export type { FixtureUseGroup } from './hunterBinomial';
export type { DemandMethod, DemandMethodInfo } from './methods';
