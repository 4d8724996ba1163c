import { create, unitDependencies } from 'mathjs';

/** Only mathjs's unit machinery: the full default instance would add most of mathjs to the page. */
const math = create({ unitDependencies });

/** Significant digits kept, so "13.56 MHz" becomes 13560000 rather than 13560000.000000002. */
const SIGNIFICANT_DIGITS = 12;

const BARE_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;

export type FrequencyParse = { ok: true; hertz: number | null } | { ok: false };

/**
 * Reads a frequency as typed in a form ("6.78 MHz", "85 kHz", "85kHz", "1e5 Hz") into hertz.
 * A bare number means hertz; an empty field means "not set". Anything that is not a frequency
 * ("12 cm", "fast") fails. Unit symbols are case-sensitive, as in SI: "mHz" is millihertz.
 */
export function parseFrequency(text: string): FrequencyParse {
  const trimmed = text.trim();
  if (trimmed === '') return { ok: true, hertz: null };
  try {
    const hertz = BARE_NUMBER.test(trimmed) ? Number(trimmed) : math.unit(trimmed).toNumber('Hz');
    if (!Number.isFinite(hertz)) return { ok: false };
    return { ok: true, hertz: Number(hertz.toPrecision(SIGNIFICANT_DIGITS)) };
  } catch {
    return { ok: false };
  }
}
