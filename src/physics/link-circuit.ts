/**
 * Two-coil resonant link as a phasor network (rms phasors). Coil equations
 *   V1 = (R1 + j w L1) I1 + j w M I2,   V2 = j w M I1 + (R2 + j w L2) I2,
 * with I2 entering coil 2's dotted terminal. Transmitter capacitor C1 in series with the coil (S) or
 * across its terminals (P), driven by a source V with internal resistance Rs; receiver capacitor C2 in
 * series with the load RL (S) or across it (P). Standard two-port treatment (e.g. C.-S. Wang, G. A. Covic,
 * O. H. Stielau, IEEE Trans. Ind. Electron. 51(1), 2004, for the four topologies).
 */
import { abs, abs2, add, conj, cx, div, mul, neg, parallel, scale, type Complex } from './complex';
import type { Topology } from './types';

export interface LinkParameters {
  frequencyHz: number;
  topology: Topology;
  /** [H] */
  L1: number;
  L2: number;
  M: number;
  /** coil series resistances [ohm] */
  R1: number;
  R2: number;
  /** capacitors [F] */
  C1: number;
  C2: number;
  /** [V rms] */
  sourceVoltage: number;
  /** [ohm] */
  sourceResistance: number;
  loadResistance: number;
}

export interface LinkResult {
  /** load power over the real power entering the transmitter terminals [-] */
  efficiency: number;
  /** [W] */
  loadPower: number;
  inputPower: number;
  sourcePower: number;
  coilLoss1: number;
  coilLoss2: number;
  /** coil currents [A rms] */
  txCurrent: number;
  rxCurrent: number;
  sourceCurrent: number;
  /** [V rms] */
  txCapacitorVoltage: number;
  rxCapacitorVoltage: number;
  loadVoltage: number;
  /** complex coil current phasors [A rms] for Biot-Savart */
  txCurrentPhasor: Complex;
  rxCurrentPhasor: Complex;
}

/** Capacitance resonating L at f: C = 1 / (w^2 L) [F] (Thomson's resonance condition). */
export function tuningCapacitance(inductance: number, frequencyHz: number): number {
  const w = 2 * Math.PI * frequencyHz;
  return 1 / (w * w * inductance);
}

/** Solve the link network at one frequency. Efficiency does not depend on V; it is computed at V = 1. */
export function solveLink(p: LinkParameters): LinkResult {
  const w = 2 * Math.PI * p.frequencyHz;
  const zC1 = cx(0, -1 / (w * p.C1));
  const zC2 = cx(0, -1 / (w * p.C2));
  const rl = cx(p.loadResistance);
  const jwM = cx(0, w * p.M);
  // receiver: what coil 2 sees at its terminals
  const zLoad = p.topology[1] === 'S' ? add(zC2, rl) : parallel(zC2, rl);
  const z22 = add(cx(p.R2, w * p.L2), zLoad);
  // coil 1 seen at its terminals, with the reflected impedance (w M)^2 / Z22
  const zCoil1 = add(cx(p.R1, w * p.L1), div(cx(w * p.M * w * p.M), z22));
  const zTerminals = p.topology[0] === 'S' ? add(zC1, zCoil1) : parallel(zC1, zCoil1);
  const unit = cx(1);
  const iSource = div(unit, add(cx(p.sourceResistance), zTerminals));
  const vTerminals = mul(iSource, zTerminals);
  const i1 = p.topology[0] === 'S' ? iSource : div(vTerminals, zCoil1);
  const i2 = neg(div(mul(jwM, i1), z22));
  const vLoad = mul(neg(i2), zLoad); // across the receiver's capacitor-load network
  const loadVoltage = p.topology[1] === 'S' ? abs(i2) * p.loadResistance : abs(vLoad);
  const s = p.sourceVoltage;
  const inputPower = mul(vTerminals, conj(iSource)).re;
  const loadPower = (loadVoltage * loadVoltage) / p.loadResistance;
  return {
    efficiency: inputPower > 0 ? loadPower / inputPower : 0,
    loadPower: s * s * loadPower,
    inputPower: s * s * inputPower,
    sourcePower: s * s * iSource.re,
    coilLoss1: s * s * abs2(i1) * p.R1,
    coilLoss2: s * s * abs2(i2) * p.R2,
    txCurrent: s * abs(i1),
    rxCurrent: s * abs(i2),
    sourceCurrent: s * abs(iSource),
    txCapacitorVoltage: s * (p.topology[0] === 'S' ? abs(mul(i1, zC1)) : abs(vTerminals)),
    rxCapacitorVoltage: s * (p.topology[1] === 'S' ? abs(mul(i2, zC2)) : abs(vLoad)),
    loadVoltage: s * loadVoltage,
    txCurrentPhasor: scale(i1, s),
    rxCurrentPhasor: scale(i2, s),
  };
}

/** Coil quality factor Q = w L / R [-]. */
export function qualityFactor(inductance: number, resistance: number, frequencyHz: number): number {
  return (2 * Math.PI * frequencyHz * inductance) / resistance;
}

/**
 * Series-series textbook optimum for a figure of merit U^2 = k^2 Q1 Q2 (M. Zargham and P. G. Gulak,
 * IEEE Trans. Biomed. Circuits Syst. 6(3), 2012): RL_opt = R2 sqrt(1 + U^2),
 * eta_max = U^2 / (1 + sqrt(1 + U^2))^2.
 */
export function seriesSeriesOptimum(figureOfMerit: number, R2: number): { optimalLoad: number; maxEfficiency: number } {
  const root = Math.sqrt(1 + figureOfMerit);
  return { optimalLoad: R2 * root, maxEfficiency: figureOfMerit / ((1 + root) * (1 + root)) };
}
