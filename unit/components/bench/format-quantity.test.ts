import {
  cmToMetres, formatEngineering, formatInputNumber, formatPercent, formatRelativeError, formatScientific, metresToCm, NO_VALUE,
} from '@/components/bench/format-quantity';

describe('formatEngineering', () => {
  test.each([
    [1.2345e-6, 'H', '1.235 µH'],
    [11.6e-6, 'H', '11.60 µH'],
    [47e-12, 'F', '47.00 pF'],
    [-3.2e-9, 'H', '-3.200 nH'],
    [0.5, 'W', '500.0 mW'],
    [1874.9, 'V', '1.875 kV'],
    [6.78e6, 'Hz', '6.780 MHz'],
    [1, 'A', '1.000 A'],
  ])('%d %s -> %s', (value, unit, text) => {
    expect(formatEngineering(value, unit)).toBe(text);
  });

  test('rounding that reaches 1000 moves to the next prefix', () => {
    expect(formatEngineering(999.96e-6, 'H')).toBe('1.000 mH');
    expect(formatEngineering(999.94e-6, 'H')).toBe('999.9 µH');
  });

  test('zero, missing and non-finite values', () => {
    expect(formatEngineering(0, 'H')).toBe('0 H');
    expect(formatEngineering(null, 'H')).toBe(NO_VALUE);
    expect(formatEngineering(undefined, 'H')).toBe(NO_VALUE);
    expect(formatEngineering(Number.NaN, 'H')).toBe(NO_VALUE);
    expect(formatEngineering(Number.POSITIVE_INFINITY, 'T')).toBe(NO_VALUE);
  });

  test('outside the prefixes it falls back to exponent notation', () => {
    expect(formatEngineering(3e-18, 'F')).toBe('3.000e-18 F');
    expect(formatEngineering(2e12, 'Hz')).toBe('2.000e+12 Hz');
  });

  test('digits are significant digits', () => {
    expect(formatEngineering(27e-6, 'T', 3)).toBe('27.0 µT');
    expect(formatEngineering(1e-6, 'T', 1)).toBe('1 µT');
    expect(formatEngineering(1e-7, 'T', 1)).toBe('100 nT');
    expect(formatEngineering(2.5e-7, 'T', 4, true)).toBe('250 nT');
  });
});

describe('percentages, scientific notation and accuracy', () => {
  test('formatPercent', () => {
    expect(formatPercent(0.87341)).toBe('87.34 %');
    expect(formatPercent(0.0012346)).toBe('0.1235 %');
    expect(formatPercent(0)).toBe('0 %');
    expect(formatPercent(Number.NaN)).toBe(NO_VALUE);
  });

  test('formatScientific writes small and large numbers with a superscript power of ten', () => {
    expect(formatScientific(7.2e-9)).toBe('7.2×10⁻⁹');
    expect(formatScientific(-1.5e-12, 2)).toBe('-1.5×10⁻¹²');
    expect(formatScientific(3.4e5)).toBe('3.4×10⁵');
    expect(formatScientific(0.25)).toBe('0.25');
    expect(formatScientific(0)).toBe('0');
  });

  test('formatRelativeError shows the relative error in percent', () => {
    expect(formatRelativeError(7e-9)).toBe('±7.0×10⁻⁷ %');
    expect(formatRelativeError(2.5e-5)).toBe('±0.0025 %');
  });
});

describe('inputs in centimetres', () => {
  test('metres and centimetres convert without binary tails', () => {
    expect(metresToCm(0.1)).toBe(10);
    expect(metresToCm(0.07)).toBe(7);
    expect(cmToMetres(12.3)).toBe(0.123);
    expect(cmToMetres(metresToCm(0.0123))).toBe(0.0123);
  });

  test('formatInputNumber drops trailing zeros and noise', () => {
    expect(formatInputNumber(10.000000000000002, 2)).toBe('10');
    expect(formatInputNumber(-2.5, 2)).toBe('-2.5');
    expect(formatInputNumber(Number.NaN)).toBe('');
  });
});
