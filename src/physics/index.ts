/**
 * The coupling solver: solve(request) returns the response of PRODUCT.md ("POST /api/solve"). Pure
 * TypeScript over numbers and Float64Arrays, no framework imports; runs in the route handler, in worker
 * threads and in a browser Web Worker.
 */
export { SOLVER_VERSION, coilPathPoints, requestPaths, solve, solveDetailed } from './solve';
export type { SolveDetail } from './solve';
export { SolveInputError, validateSolveRequest, MAX_TOLERANCE, MIN_TOLERANCE, MAX_TURNS } from './validation';
export type { SolveIssue } from './validation';
export { frequencyResponse, linkFrequencyResponse } from './frequency-response';
export type { FrequencyResponse } from './frequency-response';
export { fieldAtPoints } from './field-exposure';
export type { FieldPointResult } from './field-exposure';
export { DEFAULT_EXPOSURE_TABLE, assessExposure } from './exposure-limits';
export type { ExposureAssessment, ExposureRow, Population } from './exposure-limits';
export { DEFAULT_TOLERANCE } from './neumann';
export { coilProperties } from './coil-properties';
export type { CoilProperties } from './coil-properties';
export type * from './types';
export * from './measurement';
export { MAX_TOUCHSTONE_CHARS, MAX_TOUCHSTONE_POINTS, TouchstoneError, parseTouchstone, twoPortRawFromTouchstone, zParametersAt } from './touchstone';
export type { TouchstoneData, TouchstoneFormat, TouchstoneFrequencyUnit, TouchstoneParameter, TouchstonePoint, ZParameters } from './touchstone';
