/**
 * Touchstone file exchange: read measured one-ports (and two-ports), write fitted networks.
 * Pure TypeScript, no DOM and no database, so the server and the browser read files alike.
 * Everything here follows the Touchstone File Format Specification Version 2.0 (IBIS Open Forum,
 * 2009); two-port conversions follow Pozar, Microwave Engineering, 4th ed., Table 4.2.
 */
export { TouchstoneError, isTouchstoneError } from './touchstone-error.js';
export {
  type DataFormat,
  type FrequencyUnit,
  type NetworkParameter,
  type OptionLine,
  HERTZ_PER_UNIT,
  OPTION_LINE_DEFAULTS,
  formatOptionLine,
  parseOptionLine,
  parseTouchstoneNumber,
} from './touchstone-option-line.js';
export { decodeDataPair, encodeDataPair } from './data-pair.js';
export {
  type TwoPortMatrix,
  TWO_PORT_MATRIX_LENGTH,
  abcdToScattering,
  admittanceToScattering,
  createTwoPortMatrix,
  impedanceFromReflection,
  impedanceToScattering,
  reflectionFromImpedance,
  scatteringToAbcd,
} from './network-parameters.js';
export {
  type MatrixFormat,
  type OnePortImpedance,
  type TouchstoneHeader,
  type TouchstoneVersion,
  type TwoPortDataOrder,
  type TwoPortNetworkData,
  readOnePortTouchstone,
  readTwoPortTouchstone,
} from './touchstone-read.js';
export {
  type OnePortWriteInput,
  type TwoPortWriteInput,
  DEFAULT_REFERENCE_OHM,
  PRODUCT_COMMENT,
  TOUCHSTONE_SIGNIFICANT_DIGITS,
  formatTouchstoneNumber,
  writeOnePortTouchstone,
  writeTwoPortTouchstone,
} from './touchstone-write.js';
export { type ImpedanceSamples, RANGE_EDGE_RELATIVE, impedanceAtFrequency } from './impedance-interpolation.js';
