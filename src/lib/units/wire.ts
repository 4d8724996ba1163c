import { AWG_MAX, AWG_MIN, awgDiameter, formatAwg, parseAwg } from './awg';
import { BARE_NUMBER, normaliseUnitText, parseQuantity, roundSignificant } from './quantity';

export type WireParse =
  | { ok: true; value: { diameter: number; gauge: number | null; label: string } | null }
  | { ok: false; message: string };

/**
 * A wire typed as a gauge ("AWG 18") or a diameter with its unit ("0.8 mm", "0.032 in"), as its
 * diameter [m] and the label to keep ("AWG 18" normalised, or the diameter as typed). A bare number
 * is refused: "18" could be a gauge or millimetres. Empty means "not set" unless `required`.
 */
export function parseWire(text: string, { field, required = false }: { field: string; required?: boolean }): WireParse {
  const trimmed = normaliseUnitText(text);
  if (trimmed === '') {
    return required ? { ok: false, message: `${field}: enter a gauge or a diameter, such as AWG 18 or 0.8 mm.` } : { ok: true, value: null };
  }
  const awg = parseAwg(trimmed);
  if (awg.kind === 'awg') {
    return { ok: true, value: { diameter: roundSignificant(awgDiameter(awg.gauge)), gauge: awg.gauge, label: formatAwg(awg.gauge) } };
  }
  if (awg.kind === 'out-of-range') {
    return { ok: false, message: `${field}: "${awg.text}" is not a gauge from ${formatAwg(AWG_MIN)} to ${formatAwg(AWG_MAX)}.` };
  }
  if (BARE_NUMBER.test(trimmed)) {
    return { ok: false, message: `${field}: "${trimmed}" needs a unit. Write a gauge or a diameter, such as AWG 18 or 0.8 mm.` };
  }
  const diameter = parseQuantity(trimmed, 'length', { field });
  if (!diameter.ok) {
    return { ok: false, message: `${field}: "${text.trim()}" is neither a gauge nor a diameter. Write, for example, AWG 18 or 0.8 mm.` };
  }
  return { ok: true, value: diameter.value === null ? null : { diameter: diameter.value, gauge: null, label: text.trim() } };
}

/** The gauge a wire label names, or null when the label is not a gauge (a typed diameter, litz text). */
export function gaugeOfLabel(label: string): number | null {
  const awg = parseAwg(normaliseUnitText(label));
  return awg.kind === 'awg' ? awg.gauge : null;
}
