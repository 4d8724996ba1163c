import { axisTitle, formatAxisValue, parseAxisValue, toDisplayNumber } from '@/components/plans/axis-units';

// Unit factors are SI definitions (1 cm = 0.01 m, 1 in = 0.0254 m exactly, 1 MHz = 1e6 Hz).
const TOLERANCE = 1e-12;

describe('typed axis values to SI and back', () => {
  test('lengths, frequencies and resistances read into SI and keep the typed unit', () => {
    expect(parseAxisValue('5 cm', 'distance', 'Start')).toEqual({ ok: true, value: 0.05, unit: 'cm' });
    expect(parseAxisValue('1.5 in', 'lateralOffset', 'Start')).toEqual({ ok: true, value: 0.0381, unit: 'in' });
    expect(parseAxisValue('6.78 MHz', 'frequencyHz', 'Start')).toEqual({ ok: true, value: 6.78e6, unit: 'MHz' });
    expect(parseAxisValue('50 ohm', 'loadResistance', 'Start')).toEqual({ ok: true, value: 50, unit: 'ohm' });
    expect(parseAxisValue('2 kΩ', 'loadResistance', 'Start')).toEqual({ ok: true, value: 2000, unit: 'kohm' });
  });

  test('a bare number is in the axis default unit (cm for distances, deg for tilt)', () => {
    expect(parseAxisValue('15', 'distance', 'Stop')).toEqual({ ok: true, value: 0.15, unit: 'cm' });
    expect(parseAxisValue('90', 'tiltDeg', 'Stop')).toEqual({ ok: true, value: 90, unit: 'deg' });
  });

  test('angles are read in degrees however they are written', () => {
    for (const text of ['90 deg', '90deg', '90°', '90 degrees']) expect(parseAxisValue(text, 'tiltDeg', 'Stop')).toEqual({ ok: true, value: 90, unit: 'deg' });
  });

  test('the wrong dimension, a unit alone or nothing at all is refused with the field named', () => {
    const wrong = parseAxisValue('5 MHz', 'distance', 'Start');
    expect(wrong.ok).toBe(false);
    if (!wrong.ok) expect(wrong.message).toMatch(/^Start: /);
    expect(parseAxisValue('5 cm', 'tiltDeg', 'Step').ok).toBe(false);
    expect(parseAxisValue('cm', 'distance', 'Step').ok).toBe(false);
    expect(parseAxisValue('  ', 'distance', 'Step').ok).toBe(false);
  });

  test('SI values are shown back in the display unit and parse to the same SI value', () => {
    expect(toDisplayNumber(0.05, 'distance', 'cm')).toBe(5);
    expect(toDisplayNumber(6.78e6, 'frequencyHz', 'MHz')).toBe(6.78);
    expect(formatAxisValue(0.075, 'distance', 'cm')).toBe('7.5 cm');
    expect(formatAxisValue(30, 'tiltDeg', 'deg')).toBe('30 deg');
    for (const [si, quantity, unit] of [[0.0381, 'lateralOffset', 'in'], [13.56e6, 'frequencyHz', 'MHz'], [0.125, 'distance', 'mm']] as const) {
      const back = parseAxisValue(formatAxisValue(si, quantity, unit), quantity, 'Value');
      expect(back.ok && Math.abs(back.value - si) / si).toBeLessThan(TOLERANCE);
    }
  });

  test('an unknown display unit falls back to the axis default rather than showing a wrong number', () => {
    expect(formatAxisValue(0.05, 'distance', 'furlong')).toBe('5 cm');
    expect(axisTitle('tiltDeg', 'deg')).toBe('Tilt [deg]');
  });
});
