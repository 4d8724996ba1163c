import { math } from './math';

/**
 * Physical quantities typed into forms, each with its SI unit (what the API and the database store),
 * how a message names it, and examples for the message that says what to write instead.
 */
export const QUANTITIES = {
  length: { si: 'm', noun: 'a length', examples: '12 cm or 0.8 mm' },
  frequency: { si: 'Hz', noun: 'a frequency', examples: '6.78 MHz or 85 kHz' },
  inductance: { si: 'H', noun: 'an inductance', examples: '10 uH or 850 nH' },
  resistance: { si: 'ohm', noun: 'a resistance', examples: '0.5 ohm or 500 mohm' },
  capacitance: { si: 'F', noun: 'a capacitance', examples: '47 nF or 220 pF' },
  voltage: { si: 'V', noun: 'a voltage', examples: '12 V or 500 mV' },
  current: { si: 'A', noun: 'a current', examples: '1.2 A or 350 mA' },
  power: { si: 'W', noun: 'a power', examples: '5 W or 250 mW' },
  angle: { si: 'deg', noun: 'an angle', examples: '90 deg or 1.2 rad' },
} as const;

export type QuantityKind = keyof typeof QUANTITIES;

/** Significant digits kept, so "13.56 MHz" becomes 13560000 rather than 13560000.000000002. */
const SIGNIFICANT_DIGITS = 12;

export const BARE_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;

/** Rounds away binary floating-point noise from a unit conversion (1.5 in -> 0.0381 m, not 0.038099999). */
export const roundSignificant = (value: number) => Number(value.toPrecision(SIGNIFICANT_DIGITS));

/**
 * Spellings people type that mathjs does not know: the micro sign and Greek mu for "u", the ohm sign
 * and Greek omega for "ohm", a trailing degree sign for "deg". Unit symbols stay case-sensitive, as in SI ("mHz" is millihertz).
 */
export function normaliseUnitText(text: string): string {
  return text.trim().replace(/[\u00b5\u03bc]/g, 'u').replace(/[\u2126\u03a9]/g, 'ohm').replace(/\s*\u00b0$/, ' deg');
}

export type QuantityParse = { ok: true; value: number | null } | { ok: false; message: string };

export interface ParseOptions {
  /** How messages name the field ("Outer radius"); every message starts with it. */
  field: string;
  /** Unit of a bare number ("mm"); without it a bare number is in the SI unit. */
  defaultUnit?: string;
  /** An empty field is an error instead of "not set" (null). */
  required?: boolean;
}

const notA = (text: string, kind: QuantityKind, field: string) =>
  `${field}: "${text}" is not ${QUANTITIES[kind].noun}. Write a number and a unit, such as ${QUANTITIES[kind].examples}.`;

/**
 * Reads a quantity as typed ("12 cm", "1.5in", "6.78 MHz", "10 µH", "500 mohm") into its SI unit.
 * An empty field means "not set" (null) unless `required`. Anything of another dimension ("12 kg" for
 * a length), a unit alone ("cm"), decimal commas and infinite values fail with a message naming the field.
 */
export function parseQuantity(text: string, kind: QuantityKind, { field, defaultUnit, required = false }: ParseOptions): QuantityParse {
  const trimmed = normaliseUnitText(text);
  if (trimmed === '') {
    return required ? { ok: false, message: `${field}: enter ${QUANTITIES[kind].noun}, such as ${QUANTITIES[kind].examples}.` } : { ok: true, value: null };
  }
  if (/^[+-]?\d+,\d+/.test(trimmed)) {
    return { ok: false, message: `${field}: write the decimal separator as a point ("${trimmed.replace(',', '.')}").` };
  }
  const si = QUANTITIES[kind].si;
  try {
    const unit = BARE_NUMBER.test(trimmed) ? math.unit(Number(trimmed), defaultUnit ?? si) : math.unit(trimmed);
    if (unit.value === null || !unit.equalBase(math.unit(si))) return { ok: false, message: notA(text.trim(), kind, field) };
    const value = unit.toNumber(si);
    if (!Number.isFinite(value)) return { ok: false, message: `${field}: "${text.trim()}" is too large a number.` };
    return { ok: true, value: roundSignificant(value) };
  } catch {
    return { ok: false, message: notA(text.trim(), kind, field) };
  }
}
