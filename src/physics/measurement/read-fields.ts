/**
 * Reading a RawReading's values for a derivation: presence, finiteness and sign checks that fail with a
 * ReadingInputError naming the field, and the choice of self-inductances (measured or predicted) that
 * turn M into k or k into M. Also the short number formats used in the messages.
 */
import { METHOD_SPECS, type MeasurementMethod, type RawReading } from './methods';
import { ReadingInputError, type PredictedForDerivation } from './types';

export interface FieldReader {
  /** the value, or undefined when the field is empty */
  optional(key: string): number | undefined;
  required(key: string): number;
  /** a required value above zero; `why` completes "must be above zero" */
  positive(key: string, why?: string): number;
  /** a required value of zero or more */
  nonNegative(key: string, why?: string): number;
  label(key: string): string;
}

export function fieldReader(method: MeasurementMethod, raw: RawReading): FieldReader {
  const label = (key: string) => METHOD_SPECS[method].fields.find((f) => f.key === key)?.label ?? key;
  const optional = (key: string): number | undefined => {
    const value: unknown = raw[key];
    if (value === undefined || value === null) return undefined;
    if (typeof value !== 'number' || !Number.isFinite(value)) {
      throw new ReadingInputError(key, `${label(key)} must be a finite number.`);
    }
    return value;
  };
  const required = (key: string): number => {
    const value = optional(key);
    if (value === undefined) throw new ReadingInputError(key, `${label(key)} is required for this method.`);
    return value;
  };
  return {
    optional,
    required,
    label,
    positive(key, why) {
      const value = required(key);
      if (!(value > 0)) throw new ReadingInputError(key, `${label(key)} must be above zero${why ? `: ${why}` : ''} (got ${value}).`);
      return value;
    },
    nonNegative(key, why) {
      const value = required(key);
      if (value < 0) throw new ReadingInputError(key, `${label(key)} must not be negative${why ? `: ${why}` : ''} (got ${value}).`);
      return value;
    },
  };
}

export type SelfInductanceKey = 'txSelfInductance' | 'rxSelfInductance';

export interface SelfInductance {
  /** [H] */
  value: number;
  measured: boolean;
}

/**
 * A coil's self-inductance: the measured one when the reading has it, else the prediction's, else null.
 * Mixing (one measured, one predicted) is allowed: each coil takes the best value there is.
 */
export function selfInductance(
  read: FieldReader,
  key: SelfInductanceKey,
  predicted: PredictedForDerivation | null,
): SelfInductance | null {
  const measured = read.optional(key);
  if (measured !== undefined) {
    if (!(measured > 0)) throw new ReadingInputError(key, `${read.label(key)} must be above zero (got ${measured}).`);
    return { value: measured, measured: true };
  }
  const value = predicted?.[key];
  if (value !== undefined && Number.isFinite(value) && value > 0) return { value, measured: false };
  return null;
}

const PREFIXES: [number, string][] = [
  [1e9, 'G'], [1e6, 'M'], [1e3, 'k'], [1, ''], [1e-3, 'm'], [1e-6, '\u00b5'], [1e-9, 'n'], [1e-12, 'p'],
];

/** 4 significant digits with an SI prefix, for messages: 1.234e-5 H -> "12.34 µH". */
export function formatQuantity(value: number, unit: string): string {
  const size = Math.abs(value);
  const [factor, prefix] = (size === 0 ? undefined : PREFIXES.find(([f]) => size >= f)) ?? [1, ''];
  return `${Number((value / factor).toPrecision(4))} ${prefix}${unit}`;
}

/** A relative value as a percentage with 2 significant digits: 0.0707 -> "7.1 %". */
export function formatPercent(relative: number): string {
  return `${Number((relative * 100).toPrecision(2))} %`;
}
