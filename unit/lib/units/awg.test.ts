/**
 * Wire gauge (src/lib/units/awg.ts, wire.ts).
 * Formula: ASTM B258, d = 0.005 in x 92^((36 - n)/39) (REFERENCES.md, "Resistance").
 */
import { AWG_MAX, AWG_MIN, awgDiameter, formatAwg, parseAwg } from '../../../src/lib/units/awg';
import { gaugeOfLabel, parseWire } from '../../../src/lib/units/wire';

const INCH = 0.0254;
/** Diameters below are quoted to 0.1 um; the formula is exact, so this is the rounding of the quote. */
const QUOTED_MM = 0.5e-4;
/** ASTM B258's table gives inches to 4 decimals: half a unit of the last place. */
const TABLE_IN = 0.5e-4;

describe('ASTM B258 diameters', () => {
  test('the formula pins AWG 36 at 0.005 in and AWG 0000 at 0.46 in (its definition)', () => {
    expect(awgDiameter(36) / INCH).toBeCloseTo(0.005, 12);
    expect(awgDiameter(-3) / INCH).toBeCloseTo(0.46, 12);
  });

  test('each gauge is 92^(1/39) thinner than the one before (geometric series)', () => {
    for (let n = AWG_MIN; n < AWG_MAX; n++) expect(awgDiameter(n) / awgDiameter(n + 1)).toBeCloseTo(92 ** (1 / 39), 12);
  });

  // Computed from the ASTM B258 formula, quoted to 0.1 um.
  test.each([
    [18, 1.0237],
    [10, 2.5882],
    [22, 0.6438],
    [36, 0.127],
  ])('AWG %i = %f mm (ASTM B258 formula)', (gauge, mm) => {
    expect(Math.abs(awgDiameter(gauge) * 1000 - mm)).toBeLessThan(QUOTED_MM);
  });

  // ASTM B258 Table 1 nominal diameters in inches (values recalled, not re-read: memory).
  test.each([
    [-3, 0.46],
    [-2, 0.4096],
    [-1, 0.3648],
    [0, 0.3249],
    [10, 0.1019],
    [18, 0.0403],
    [22, 0.0253],
    [40, 0.0031],
  ])('AWG %i matches the table value %f in (ASTM B258 Table 1, memory)', (gauge, inches) => {
    expect(Math.abs(awgDiameter(gauge) / INCH - inches)).toBeLessThan(TABLE_IN);
  });
});

describe('reading gauges', () => {
  test.each([
    ['AWG 18', 18],
    ['awg18', 18],
    ['18 AWG', 18],
    ['#18 AWG', 18],
    ['AWG 0', 0],
    ['AWG 00', -1],
    ['AWG 000', -2],
    ['AWG 0000', -3],
    ['4/0 AWG', -3],
    ['AWG 2/0', -1],
    ['AWG 56', 56],
  ])('"%s" is gauge %i', (text, gauge) => {
    expect(parseAwg(text)).toEqual({ kind: 'awg', gauge });
  });

  test('gauges outside 0000..56 are refused, text without AWG is not a gauge', () => {
    expect(parseAwg('AWG 57').kind).toBe('out-of-range');
    expect(parseAwg('AWG 00000').kind).toBe('out-of-range');
    expect(parseAwg('0.8 mm').kind).toBe('not-awg');
  });

  test('labels are written the way reels are', () => {
    expect(formatAwg(18)).toBe('AWG 18');
    expect(formatAwg(-3)).toBe('AWG 0000');
    expect(formatAwg(0)).toBe('AWG 0');
    expect(gaugeOfLabel('AWG 22')).toBe(22);
    expect(gaugeOfLabel('0.8 mm')).toBeNull();
  });
});

describe('parseWire', () => {
  test('a gauge gives its diameter and a normalised label', () => {
    const wire = parseWire(' awg 18 ', { field: 'Wire' });
    expect(wire.ok && wire.value).toEqual({ diameter: expect.closeTo(1.0237e-3, 7), gauge: 18, label: 'AWG 18' });
  });

  test('a diameter with a unit is read as a length, the label as typed', () => {
    expect(parseWire('0.8 mm', { field: 'Wire' })).toEqual({ ok: true, value: { diameter: 0.0008, gauge: null, label: '0.8 mm' } });
    expect(parseWire('0.032 in', { field: 'Wire' })).toEqual({ ok: true, value: { diameter: 0.0008128, gauge: null, label: '0.032 in' } });
  });

  test('a bare number is ambiguous (gauge or millimetres?) and refused, naming the field', () => {
    const wire = parseWire('18', { field: 'Wire' });
    expect(wire.ok).toBe(false);
    expect(!wire.ok && wire.message).toMatch(/^Wire: "18" needs a unit/);
  });

  test('empty is "not set" unless required; nonsense and bad gauges name the field', () => {
    expect(parseWire('', { field: 'Strand diameter' })).toEqual({ ok: true, value: null });
    expect(parseWire('', { field: 'Wire', required: true })).toMatchObject({ ok: false, message: expect.stringMatching(/^Wire: enter/) });
    expect(parseWire('12 kg', { field: 'Wire' })).toMatchObject({ ok: false, message: expect.stringMatching(/^Wire: "12 kg" is neither/) });
    expect(parseWire('AWG 99', { field: 'Wire' })).toMatchObject({ ok: false, message: expect.stringMatching(/^Wire: "AWG 99" is not a gauge from AWG 0000 to AWG 56/) });
  });
});
