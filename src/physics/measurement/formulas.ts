/**
 * The formula behind each measurement method, named and versioned so a stored reading says how its
 * derived numbers were obtained. Bump `version` whenever a formula or its uncertainty treatment changes
 * (uncertainties follow the GUM's first-order law, JCGM 100:2008, for every method).
 */
import type { MeasurementMethod } from './methods';
import type { FormulaRef } from './types';

const KEYSIGHT = 'Keysight (Agilent) Impedance Measurement Handbook, mutual inductance measurement';

export const FORMULAS: Record<MeasurementMethod, FormulaRef> = {
  open_circuit: {
    id: 'open-circuit-voltage',
    version: 1,
    name: 'Open-circuit voltage: M = |V2| / (\u03c9 |I1|), sign from the phase of V2 against I1; k = M / sqrt(L1 L2)',
    source: KEYSIGHT,
  },
  aiding_opposing: {
    id: 'series-aiding-opposing',
    version: 1,
    name: 'Series aiding and opposing: M = (La \u2212 Lo) / 4; k = M / sqrt(L1 L2)',
    source: KEYSIGHT,
  },
  short_open: {
    id: 'short-open',
    version: 1,
    name: 'Short and open: k = sqrt(1 \u2212 Lsc / Loc); M = k sqrt(Loc L2)',
    source: KEYSIGHT,
  },
  two_port: {
    id: 'two-port-impedance',
    version: 1,
    name: 'Two-port impedance: M = Im(Z21) / \u03c9, L1 = Im(Z11) / \u03c9, L2 = Im(Z22) / \u03c9; k = M / sqrt(L1 L2)',
    source: KEYSIGHT,
  },
  split_peaks: {
    id: 'split-peaks',
    version: 1,
    name: 'Split resonance peaks: k = (fh\u00b2 \u2212 fl\u00b2) / (fh\u00b2 + fl\u00b2); M = k sqrt(L1 L2)',
    source:
      'Coupled-resonator frequency splitting: identical lossless resonators peak at f0 / sqrt(1 \u00b1 k); listed with the ' +
      'mutual-inductance methods of the Keysight (Agilent) Impedance Measurement Handbook',
  },
  direct_power: {
    id: 'direct-power',
    version: 1,
    name: 'Direct power: \u03b7 = Pout / Pin, with P = V I cos \u03c6 (rms) where no power meter was used',
    source: 'Definition of efficiency \u03b7 = Pout / Pin; real power of sinusoidal rms phasors P = V I cos \u03c6',
  },
};
