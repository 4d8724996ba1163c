import { modelsFor } from '@/components/review/fit-models';
import {
  formatAxisTick, formatFitValue, formatNormalized, formatPercentValue, formatReviewMeasured, formatReviewValue, formatSignedPercent, parseTolerancePercent,
} from '@/components/review/format-review';

/**
 * How the review page writes its numbers. Uncertainties keep two significant digits and the value is
 * rounded at the same place, as the GUM advises (JCGM 100:2008, 7.2.6); percentages keep two decimals.
 */

const MINUS = '\u2212';

describe('percentages', () => {
  test('two decimals, a true minus sign, no sign on zero', () => {
    expect(formatPercentValue(0.012345)).toBe('1.23 %');
    expect(formatPercentValue(-0.05)).toBe(`${MINUS}5.00 %`);
    expect(formatPercentValue(null)).toBe('—');
    expect(formatSignedPercent(0.0123)).toBe('+1.23 %');
    expect(formatSignedPercent(-0.05)).toBe(`${MINUS}5.00 %`);
    expect(formatSignedPercent(0.00001)).toBe('0.00 %');
    expect(formatSignedPercent(Number.NaN)).toBe('—');
  });

  test('normalized residuals in standard uncertainties', () => {
    expect(formatNormalized(3.456)).toBe('+3.46 u');
    expect(formatNormalized(-0.5)).toBe(`${MINUS}0.50 u`);
    expect(formatNormalized(null)).toBe('—');
  });
});

describe('values of the quantity', () => {
  test('M with an SI prefix, k plain, η in percent', () => {
    expect(formatReviewValue(1.2345e-7, 'mutualInductance')).toBe('123.5 nH');
    expect(formatReviewValue(0.12345, 'coupling')).toBe('0.1235');
    expect(formatReviewValue(0.721, 'efficiency')).toBe('72.10 %');
    expect(formatReviewMeasured(1.2345e-6, 1.2e-8, 'mutualInductance')).toBe('1.235 µH ± 12 nH');
  });

  test('axis ticks drop trailing zeros after the point only', () => {
    expect(formatAxisTick(1.5e-7, 'mutualInductance')).toBe('150 nH');
    expect(formatAxisTick(1.2e-6, 'mutualInductance')).toBe('1.2 µH');
    expect(formatAxisTick(0, 'mutualInductance')).toBe('0 H');
    expect(formatAxisTick(0.5, 'efficiency')).toBe('50 %');
    expect(formatAxisTick(0.12, 'coupling')).toBe('0.12');
  });
});

describe('fitted parameters', () => {
  test('tilt in degrees, rounded where the uncertainty has its second digit', () => {
    expect(formatFitValue(1.2345, 0.45, 'tilt_offset')).toBe('1.23° ± 0.45°');
    expect(formatFitValue(-2.5, 3.1, 'tilt_offset')).toBe(`${MINUS}2.5° ± 3.1°`);
  });

  test('lengths and resistances share one prefix, that of the larger magnitude', () => {
    expect(formatFitValue(0.0023114, 0.00042, 'distance_offset')).toBe('2.31 mm ± 0.42 mm');
    // a value far below its uncertainty rounds to zero at the uncertainty's digit
    expect(formatFitValue(0.00004, 0.0012, 'lateral_offset')).toBe('0.0 mm ± 1.2 mm');
    expect(formatFitValue(0.184, 0.021, 'extra_rx_resistance')).toBe('184 mΩ ± 21 mΩ');
    expect(formatFitValue(1.5, 0.25, 'extra_rx_resistance')).toBe('1.50 Ω ± 0.25 Ω');
  });

  test('only the parameters that can explain the quantity are offered', () => {
    expect(modelsFor('efficiency')).toEqual(['extra_rx_resistance']);
    expect(modelsFor('coupling')).toEqual(['tilt_offset', 'lateral_offset', 'distance_offset']);
  });
});

describe('tolerance typed in percent', () => {
  test('accepts 0.1 % to 100 %, with or without the sign', () => {
    expect(parseTolerancePercent('5')).toBe(0.05);
    expect(parseTolerancePercent(' 2.5 % ')).toBe(0.025);
    expect(parseTolerancePercent('0.1')).toBe(0.001);
    expect(parseTolerancePercent('100%')).toBe(1);
  });

  test('refuses what the API would refuse', () => {
    expect(parseTolerancePercent('0.05')).toBeNull();
    expect(parseTolerancePercent('150')).toBeNull();
    expect(parseTolerancePercent('-5')).toBeNull();
    expect(parseTolerancePercent('five')).toBeNull();
    expect(parseTolerancePercent('')).toBeNull();
  });
});
