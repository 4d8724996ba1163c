/**
 * Bench measurements: the methods and their raw fields, the derivation of M, k and efficiency with GUM
 * uncertainties, and the uncertainty propagation itself.
 */
export * from './methods';
export * from './types';
export * from './derive';
export * from './uncertainty';
