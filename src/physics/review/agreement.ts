/**
 * How far measured values sit from predicted ones: the mean of repeated observations at one pose with
 * its standard uncertainty, the comparison of one value with its prediction, and summary metrics over
 * many relative errors. Pure arithmetic so the review page, the PDF and the CSV all agree on the numbers.
 */

export interface ValueWithUncertainty {
  value: number;
  /** standard uncertainty */
  uncertainty: number;
}

export interface MeanEstimate {
  mean: number;
  uncertainty: number;
  n: number;
}

/**
 * Mean of observations at one pose: u = sqrt(uB^2 + s^2/n), with uB the rms of the observations'
 * standard uncertainties (the instrument's part, type B, which does not average down because repeats
 * share the instrument) and s the sample standard deviation (type A, GUM JCGM 100:2008 4.2.2-4.2.3).
 * For n = 1 there is no scatter to estimate, so the s term is 0. Throws RangeError on an empty list.
 */
export function meanOfObservations(observations: readonly ValueWithUncertainty[]): MeanEstimate {
  const n = observations.length;
  if (n === 0) throw new RangeError('meanOfObservations needs at least one observation');
  let sum = 0;
  let sumU2 = 0;
  for (const o of observations) {
    sum += o.value;
    sumU2 += o.uncertainty * o.uncertainty;
  }
  const mean = sum / n;
  const typeB2 = sumU2 / n;
  let scatter2 = 0;
  if (n > 1) {
    let ss = 0;
    for (const o of observations) ss += (o.value - mean) ** 2;
    // s^2 / n: the experimental variance of the mean (GUM 4.2.3)
    scatter2 = ss / (n - 1) / n;
  }
  return { mean, uncertainty: Math.sqrt(typeB2 + scatter2), n };
}

export interface Comparison {
  /** measured - predicted */
  residual: number;
  /** residual / |predicted|, null when predicted is 0 */
  relative: number | null;
  /** residual / uncertainty, null when the uncertainty is not a positive finite number */
  normalized: number | null;
}

/** residual = measured - predicted; relative = residual/|predicted|; normalized = residual/uncertainty. */
export function compareToPrediction(measured: number, uncertainty: number, predicted: number): Comparison {
  const residual = measured - predicted;
  const relative = predicted === 0 || !Number.isFinite(predicted) ? null : residual / Math.abs(predicted);
  const normalized = Number.isFinite(uncertainty) && uncertainty > 0 ? residual / uncertainty : null;
  return { residual, relative, normalized };
}

export interface ErrorMetrics {
  /** finite relative errors counted */
  count: number;
  rmsRelative: number | null;
  /** signed relative error of largest magnitude */
  maxRelative: number | null;
  /** mean signed relative error */
  bias: number | null;
  /** relative errors with |rel| > tolerance */
  outsideTolerance: number;
}

/**
 * Over the finite relative errors given (nulls and non-finite values are skipped, as they mark poses
 * without a usable prediction): rms, the signed value of largest magnitude, the mean (bias) and how many
 * lie outside the tolerance. The statistics are null when there is nothing to count.
 */
export function errorMetrics(relativeErrors: readonly (number | null)[], tolerance: number): ErrorMetrics {
  let count = 0;
  let sum = 0;
  let sum2 = 0;
  let max: number | null = null;
  let outsideTolerance = 0;
  for (const r of relativeErrors) {
    if (r === null || !Number.isFinite(r)) continue;
    count += 1;
    sum += r;
    sum2 += r * r;
    if (max === null || Math.abs(r) > Math.abs(max)) max = r;
    if (Math.abs(r) > tolerance) outsideTolerance += 1;
  }
  if (count === 0) return { count: 0, rmsRelative: null, maxRelative: null, bias: null, outsideTolerance: 0 };
  return { count, rmsRelative: Math.sqrt(sum2 / count), maxRelative: max, bias: sum / count, outsideTolerance };
}
