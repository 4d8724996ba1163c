/**
 * Writing SI values back normalised (src/lib/units/format.ts), and the round trip through parseQuantity.
 */
import { formatFrequency, formatLength, formatQuantity } from '../../../src/lib/units/format';
import { parseQuantity, type QuantityKind } from '../../../src/lib/units/quantity';

describe('formatQuantity', () => {
  test.each([
    [0.12, 'length', '12 cm'],
    [0.0008, 'length', '0.8 mm'],
    [0.0381, 'length', '3.81 cm'],
    [1.5, 'length', '1.5 m'],
    [0.004, 'length', '4 mm'],
    [5e-6, 'length', '5 µm'],
    [8e-5, 'length', '80 µm'],
    [1e-4, 'length', '0.1 mm'],
    [0.01, 'length', '1 cm'],
    [0.0099999999999, 'length', '1 cm'],
    [6.78e6, 'frequency', '6.78 MHz'],
    [13.56e6, 'frequency', '13.56 MHz'],
    [85000, 'frequency', '85 kHz'],
    [50, 'frequency', '50 Hz'],
    [0.5, 'frequency', '0.5 Hz'],
    [1e-5, 'inductance', '10 µH'],
    [2.0982954651e-6, 'inductance', '2.0983 µH'],
    [0.5, 'resistance', '500 mΩ'],
    [2200, 'resistance', '2.2 kΩ'],
    [4.7e-8, 'capacitance', '47 nF'],
    [0, 'length', '0 m'],
    [-0.02, 'length', '-2 cm'],
  ] as const)('%f %s -> "%s"', (value, kind, text) => {
    expect(formatQuantity(value, kind, 5)).toBe(text);
  });

  test('digits set the significant figures; trailing zeros go', () => {
    expect(formatLength(0.0010237, 4)).toBe('1.024 mm');
    expect(formatFrequency(6.78e6)).toBe('6.78 MHz');
    expect(formatQuantity(2.0982954651e-6, 'inductance', 3)).toBe('2.1 µH');
  });

  test('a value that is not finite shows as a dash, not as "NaN"', () => {
    expect(formatLength(Number.NaN)).toBe('—');
  });

  test.each([
    [0.12, 'length'],
    [0.0381, 'length'],
    [1.02369e-3, 'length'],
    [6.78e6, 'frequency'],
    [2.2e-6, 'inductance'],
    [0.047, 'resistance'],
    [1.5e-10, 'capacitance'],
  ] as const)('%f %s survives format -> parse', (value, kind: QuantityKind) => {
    const parsed = parseQuantity(formatQuantity(value, kind), kind, { field: 'x' });
    expect(parsed).toEqual({ ok: true, value });
  });
});
