import type { QuantityKind } from './quantity';

interface Step {
  factor: number;
  prefix: string;
  /** smallest magnitude written with this prefix [SI unit]; the factor itself when absent */
  from?: number;
}

/** Engineering prefixes, largest first; the micro sign is U+00B5 as on instrument panels. */
const ENGINEERING: readonly Step[] = [
  { factor: 1e9, prefix: 'G' },
  { factor: 1e6, prefix: 'M' },
  { factor: 1e3, prefix: 'k' },
  { factor: 1, prefix: '' },
  { factor: 1e-3, prefix: 'm' },
  { factor: 1e-6, prefix: '\u00b5' },
  { factor: 1e-9, prefix: 'n' },
  { factor: 1e-12, prefix: 'p' },
];

/**
 * Lengths as a bench reads them: centimetres for coil sizes, millimetres for wire down to a tenth
 * ("0.8 mm", as wire is sold, not "800 µm"), no kilometres.
 */
const LENGTH: readonly Step[] = [
  { factor: 1, prefix: '' },
  { factor: 1e-2, prefix: 'c' },
  { factor: 1e-3, prefix: 'm', from: 1e-4 },
  { factor: 1e-6, prefix: '\u00b5' },
  { factor: 1e-9, prefix: 'n' },
];

const SYMBOL: Record<QuantityKind, string> = {
  length: 'm',
  frequency: 'Hz',
  inductance: 'H',
  resistance: '\u03a9',
  capacitance: 'F',
  voltage: 'V',
  current: 'A',
  power: 'W',
  angle: '\u00b0',
};

/** Frequencies are never written in millihertz in this field: 0.5 Hz stays "0.5 Hz". */
const STEPS: Record<QuantityKind, readonly Step[]> = {
  length: LENGTH,
  frequency: ENGINEERING.filter((step) => step.factor >= 1),
  inductance: ENGINEERING,
  resistance: ENGINEERING,
  capacitance: ENGINEERING,
  voltage: ENGINEERING,
  current: ENGINEERING,
  power: ENGINEERING,
  // phase angles are read in plain degrees ("-89.5°"), never "m°"
  angle: [{ factor: 1, prefix: '' }],
};

/** Significant digits by default: enough for 13.56 MHz or a typed 1.0237 mm, without float noise. */
export const DEFAULT_DIGITS = 6;

/**
 * An SI value as people write it, with the largest prefix that keeps the number at 1 or more (lengths:
 * see LENGTH):
 * 0.12 m -> "12 cm", 6.78e6 Hz -> "6.78 MHz", 1e-5 H -> "10 µH", 0.5 ohm -> "500 mΩ". Trailing zeros
 * are dropped. The result parses back with parseQuantity to the same value (at `digits`).
 */
export function formatQuantity(value: number, kind: QuantityKind, digits = DEFAULT_DIGITS): string {
  if (!Number.isFinite(value)) return '—';
  const steps = STEPS[kind];
  const magnitude = Math.abs(Number(value.toPrecision(digits)));
  if (magnitude === 0) return `0 ${SYMBOL[kind]}`;
  const step = steps.find(({ factor, from = factor }) => magnitude >= from * (1 - 1e-12)) ?? steps[steps.length - 1];
  const scaled = value / step.factor;
  return `${Number(scaled.toPrecision(digits))} ${step.prefix}${SYMBOL[kind]}`;
}

export const formatLength = (metres: number, digits?: number) => formatQuantity(metres, 'length', digits);
export const formatFrequency = (hertz: number, digits?: number) => formatQuantity(hertz, 'frequency', digits);
export const formatInductance = (henries: number, digits?: number) => formatQuantity(henries, 'inductance', digits);
export const formatResistance = (ohms: number, digits?: number) => formatQuantity(ohms, 'resistance', digits);
export const formatCapacitance = (farads: number, digits?: number) => formatQuantity(farads, 'capacitance', digits);
