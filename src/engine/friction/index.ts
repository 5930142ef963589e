export { laminarFrictionFactor } from './laminar';
export { colebrook } from './colebrook';
export { swameeJain1976 } from './swameeJain';
export { churchill1977 } from './churchill';
export { hazenWilliamsHeadLoss, hazenWilliamsPressureLoss, HAZEN_WILLIAMS_SI_CONSTANT } from './hazenWilliams';
export { darcyFrictionFactor } from './darcy';
export type { FlowRegime, DarcyFrictionResult } from './darcy';
export { FRICTION_METHODS } from './registry';
export type { FrictionMethod, FrictionMethodEntry, FrictionReferenceCase } from './registry';
