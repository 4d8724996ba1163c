/**
 * Bad readings and warnings of the derivations (src/physics/measurement/derive.ts), and the method-fit
 * warning shown before measuring (REFERENCES.md "Measurement methods": differences of nearly equal
 * readings lose precision).
 */
import { deriveReading, expectedRelativeUncertainty, methodFitWarning } from '../../../src/physics/measurement/derive';
import { DEFAULT_ACCURACY, type MeasurementMethod, type RawReading } from '../../../src/physics/measurement/methods';
import { ReadingInputError } from '../../../src/physics/measurement/types';

const NONE = { predicted: null };
const METERS = { relative: 0.001, phaseDeg: 0.5 };

function fieldAtFault(method: MeasurementMethod, raw: RawReading): { field: string; message: string } {
  try {
    deriveReading(method, raw, METERS, NONE);
  } catch (error) {
    if (error instanceof ReadingInputError) return { field: error.field, message: error.message };
    throw error;
  }
  throw new Error('no ReadingInputError');
}

describe('readings no derivation can use fail with ReadingInputError naming the field', () => {
  const twoPort = { frequency: 1e6, z11Re: 0.1, z11Im: 60, z21Re: 0, z21Im: 3, z22Re: 0.1, z22Im: 60 };
  test.each<[string, MeasurementMethod, RawReading, string, RegExp]>([
    ['zero frequency', 'open_circuit', { frequency: 0, txCurrent: 1, rxVoltage: 1 }, 'frequency', /above zero/],
    ['zero current', 'open_circuit', { frequency: 1e6, txCurrent: 0, rxVoltage: 1 }, 'txCurrent', /must not be zero/],
    ['missing V2', 'open_circuit', { frequency: 1e6, txCurrent: 1 }, 'rxVoltage', /required/],
    ['non-finite V2', 'open_circuit', { frequency: 1e6, txCurrent: 1, rxVoltage: Number.NaN }, 'rxVoltage', /finite/],
    ['negative measured L1', 'open_circuit', { frequency: 1e6, txCurrent: 1, rxVoltage: 1, txSelfInductance: -1e-6 }, 'txSelfInductance', /above zero/],
    ['zero La', 'aiding_opposing', { aidingInductance: 0, opposingInductance: 1e-6 }, 'aidingInductance', /above zero/],
    ['Lsc above Loc', 'short_open', { shortInductance: 11e-6, openInductance: 10e-6 }, 'shortInductance', /Lsc \(11 µH\) is above Loc \(10 µH\)/],
    ['zero frequency (two-port)', 'two_port', { ...twoPort, frequency: 0 }, 'frequency', /above zero/],
    ['capacitive Z11', 'two_port', { ...twoPort, z11Im: -5 }, 'z11Im', /self-resonance/],
    ['zero Im Z22', 'two_port', { ...twoPort, z22Im: 0 }, 'z22Im', /above zero/],
    ['fl above fh', 'split_peaks', { lowPeak: 7e6, highPeak: 6.5e6 }, 'lowPeak', /must be below the upper peak/],
    ['fl equal to fh', 'split_peaks', { lowPeak: 7e6, highPeak: 7e6 }, 'lowPeak', /must be below/],
    ['zero Pin', 'direct_power', { inputPower: 0, outputPower: 1 }, 'inputPower', /above zero/],
    ['negative Pout', 'direct_power', { inputPower: 2, outputPower: -1 }, 'outputPower', /negative/],
    ['zero I1', 'direct_power', { txVoltage: 10, txCurrent: 0, rxVoltage: 5, rxCurrent: 1 }, 'txCurrent', /must not be zero/],
    ['input phase 90 degrees', 'direct_power', { txVoltage: 10, txCurrent: 1, txPhaseDeg: 90, rxVoltage: 5, rxCurrent: 1 }, 'txPhaseDeg', /no real power/],
    ['load phase 120 degrees', 'direct_power', { txVoltage: 10, txCurrent: 1, rxVoltage: 5, rxCurrent: 1, rxPhaseDeg: 120 }, 'rxPhaseDeg', /deliver power/],
    ['incomplete V/I group', 'direct_power', { txVoltage: 10, txCurrent: 1, rxVoltage: 5 }, 'rxCurrent', /both powers/],
    ['neither group', 'direct_power', { outputPower: 5 }, 'inputPower', /both powers/],
  ])('%s', (_, method, raw, field, message) => {
    const fault = fieldAtFault(method, raw);
    expect(fault.field).toBe(field);
    expect(fault.message).toMatch(message);
  });
});

describe('warnings on derived values', () => {
  test('|k| above 1 from inconsistent self-inductances', () => {
    const d = deriveReading('aiding_opposing', { aidingInductance: 30e-6, opposingInductance: 2e-6, txSelfInductance: 5e-6, rxSelfInductance: 5e-6 }, METERS, NONE);
    expect(d.coupling!.value).toBeGreaterThan(1);
    expect(d.warnings.join(' ')).toMatch(/\|k\| = 1\.4 is above 1/);
  });
  test('La below Lo: negative M kept, swap suspected', () => {
    const d = deriveReading('aiding_opposing', { aidingInductance: 19e-6, opposingInductance: 21e-6 }, METERS, NONE);
    expect(d.mutualInductance!.value).toBeLessThan(0);
    expect(d.warnings.join(' ')).toMatch(/La is below Lo/);
  });
  test('relative uncertainty of the primary result above 10 %: aiding/opposing at k = 0.005 (about 14 %)', () => {
    const d = deriveReading('aiding_opposing', { aidingInductance: 2 * 1.005, opposingInductance: 2 * 0.995 }, METERS, NONE);
    expect(d.warnings.join(' ')).toMatch(/mutual inductance M carries a relative standard uncertainty of 14 %, above 10 %/);
  });
  test('no uncertainty warning at 7 % (k = 0.01)', () => {
    const d = deriveReading('aiding_opposing', { aidingInductance: 2 * 1.01, opposingInductance: 2 * 0.99, txSelfInductance: 1, rxSelfInductance: 1 }, METERS, NONE);
    expect(d.warnings).toEqual([]);
  });
  test('Lsc = Loc: k = 0, whose spread over one uncertainty (about sqrt(2 x 0.001)) stands in for the first-order u', () => {
    const d = deriveReading('short_open', { shortInductance: 1e-5, openInductance: 1e-5 }, METERS, NONE);
    expect(d.coupling!.value).toBe(0);
    expect(Math.abs(d.coupling!.uncertainty - Math.sqrt(2 * 0.001)) / Math.sqrt(2 * 0.001)).toBeLessThan(1e-3);
    expect(d.warnings.join(' ')).toMatch(/coupling k came out as zero/);
  });
  test('open-circuit phase far from quadrature, and a missing phase against a negative prediction', () => {
    const raw = { frequency: 1e6, txCurrent: 1, rxVoltage: 1, txSelfInductance: 1e-5, rxSelfInductance: 1e-5 };
    expect(deriveReading('open_circuit', { ...raw, phaseDeg: 20 }, METERS, NONE).warnings.join(' ')).toMatch(/more than 30° from ±90°/);
    expect(deriveReading('open_circuit', { ...raw, phaseDeg: 95 }, METERS, NONE).warnings).toEqual([]);
    const predicted = { coupling: -0.1, txSelfInductance: 1e-5, rxSelfInductance: 1e-5 };
    expect(deriveReading('open_circuit', raw, METERS, { predicted }).warnings).toEqual([expect.stringMatching(/^No phase was entered/)]);
  });
});

describe('method fit before measuring (REFERENCES.md: M from aiding/opposing ~0.07 %/k, k from short/open ~7 % at k = 0.1)', () => {
  test('aiding/opposing is flagged at k = 0.01 with the expected 7.1 %, and suggests the better methods', () => {
    const warning = methodFitWarning('aiding_opposing', 0.01, DEFAULT_ACCURACY);
    expect(warning).toMatch(/about ±7\.1 %/);
    expect(warning).toMatch(/open-circuit-voltage or two-port method/);
  });
  test('aiding/opposing fits at k = 0.5', () => expect(methodFitWarning('aiding_opposing', 0.5, DEFAULT_ACCURACY)).toBeNull());
  test('short/open is flagged at k = 0.1 (about 7 %) and fits at k = 0.5', () => {
    expect(methodFitWarning('short_open', 0.1, DEFAULT_ACCURACY)).toMatch(/k to about ±7 %/);
    expect(methodFitWarning('short_open', -0.5, DEFAULT_ACCURACY)).toBeNull();
  });
  test('the sign of the predicted k does not matter; k = 0 cannot be resolved', () => {
    expect(expectedRelativeUncertainty('aiding_opposing', -0.01, DEFAULT_ACCURACY)).toBeCloseTo(0.0707, 4);
    expect(methodFitWarning('aiding_opposing', 0, DEFAULT_ACCURACY)).toMatch(/cannot resolve M/);
  });
  test('the expected uncertainty scales with the instrument: 1 % meters flag aiding/opposing even at k = 0.1', () => {
    expect(methodFitWarning('aiding_opposing', 0.1, { relative: 0.01, phaseDeg: 1 })).toMatch(/±7\.1 %/);
  });
  test('other methods never warn', () => {
    for (const method of ['open_circuit', 'two_port', 'split_peaks', 'direct_power'] as const) {
      expect(methodFitWarning(method, 0.001, DEFAULT_ACCURACY)).toBeNull();
    }
  });
});
