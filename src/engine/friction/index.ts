export { laminarFrictionFactor } from './laminar';
export { colebrook, COLEBROOK_TOLERANCE } from './colebrook';
export { swameeJain1976 } from './swameeJain';
export { churchill1977 } from './churchill';
export { hazenWilliamsHeadLoss, hazenWilliamsPressureLoss, HAZEN_WILLIAMS_SI_CONSTANT, HAZEN_WILLIAMS_US_CONSTANT } from './hazenWilliams';
export { darcyFrictionFactor, LAMINAR_RE_LIMIT, TURBULENT_RE_LIMIT } from './darcy';
export type { FlowRegime, DarcyFrictionResult } from './darcy';
export { FRICTION_METHODS } from './registry';
export type { FrictionMethod, FrictionMethodEntry, FrictionReferenceCase } from './registry';
