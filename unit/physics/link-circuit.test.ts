/**
 * Resonant link (src/physics/link-circuit.ts).
 */
import { qualityFactor, seriesSeriesOptimum, solveLink, tuningCapacitance, type LinkParameters } from '../../src/physics/link-circuit';
import type { Topology } from '../../src/physics/types';

const relErr = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);
/** REFERENCES.md prints eta to 10 digits. */
const PRINTED_10_DIGITS = 1e-9;
/** Power balance is exact up to rounding. */
const BALANCE_REL_TOL = 1e-12;

const f = 6.78e6;
const L = 10e-6;
const base = (topology: Topology, RL: number, k = 0.05): LinkParameters => ({
  frequencyHz: f, topology, L1: L, L2: L, M: k * L, R1: 0.5, R2: 0.5,
  C1: tuningCapacitance(L, f), C2: tuningCapacitance(L, f), sourceVoltage: 10, sourceResistance: 0.5, loadResistance: RL,
});

describe('series-series efficiency (Zargham & Gulak, IEEE TBioCAS 6(3), 2012; REFERENCES.md COMP rows)', () => {
  test.each([[1, 0.6655664112], [10, 0.9414862802], [50, 0.9379003963]])('RL = %p ohm -> eta %p', (RL, eta) => {
    expect(relErr(solveLink(base('SS', RL)).efficiency, eta)).toBeLessThan(PRINTED_10_DIGITS);
  });
  test('eta = X^2 RL / ((R2 + RL)(R1 (R2 + RL) + X^2)) for other values', () => {
    const p = { ...base('SS', 7, 0.013), R1: 0.3, R2: 0.8 };
    const X = 2 * Math.PI * f * p.M;
    const eta = (X * X * 7) / ((0.8 + 7) * (0.3 * (0.8 + 7) + X * X));
    expect(relErr(solveLink(p).efficiency, eta)).toBeLessThan(1e-12);
  });
  test('eta_max = 3 - 2 sqrt 2 = 0.1715728753 at k^2 Q1 Q2 = 1 (REFERENCES.md)', () => {
    expect(relErr(seriesSeriesOptimum(1, 1).maxEfficiency, 0.1715728753)).toBeLessThan(PRINTED_10_DIGITS);
  });
  test('RL_opt = R2 sqrt(1 + k^2 Q1 Q2) maximises the SS efficiency, reaching eta_max', () => {
    const p = base('SS', 1);
    const Q = qualityFactor(L, 0.5, f);
    const U2 = 0.05 ** 2 * Q * Q;
    const { optimalLoad, maxEfficiency } = seriesSeriesOptimum(U2, 0.5);
    const at = (RL: number) => solveLink({ ...p, loadResistance: RL }).efficiency;
    expect(relErr(at(optimalLoad), maxEfficiency)).toBeLessThan(1e-12);
    expect(at(optimalLoad * 1.01)).toBeLessThan(at(optimalLoad));
    expect(at(optimalLoad * 0.99)).toBeLessThan(at(optimalLoad));
  });
});

describe('energy conservation in every topology (no source needed: Tellegen)', () => {
  const cases: [Topology, number, number][] = [];
  for (const t of ['SS', 'SP', 'PS', 'PP'] as Topology[]) for (const RL of [1, 50, 2000]) for (const k of [0.01, 0.2]) cases.push([t, RL, k]);
  test.each(cases)('%s RL=%p k=%p: terminal power = coil losses + load; source = Rs loss + terminal', (t, RL, k) => {
    const r = solveLink(base(t, RL, k));
    expect(relErr(r.coilLoss1 + r.coilLoss2 + r.loadPower, r.inputPower)).toBeLessThan(BALANCE_REL_TOL);
    expect(relErr(r.inputPower + r.sourceCurrent ** 2 * 0.5, r.sourcePower)).toBeLessThan(BALANCE_REL_TOL);
    expect(r.efficiency).toBeGreaterThan(0);
    expect(r.efficiency).toBeLessThan(1);
  });
  test('series capacitor voltage is I / (w C); tuned C = 1/(w^2 L) (Thomson)', () => {
    const p = base('SS', 10);
    const r = solveLink(p);
    expect(relErr(r.txCapacitorVoltage, r.txCurrent / (2 * Math.PI * f * p.C1))).toBeLessThan(1e-12);
    expect(relErr(1 / (2 * Math.PI * Math.sqrt(L * p.C1)), f)).toBeLessThan(1e-12);
  });
});

describe('frequency splitting (REFERENCES.md: lossless identical resonators split to f0 / sqrt(1 +- k))', () => {
  test('SS rx current peaks near f0/sqrt(1+k) and f0/sqrt(1-k) for k >> 1/Q', () => {
    const k = 0.2;
    const p = { ...base('SS', 0.01, k), R1: 1e-3, R2: 1e-3, sourceResistance: 1e-3 };
    const freqs = Array.from({ length: 20001 }, (_, i) => f * (0.8 + (0.5 * i) / 20000));
    const current = freqs.map((fr) => solveLink({ ...p, frequencyHz: fr }).rxCurrent);
    const peaks: number[] = [];
    for (let i = 1; i < current.length - 1; i++) if (current[i] > current[i - 1] && current[i] >= current[i + 1]) peaks.push(freqs[i]);
    expect(peaks).toHaveLength(2);
    // grid spacing 0.5/20000 relative; peaks of this high-Q system sit within 1e-4 of the lossless values
    expect(relErr(peaks[0], f / Math.sqrt(1 + k))).toBeLessThan(1e-4);
    expect(relErr(peaks[1], f / Math.sqrt(1 - k))).toBeLessThan(1e-4);
  });
});
