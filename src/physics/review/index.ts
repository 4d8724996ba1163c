/**
 * Comparing predicted with measured values: means with uncertainty, agreement metrics, the automatic
 * outlier rule and one-parameter least-squares fits of effective parameters.
 */
export { compareToPrediction, errorMetrics, meanOfObservations } from './agreement';
export type { Comparison, ErrorMetrics, MeanEstimate, ValueWithUncertainty } from './agreement';
export { OUTLIER_SIGMA, isAutoOutlier } from './outliers';
export { FitInputError, chiSquare, fitOneParameter } from './least-squares';
export type { OneParameterFit, OneParameterProblem } from './least-squares';
export { efficiencyWithExtraReceiverResistance } from './extra-resistance';
