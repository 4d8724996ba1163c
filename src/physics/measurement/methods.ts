/**
 * The bench's measurement methods and the raw inputs each one takes. One table drives the reading
 * form, the CSV column mapping, the server's validation and the derivations, so they cannot disagree.
 * Values are SI (hertz, volts rms, amperes rms, henries, ohms, watts) except phases, in degrees.
 * Pure data: imported by the browser and the server alike.
 */

export const MEASUREMENT_METHODS = [
  'open_circuit',
  'aiding_opposing',
  'short_open',
  'two_port',
  'split_peaks',
  'direct_power',
] as const;
export type MeasurementMethod = (typeof MEASUREMENT_METHODS)[number];

/** The unit kind of a raw field; the names match src/lib/units QuantityKind. */
export type RawFieldKind = 'frequency' | 'voltage' | 'current' | 'inductance' | 'resistance' | 'angle' | 'power';

export interface RawFieldSpec {
  /** key in RawReading */
  key: string;
  label: string;
  kind: RawFieldKind;
  required: boolean;
  /** one line for the form's hint and the CSV data dictionary */
  hint: string;
}

export interface MethodSpec {
  id: MeasurementMethod;
  label: string;
  /** what the method yields */
  yields: readonly ('mutualInductance' | 'coupling' | 'efficiency')[];
  summary: string;
  fields: readonly RawFieldSpec[];
  /**
   * Groups of fields of which at least one group must be complete (direct power takes either the
   * two powers, or voltages and currents at both ports). Absent: the `required` flags say it all.
   */
  alternatives?: readonly (readonly string[])[];
}

/** The raw inputs of one reading, keyed by RawFieldSpec.key, in SI (phases in degrees). */
export type RawReading = Record<string, number>;

const selfInductances = (hint: string): RawFieldSpec[] => [
  { key: 'txSelfInductance', label: 'L1, transmitter', kind: 'inductance', required: false, hint },
  { key: 'rxSelfInductance', label: 'L2, receiver', kind: 'inductance', required: false, hint },
];

const MEASURED_L_HINT = 'Measured alone; used for k = M / sqrt(L1 L2). Leave empty to use the predicted value.';

export const METHOD_SPECS: Record<MeasurementMethod, MethodSpec> = {
  open_circuit: {
    id: 'open_circuit',
    label: 'Open-circuit voltage',
    yields: ['mutualInductance', 'coupling'],
    summary: 'Drive the transmitter, read its current and the open receiver\u2019s voltage: M = |V2| / (\u03c9 |I1|).',
    fields: [
      { key: 'frequency', label: 'Frequency f', kind: 'frequency', required: true, hint: 'Drive frequency at the time of the reading.' },
      { key: 'txVoltage', label: 'V1, transmitter voltage', kind: 'voltage', required: false, hint: 'rms voltage across the transmitter coil (kept for the record).' },
      { key: 'txCurrent', label: 'I1, transmitter current', kind: 'current', required: true, hint: 'rms current into the transmitter coil.' },
      { key: 'rxVoltage', label: 'V2, receiver open-circuit voltage', kind: 'voltage', required: true, hint: 'rms voltage across the open receiver terminals.' },
      { key: 'phaseDeg', label: 'Phase of V2 against I1', kind: 'angle', required: false, hint: 'Near +90\u00b0 for positive M, near \u221290\u00b0 for negative M; empty takes M as positive.' },
      ...selfInductances(MEASURED_L_HINT),
    ],
  },
  aiding_opposing: {
    id: 'aiding_opposing',
    label: 'Series aiding and opposing',
    yields: ['mutualInductance', 'coupling'],
    summary: 'Both coils in series, once aiding and once opposing: M = (La \u2212 Lo) / 4. Imprecise at low k.',
    fields: [
      { key: 'aidingInductance', label: 'La, series aiding', kind: 'inductance', required: true, hint: 'Inductance of the two coils in series, fields adding.' },
      { key: 'opposingInductance', label: 'Lo, series opposing', kind: 'inductance', required: true, hint: 'The same with one coil\u2019s leads swapped.' },
      ...selfInductances(MEASURED_L_HINT),
    ],
  },
  short_open: {
    id: 'short_open',
    label: 'Short and open',
    yields: ['coupling', 'mutualInductance'],
    summary: 'Inductance of one coil with the other shorted, then open: k = sqrt(1 \u2212 Lsc / Loc). Imprecise at low k.',
    fields: [
      { key: 'shortInductance', label: 'Lsc, other coil shorted', kind: 'inductance', required: true, hint: 'Inductance seen at the transmitter with the receiver shorted.' },
      { key: 'openInductance', label: 'Loc, other coil open', kind: 'inductance', required: true, hint: 'Inductance seen at the transmitter with the receiver open (this is L1).' },
      { key: 'rxSelfInductance', label: 'L2, receiver', kind: 'inductance', required: false, hint: 'Measured alone; used for M = k sqrt(Loc L2). Leave empty to use the predicted value.' },
    ],
  },
  two_port: {
    id: 'two_port',
    label: 'Two-port impedance',
    yields: ['mutualInductance', 'coupling'],
    summary: 'Z-parameters at f, typed in or from an uploaded Touchstone .s2p file: M = Im(Z21) / \u03c9, L = Im(Zii) / \u03c9.',
    fields: [
      { key: 'frequency', label: 'Frequency f', kind: 'frequency', required: true, hint: 'Frequency of the Z-parameters.' },
      { key: 'z11Re', label: 'Re Z11', kind: 'resistance', required: true, hint: 'Transmitter port, real part.' },
      { key: 'z11Im', label: 'Im Z11', kind: 'resistance', required: true, hint: 'Transmitter port, imaginary part.' },
      { key: 'z21Re', label: 'Re Z21', kind: 'resistance', required: true, hint: 'Transfer impedance, real part.' },
      { key: 'z21Im', label: 'Im Z21', kind: 'resistance', required: true, hint: 'Transfer impedance, imaginary part.' },
      { key: 'z22Re', label: 'Re Z22', kind: 'resistance', required: true, hint: 'Receiver port, real part.' },
      { key: 'z22Im', label: 'Im Z22', kind: 'resistance', required: true, hint: 'Receiver port, imaginary part.' },
    ],
  },
  split_peaks: {
    id: 'split_peaks',
    label: 'Split resonance peaks',
    yields: ['coupling', 'mutualInductance'],
    summary: 'Two tuned coils split into two peaks: k = (fh\u00b2 \u2212 fl\u00b2) / (fh\u00b2 + fl\u00b2).',
    fields: [
      { key: 'lowPeak', label: 'fl, lower peak', kind: 'frequency', required: true, hint: 'Frequency of the lower transfer peak.' },
      { key: 'highPeak', label: 'fh, upper peak', kind: 'frequency', required: true, hint: 'Frequency of the upper transfer peak.' },
      ...selfInductances('Measured alone; used for M = k sqrt(L1 L2). Leave empty to use the predicted value.'),
    ],
  },
  direct_power: {
    id: 'direct_power',
    label: 'Direct power',
    yields: ['efficiency'],
    summary: 'Power into the transmitter and into the load: \u03b7 = Pout / Pin, from power meters or from V and I at both ports.',
    fields: [
      { key: 'inputPower', label: 'Pin, into the transmitter', kind: 'power', required: false, hint: 'Real power at the transmitter terminals (after the source resistance).' },
      { key: 'outputPower', label: 'Pout, into the load', kind: 'power', required: false, hint: 'Real power in the load.' },
      { key: 'txVoltage', label: 'V1, transmitter voltage', kind: 'voltage', required: false, hint: 'rms, at the transmitter terminals.' },
      { key: 'txCurrent', label: 'I1, transmitter current', kind: 'current', required: false, hint: 'rms, into the transmitter terminals.' },
      { key: 'txPhaseDeg', label: 'Phase of I1 against V1', kind: 'angle', required: false, hint: 'Empty means in phase (a tuned, resistive input).' },
      { key: 'rxVoltage', label: 'V2, load voltage', kind: 'voltage', required: false, hint: 'rms, across the load.' },
      { key: 'rxCurrent', label: 'I2, load current', kind: 'current', required: false, hint: 'rms, through the load.' },
      { key: 'rxPhaseDeg', label: 'Phase of I2 against V2', kind: 'angle', required: false, hint: 'Empty means in phase (a resistive load).' },
    ],
    alternatives: [
      ['inputPower', 'outputPower'],
      ['txVoltage', 'txCurrent', 'rxVoltage', 'rxCurrent'],
    ],
  },
};

export function isMeasurementMethod(value: unknown): value is MeasurementMethod {
  return typeof value === 'string' && (MEASUREMENT_METHODS as readonly string[]).includes(value);
}

/** The instrument's accuracy as the student enters it, applied to every raw value of the reading. */
export interface InstrumentAccuracy {
  /** relative standard uncertainty of magnitudes (voltages, currents, inductances, powers, impedances, frequencies), e.g. 0.001 for 0.1 % */
  relative: number;
  /** standard uncertainty of phase readings [degrees] */
  phaseDeg: number;
}

export const DEFAULT_ACCURACY: InstrumentAccuracy = { relative: 0.001, phaseDeg: 0.5 };
