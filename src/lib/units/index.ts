/**
 * Quantities with units at the edges (forms, schemas, tables): parse what people type into SI, and
 * write SI values back the way people read them. Pure: used by client forms and the server alike.
 */
export { AWG_MAX, AWG_MIN, INCH_M, awgDiameter, formatAwg, parseAwg } from './awg';
export type { AwgParse } from './awg';
export {
  DEFAULT_DIGITS,
  formatCapacitance,
  formatFrequency,
  formatInductance,
  formatLength,
  formatQuantity,
  formatResistance,
} from './format';
export { QUANTITIES, parseQuantity } from './quantity';
export type { ParseOptions, QuantityKind, QuantityParse } from './quantity';
export { gaugeOfLabel, parseWire } from './wire';
export type { WireParse } from './wire';
