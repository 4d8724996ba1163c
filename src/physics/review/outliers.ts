/**
 * The automatic outlier rule, kept in one place so the review page, the exports and the summary flag
 * the same observations.
 *
 * An observation is flagged when its residual from the prediction exceeds OUTLIER_SIGMA = 3 of its own
 * standard uncertainties (|measured - predicted| / u > 3). That catches either a bad reading (a slipped
 * fixture, a wrong range, a typo) or a model that disagrees with the measurement beyond what the
 * measurement uncertainty explains; the flag says "look here", it does not say which. If the prediction
 * were right and the errors normally distributed, a genuine observation would still be flagged with
 * probability about 0.27 % (two-sided tail beyond 3 sigma), which is the usual three-sigma rule of
 * common practice. Flagged observations stay in the means and fits; only a person sets one aside.
 */

/** Residuals beyond this many standard uncertainties are flagged. */
export const OUTLIER_SIGMA = 3;

/** |normalized| > OUTLIER_SIGMA; an observation without a normalized residual is never flagged. */
export function isAutoOutlier(normalized: number | null): boolean {
  return normalized !== null && Number.isFinite(normalized) && Math.abs(normalized) > OUTLIER_SIGMA;
}
