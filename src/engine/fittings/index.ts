export { CRANE_FT_2009, craneFt, craneFtLookup, craneK } from './crane';
export type { CraneFtLookup } from './crane';
export { hooper2K } from './hooper';
export { darby3K } from './darby';
export {
  ENTRANCE_SHARP_K,
  ENTRANCE_REENTRANT_K,
  EXIT_K,
  suddenExpansionK,
  suddenContractionK,
  changeKBasis,
} from './expansion';
export { IPC_E103_3_5, IPC_E103_3_5_SOURCE } from './equivalentLength';
export { FITTING_TYPES } from './types';
export type { FittingTypeId, FittingTypeEntry } from './types';
export { fittingK } from './fittingK';
export type { FittingMethod, FittingContext, FittingKResult } from './fittingK';
export { FITTING_METHODS } from './methods';
export type { FittingMethodInfo } from './methods';
export { PEX_FITTING_LINES } from './types';
export { PEX_LINES, pexFittingFor, isMetalPipeFitting } from './pexSubstitute';
export type { PexFittingLine } from './pexSubstitute';
