/**
 * Reading quantities typed with units (src/lib/units/quantity.ts). Conversion factors are the SI
 * prefixes and the international inch, 25.4 mm exactly (1959 yard and pound agreement).
 */
import { parseQuantity, type QuantityKind } from '../../../src/lib/units/quantity';

const read = (text: string, kind: QuantityKind, defaultUnit?: string) => {
  const parsed = parseQuantity(text, kind, { field: 'Field', defaultUnit });
  if (!parsed.ok) throw new Error(parsed.message);
  return parsed.value;
};
const messageOf = (text: string, kind: QuantityKind, field = 'Outer radius') => {
  const parsed = parseQuantity(text, kind, { field });
  return parsed.ok ? null : parsed.message;
};

describe('lengths', () => {
  test.each([
    ['12 cm', 0.12],
    ['12cm', 0.12],
    ['0.8 mm', 0.0008],
    ['1.5in', 0.0381],
    ['1.5 in', 0.0381],
    ['2 ft', 0.6096],
    ['5 um', 5e-6],
    ['5 µm', 5e-6],
    ['5 μm', 5e-6],
    ['1e-3 m', 0.001],
    ['0.25', 0.25],
    ['-2 cm', -0.02],
  ])('"%s" is %f m', (text, metres) => {
    expect(read(text, 'length')).toBe(metres);
  });

  test('a bare number takes the default unit when one is given', () => {
    expect(read('12', 'length', 'mm')).toBe(0.012);
    expect(read('12', 'length')).toBe(12);
  });

  test('float noise of the conversion is rounded away (1.5 in is 0.0381 m, not 0.038099999999999995)', () => {
    expect(read('1.5 in', 'length')).toBe(0.0381);
  });
});

describe('other quantities', () => {
  test.each([
    ['6.78 MHz', 'frequency', 6.78e6],
    ['85kHz', 'frequency', 85000],
    ['13.56 MHz', 'frequency', 13.56e6],
    ['50', 'frequency', 50],
    ['10 uH', 'inductance', 1e-5],
    ['10 µH', 'inductance', 1e-5],
    ['850 nH', 'inductance', 8.5e-7],
    ['0.5 ohm', 'resistance', 0.5],
    ['500 mohm', 'resistance', 0.5],
    ['2 kΩ', 'resistance', 2000],
    ['500 mΩ', 'resistance', 0.5],
    ['47 nF', 'capacitance', 4.7e-8],
    ['220 pF', 'capacitance', 2.2e-10],
    ['12 V', 'voltage', 12],
    ['350 mA', 'current', 0.35],
    ['250 mW', 'power', 0.25],
    ['89.5 deg', 'angle', 89.5],
    ['-89.5°', 'angle', -89.5],
    ['45', 'angle', 45],
    // 1 rad = 180/pi degrees (SI Brochure, 9th edition, table 4)
    ['1 rad', 'angle', Number((180 / Math.PI).toPrecision(12))],
  ] as const)('"%s" (%s) is %f in SI', (text, kind, value) => {
    expect(read(text, kind)).toBe(value);
  });

  test('a current is not a power, nor a power a voltage', () => {
    expect(messageOf('3 W', 'current', 'I1')).toMatch(/^I1: "3 W" is not a current/);
    expect(messageOf('3 V', 'power', 'Pin')).toMatch(/^Pin: "3 V" is not a power/);
  });

  test('SI symbols are case-sensitive: mHz is millihertz', () => {
    expect(read('5 mHz', 'frequency')).toBe(0.005);
  });
});

describe('refusals name the field and say what to write', () => {
  test('another dimension', () => {
    expect(messageOf('12 kg', 'length')).toBe('Outer radius: "12 kg" is not a length. Write a number and a unit, such as 12 cm or 0.8 mm.');
    expect(messageOf('12 cm', 'frequency', 'Operating frequency')).toMatch(/^Operating frequency: "12 cm" is not a frequency/);
    expect(messageOf('10 uH', 'resistance', 'Measured resistance')).toMatch(/^Measured resistance: "10 uH" is not a resistance/);
  });

  test('a unit alone, words, decimal commas, unknown units and overflow', () => {
    expect(messageOf('cm', 'length')).toMatch(/^Outer radius: "cm" is not a length/);
    expect(messageOf('fast', 'frequency')).toMatch(/is not a frequency/);
    expect(messageOf('12,5 mm', 'length')).toBe('Outer radius: write the decimal separator as a point ("12.5 mm").');
    expect(messageOf('12 CM', 'length')).toMatch(/is not a length/);
    expect(messageOf('1e999 m', 'length')).toBe('Outer radius: "1e999 m" is too large a number.');
    expect(messageOf('NaN', 'length')).toMatch(/is not a length/);
  });

  test('empty is "not set", or an error when required', () => {
    expect(parseQuantity('  ', 'length', { field: 'Radius' })).toEqual({ ok: true, value: null });
    expect(parseQuantity('', 'length', { field: 'Radius', required: true })).toEqual({ ok: false, message: 'Radius: enter a length, such as 12 cm or 0.8 mm.' });
  });
});
