/**
 * Derivations of M, k and efficiency from raw readings (src/physics/measurement/derive.ts): each formula
 * of REFERENCES.md "Measurement methods" (Keysight (Agilent) Impedance Measurement Handbook, mutual
 * inductance), round trips from a known link, and the GUM uncertainty of each result.
 */
import { FORMULAS, deriveReading } from '../../../src/physics/measurement/derive';
import { MEASUREMENT_METHODS, type InstrumentAccuracy } from '../../../src/physics/measurement/methods';
import type { DerivationContext } from '../../../src/physics/measurement/types';
import { solveLink, tuningCapacitance } from '../../../src/physics/link-circuit';

const relErr = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);
/** Closed forms evaluated two ways agree to rounding. */
const EXACT = 1e-12;
/** Central-difference sensitivities are good to about eps^(2/3). */
const DIFFERENCE_TOL = 1e-8;

// The link of REFERENCES.md "Two-coil resonant link": 6.78 MHz, L1 = L2 = 10 uH, R = 0.5 ohm, k = 0.05.
const f = 6.78e6;
const w = 2 * Math.PI * f;
const L1 = 10e-6;
const L2 = 10e-6;
const k = 0.05;
const M = k * Math.sqrt(L1 * L2);

const NONE: DerivationContext = { predicted: null };
const EXACT_METERS: InstrumentAccuracy = { relative: 0, phaseDeg: 0 };
const METERS: InstrumentAccuracy = { relative: 0.001, phaseDeg: 0.5 };
const measuredLs = { txSelfInductance: L1, rxSelfInductance: L2 };

describe('formula references', () => {
  test('one versioned formula per method, with its source', () => {
    for (const method of MEASUREMENT_METHODS) {
      expect(FORMULAS[method].version).toBe(1);
      expect(FORMULAS[method].source.length).toBeGreaterThan(20);
    }
    expect(new Set(Object.values(FORMULAS).map((x) => x.id)).size).toBe(MEASUREMENT_METHODS.length);
    expect(FORMULAS.open_circuit.source).toMatch(/Keysight \(Agilent\) Impedance Measurement Handbook/);
  });
});

describe('open-circuit voltage: M = |V2| / (omega |I1|) (Keysight Impedance Measurement Handbook, mutual inductance)', () => {
  const raw = { frequency: f, txCurrent: 0.8, rxVoltage: w * M * 0.8, ...measuredLs };
  test('recovers M and k of the REFERENCES link', () => {
    const d = deriveReading('open_circuit', { ...raw, phaseDeg: 90 }, EXACT_METERS, NONE);
    expect(relErr(d.mutualInductance!.value, M)).toBeLessThan(EXACT);
    expect(relErr(d.coupling!.value, k)).toBeLessThan(EXACT);
    expect(d.selfInductanceSource).toBe('measured');
    expect(d.formula).toBe(FORMULAS.open_circuit);
    expect(d.warnings).toEqual([]);
  });
  test('the sign follows sin(phase): V2 lagging I1 by 90 degrees is negative M', () => {
    expect(deriveReading('open_circuit', { ...raw, phaseDeg: -90 }, EXACT_METERS, NONE).mutualInductance!.value).toBeLessThan(0);
    expect(deriveReading('open_circuit', { ...raw, phaseDeg: 270 }, EXACT_METERS, NONE).coupling!.value).toBeLessThan(0);
    expect(deriveReading('open_circuit', raw, EXACT_METERS, NONE).mutualInductance!.value).toBeGreaterThan(0);
  });
  test('u(M)/M = sqrt(3) u_rel from V2, I1 and f (GUM 5.1.6); k adds the measured L1, L2 at power 1/2', () => {
    const d = deriveReading('open_circuit', { ...raw, phaseDeg: 80 }, METERS, NONE);
    expect(relErr(d.mutualInductance!.uncertainty / M, Math.sqrt(3) * 0.001)).toBeLessThan(DIFFERENCE_TOL);
    expect(relErr(d.coupling!.uncertainty / k, Math.sqrt(3.5) * 0.001)).toBeLessThan(DIFFERENCE_TOL);
  });
  test('predicted self-inductances give k, treated as exact, and say so', () => {
    const predicted = { coupling: 0.04, txSelfInductance: L1, rxSelfInductance: L2 };
    const d = deriveReading('open_circuit', { frequency: f, txCurrent: 0.8, rxVoltage: w * M * 0.8 }, METERS, { predicted });
    expect(d.selfInductanceSource).toBe('predicted');
    expect(relErr(d.coupling!.uncertainty / k, Math.sqrt(3) * 0.001)).toBeLessThan(DIFFERENCE_TOL);
    expect(d.warnings.join(' ')).toMatch(/predicted L1 and L2, taken as exact/);
  });
  test('one measured and one predicted self-inductance: mixed, reported as predicted, naming the predicted one', () => {
    const predicted = { coupling: 0.04, txSelfInductance: 99, rxSelfInductance: L2 };
    const d = deriveReading('open_circuit', { frequency: f, txCurrent: 0.8, rxVoltage: w * M * 0.8, txSelfInductance: L1 }, METERS, { predicted });
    expect(relErr(d.coupling!.value, k)).toBeLessThan(EXACT);
    expect(d.selfInductanceSource).toBe('predicted');
    expect(d.warnings.join(' ')).toMatch(/predicted L2,/);
  });
  test('no self-inductances: M only, k null, source none', () => {
    const d = deriveReading('open_circuit', { frequency: f, txCurrent: 0.8, rxVoltage: 1 }, METERS, NONE);
    expect(d.coupling).toBeNull();
    expect(d.selfInductanceSource).toBe('none');
    expect(d.warnings.join(' ')).toMatch(/needs L1 and L2/);
  });
});

describe('series aiding/opposing: M = (La - Lo) / 4 (Keysight Impedance Measurement Handbook, mutual inductance)', () => {
  test('La = L1 + L2 + 2M, Lo = L1 + L2 - 2M recovers M and k', () => {
    const d = deriveReading('aiding_opposing', { aidingInductance: L1 + L2 + 2 * M, opposingInductance: L1 + L2 - 2 * M, ...measuredLs }, EXACT_METERS, NONE);
    expect(relErr(d.mutualInductance!.value, M)).toBeLessThan(1e-9);
    expect(relErr(d.coupling!.value, k)).toBeLessThan(1e-9);
  });
  test('0.1 % meters at k = 0.01: about 7 % on M (REFERENCES.md), exactly 0.001 sqrt(8 (1 + k^2)) / (4 k)', () => {
    const kk = 0.01;
    const d = deriveReading('aiding_opposing', { aidingInductance: 2 * (1 + kk), opposingInductance: 2 * (1 - kk) }, { relative: 0.001, phaseDeg: 0 }, NONE);
    const relative = d.mutualInductance!.uncertainty / d.mutualInductance!.value;
    expect(relErr(relative, (0.001 * Math.sqrt(8 * (1 + kk * kk))) / (4 * kk))).toBeLessThan(1e-6);
    expect(Math.abs(relative - 0.07)).toBeLessThan(0.002);
  });
});

describe('short/open: k = sqrt(1 - Lsc / Loc) (Keysight Impedance Measurement Handbook, mutual inductance)', () => {
  test('Loc = L1, Lsc = L1 (1 - k^2) recovers k, and M = k sqrt(Loc L2)', () => {
    const d = deriveReading('short_open', { openInductance: L1, shortInductance: L1 * (1 - k * k), rxSelfInductance: L2 }, EXACT_METERS, NONE);
    expect(relErr(d.coupling!.value, k)).toBeLessThan(1e-9);
    expect(relErr(d.mutualInductance!.value, M)).toBeLessThan(1e-9);
    expect(d.selfInductanceSource).toBe('measured');
  });
  test('0.1 % meters at k = 0.1: about 7 % on k (REFERENCES.md), exactly (1 - k^2) sqrt(2) 0.001 / (2 k^2)', () => {
    const kk = 0.1;
    const d = deriveReading('short_open', { openInductance: 1, shortInductance: 1 - kk * kk }, { relative: 0.001, phaseDeg: 0 }, NONE);
    const relative = d.coupling!.uncertainty / d.coupling!.value;
    expect(relErr(relative, ((1 - kk * kk) * Math.SQRT2 * 0.001) / (2 * kk * kk))).toBeLessThan(1e-6);
    expect(Math.abs(relative - 0.07)).toBeLessThan(0.002);
  });
  test('L2 from the prediction when not measured; the unmeasured sign is noted when the prediction is negative', () => {
    const predicted = { coupling: -k, txSelfInductance: L1, rxSelfInductance: L2 };
    const d = deriveReading('short_open', { openInductance: L1, shortInductance: L1 * (1 - k * k) }, METERS, { predicted });
    expect(d.selfInductanceSource).toBe('predicted');
    expect(relErr(d.mutualInductance!.value, M)).toBeLessThan(1e-9);
    expect(d.coupling!.value).toBeGreaterThan(0);
    expect(d.warnings.join(' ')).toMatch(/magnitude of the coupling, not its sign/);
  });
});

describe('two-port impedance: M = Im(Z21) / omega, L = Im(Zii) / omega (Keysight Impedance Measurement Handbook, mutual inductance)', () => {
  // series-coupled inductors: Z11 = R1 + j w L1, Z21 = j w M, Z22 = R2 + j w L2
  const raw = { frequency: f, z11Re: 0.5, z11Im: w * L1, z21Re: 0, z21Im: w * M, z22Re: 0.5, z22Im: w * L2 };
  test('recovers M and k, self-inductances measured by the method itself', () => {
    const d = deriveReading('two_port', raw, EXACT_METERS, NONE);
    expect(relErr(d.mutualInductance!.value, M)).toBeLessThan(EXACT);
    expect(relErr(d.coupling!.value, k)).toBeLessThan(EXACT);
    expect(d.selfInductanceSource).toBe('measured');
  });
  test('u(M)/M = sqrt(2) u_rel; u(k)/k = sqrt(1 + 1/4 + 1/4) u_rel, omega cancelling (GUM 5.1.6)', () => {
    const d = deriveReading('two_port', raw, METERS, NONE);
    expect(relErr(d.mutualInductance!.uncertainty / M, Math.SQRT2 * 0.001)).toBeLessThan(DIFFERENCE_TOL);
    expect(relErr(d.coupling!.uncertainty / k, Math.sqrt(1.5) * 0.001)).toBeLessThan(DIFFERENCE_TOL);
  });
});

describe('split peaks: k = (fh^2 - fl^2) / (fh^2 + fl^2) (REFERENCES.md, coupled resonators)', () => {
  test('lossless identical resonators split to f0 / sqrt(1 +- k) (REFERENCES.md two-coil section): k recovered', () => {
    for (const kk of [0.01, 0.05, 0.3, 0.9]) {
      const d = deriveReading('split_peaks', { lowPeak: f / Math.sqrt(1 + kk), highPeak: f / Math.sqrt(1 - kk), ...measuredLs }, EXACT_METERS, NONE);
      expect(relErr(d.coupling!.value, kk)).toBeLessThan(EXACT);
      expect(relErr(d.mutualInductance!.value, kk * L1)).toBeLessThan(EXACT);
    }
  });
  test('the peaks of the link solver at k = 0.2, low loss, give k within 1e-3', () => {
    const kk = 0.2;
    const C = tuningCapacitance(L1, f);
    const p = { frequencyHz: f, topology: 'SS' as const, L1, L2, M: kk * L1, R1: 1e-3, R2: 1e-3, C1: C, C2: C, sourceVoltage: 1, sourceResistance: 1e-3, loadResistance: 0.01 };
    const freqs = Array.from({ length: 20001 }, (_, i) => f * (0.8 + (0.5 * i) / 20000));
    const current = freqs.map((fr) => solveLink({ ...p, frequencyHz: fr }).rxCurrent);
    const peaks = freqs.filter((_, i) => i > 0 && i < freqs.length - 1 && current[i] > current[i - 1] && current[i] >= current[i + 1]);
    expect(peaks).toHaveLength(2);
    const d = deriveReading('split_peaks', { lowPeak: peaks[0], highPeak: peaks[1] }, EXACT_METERS, NONE);
    expect(Math.abs(d.coupling!.value - kk)).toBeLessThan(1e-3);
  });
  test('u(k) from dk/dfh = 4 fh fl^2 / S^2, dk/dfl = -4 fl fh^2 / S^2, S = fh^2 + fl^2 (GUM 5.1.2)', () => {
    const fl = 6.5e6;
    const fh = 7.1e6;
    const d = deriveReading('split_peaks', { lowPeak: fl, highPeak: fh }, METERS, NONE);
    const s = fh * fh + fl * fl;
    const dkdfh = (4 * fh * fl * fl) / (s * s);
    const dkdfl = (-4 * fl * fh * fh) / (s * s);
    expect(relErr(d.coupling!.uncertainty, Math.hypot(dkdfh * fh * 0.001, dkdfl * fl * 0.001))).toBeLessThan(DIFFERENCE_TOL);
    expect(d.mutualInductance).toBeNull();
    expect(d.selfInductanceSource).toBe('none');
  });
});

describe('direct power: eta = Pout / Pin, P = V I cos(phi) (definition)', () => {
  test('the powers of the REFERENCES link at RL = 10 ohm give eta = 0.9414862802 (Zargham & Gulak 2012, COMP)', () => {
    const C = tuningCapacitance(L1, f);
    const r = solveLink({ frequencyHz: f, topology: 'SS', L1, L2, M, R1: 0.5, R2: 0.5, C1: C, C2: C, sourceVoltage: 10, sourceResistance: 0.5, loadResistance: 10 });
    const d = deriveReading('direct_power', { inputPower: r.inputPower, outputPower: r.loadPower }, METERS, NONE);
    expect(relErr(d.efficiency!.value, 0.9414862802)).toBeLessThan(1e-9);
    expect(relErr(d.efficiency!.uncertainty / d.efficiency!.value, Math.SQRT2 * 0.001)).toBeLessThan(DIFFERENCE_TOL);
    expect(d.mutualInductance).toBeNull();
    expect(d.coupling).toBeNull();
  });
  test('from V, I and phase at both ports: (5 x 1.2 x cos 0) / (10 x 2 x cos 60 deg) = 0.6', () => {
    const d = deriveReading('direct_power', { txVoltage: 10, txCurrent: 2, txPhaseDeg: 60, rxVoltage: 5, rxCurrent: 1.2 }, METERS, NONE);
    expect(relErr(d.efficiency!.value, 0.6)).toBeLessThan(EXACT);
  });
  test('the input phase enters the uncertainty by d cos(phi) = -sin(phi) dphi (GUM 5.1.2)', () => {
    const d = deriveReading('direct_power', { txVoltage: 10, txCurrent: 2, txPhaseDeg: 60, rxVoltage: 5, rxCurrent: 1.2 }, { relative: 0, phaseDeg: 0.5 }, NONE);
    const tan60 = Math.tan((60 * Math.PI) / 180);
    expect(relErr(d.efficiency!.uncertainty, 0.6 * tan60 * ((0.5 * Math.PI) / 180))).toBeLessThan(DIFFERENCE_TOL);
  });
  test('eta above 1 is kept and warned about', () => {
    const d = deriveReading('direct_power', { inputPower: 10, outputPower: 10.5 }, METERS, NONE);
    expect(d.efficiency!.value).toBeCloseTo(1.05, 12);
    expect(d.warnings.join(' ')).toMatch(/above 1: check the meters\u2019 calibration and connections/);
  });
});
