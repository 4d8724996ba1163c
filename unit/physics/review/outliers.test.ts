/**
 * The automatic outlier rule (src/physics/review/outliers.ts).
 */
import { erf } from 'mathjs';
import { OUTLIER_SIGMA, isAutoOutlier } from '../../../src/physics/review/outliers';

describe('isAutoOutlier: |residual| > 3 standard uncertainties (three-sigma rule, common practice)', () => {
  test('exactly 3 is not flagged, 3.0001 is, on either side', () => {
    expect(OUTLIER_SIGMA).toBe(3);
    expect(isAutoOutlier(3)).toBe(false);
    expect(isAutoOutlier(-3)).toBe(false);
    expect(isAutoOutlier(3.0001)).toBe(true);
    expect(isAutoOutlier(-3.0001)).toBe(true);
    expect(isAutoOutlier(0)).toBe(false);
  });
  test('no normalized residual (null or NaN) is never flagged', () => {
    expect(isAutoOutlier(null)).toBe(false);
    expect(isAutoOutlier(NaN)).toBe(false);
  });
  test('the documented false-flag rate: P(|z| > 3) = 1 - erf(3 / sqrt 2) is about 0.27 % (erf from mathjs)', () => {
    const tail = 1 - (erf(OUTLIER_SIGMA / Math.SQRT2) as number);
    // 0.0026998 (standard normal table value, from memory); the comment in outliers.ts rounds it to 0.27 %
    expect(Math.abs(tail - 0.0027)).toBeLessThan(0.00005);
  });
});
