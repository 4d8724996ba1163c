import { parseQuantity, type QuantityKind } from '@/lib/units';
import type { AxisQuantity } from './plan-types';

/**
 * Axis values at the edge: what people type ("5 cm", "90 deg", "6.78 MHz") into SI, and SI back into
 * the unit they typed, so a plan reads the way it was written.
 */

interface AxisQuantityInfo {
  label: string;
  /** src/lib/units kind; angles are not a mathjs dimension we parse there, so tilt has none */
  kind: QuantityKind | null;
  /** unit of a bare number and of a unit we do not know */
  defaultUnit: string;
  example: string;
}

export const AXIS_INFO: Record<AxisQuantity, AxisQuantityInfo> = {
  distance: { label: 'Distance', kind: 'length', defaultUnit: 'cm', example: '5 cm' },
  lateralOffset: { label: 'Lateral offset', kind: 'length', defaultUnit: 'cm', example: '2 cm' },
  tiltDeg: { label: 'Tilt', kind: null, defaultUnit: 'deg', example: '30 deg' },
  frequencyHz: { label: 'Frequency', kind: 'frequency', defaultUnit: 'MHz', example: '6.78 MHz' },
  loadResistance: { label: 'Load resistance', kind: 'resistance', defaultUnit: 'ohm', example: '50 ohm' },
};

/** SI value of one display unit. Units outside this table are shown in the quantity's default unit. */
const UNIT_FACTOR: Record<string, number> = {
  m: 1, cm: 1e-2, mm: 1e-3, in: 0.0254,
  deg: 1,
  Hz: 1, kHz: 1e3, MHz: 1e6, GHz: 1e9,
  ohm: 1, mohm: 1e-3, kohm: 1e3,
};

const UNITS_OF: Record<AxisQuantity, readonly string[]> = {
  distance: ['m', 'cm', 'mm', 'in'],
  lateralOffset: ['m', 'cm', 'mm', 'in'],
  tiltDeg: ['deg'],
  frequencyHz: ['Hz', 'kHz', 'MHz', 'GHz'],
  loadResistance: ['mohm', 'ohm', 'kohm'],
};

/** Display digits: enough for "6.78 MHz" or "12.5 cm" without binary noise. */
const DISPLAY_DIGITS = 6;

export type AxisParse = { ok: true; value: number; unit: string } | { ok: false; message: string };

/** The unit written after the number ("5 cm" -> "cm", "90°" -> "deg", "5" -> null), normalised. */
function typedUnit(text: string): string | null {
  const match = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?\s*(.*)$/i.exec(text.trim());
  if (!match || match[1] === '') return null;
  const unit = match[1].replace(/[\u2126\u03a9]/g, 'ohm').trim();
  if (/^(°|deg|degrees?)$/i.test(unit)) return 'deg';
  return unit;
}

/** One typed axis value as SI, with the unit to show it back in. */
export function parseAxisValue(text: string, quantity: AxisQuantity, field: string): AxisParse {
  const info = AXIS_INFO[quantity];
  const trimmed = text.trim();
  if (trimmed === '') return { ok: false, message: `${field}: enter a value, such as ${info.example}.` };
  const unit = typedUnit(trimmed);
  if (info.kind === null) {
    if (unit !== null && unit !== 'deg') return { ok: false, message: `${field}: "${trimmed}" is not an angle. Write degrees, such as ${info.example}.` };
    const value = Number(trimmed.replace(/\s*(°|deg|degrees?)$/i, ''));
    if (!Number.isFinite(value)) return { ok: false, message: `${field}: "${trimmed}" is not an angle. Write degrees, such as ${info.example}.` };
    return { ok: true, value, unit: 'deg' };
  }
  const parsed = parseQuantity(trimmed, info.kind, { field, defaultUnit: info.defaultUnit, required: true });
  if (!parsed.ok) return parsed;
  const shownUnit = unit !== null && UNITS_OF[quantity].includes(unit) ? unit : info.defaultUnit;
  return { ok: true, value: parsed.value ?? 0, unit: shownUnit };
}

/** An SI value as a number in `displayUnit` (falls back to the quantity's default unit). */
export function toDisplayNumber(si: number, quantity: AxisQuantity, displayUnit: string): number {
  const unit = UNITS_OF[quantity].includes(displayUnit) ? displayUnit : AXIS_INFO[quantity].defaultUnit;
  return Number((si / UNIT_FACTOR[unit]).toPrecision(DISPLAY_DIGITS));
}

/** The unit actually used by toDisplayNumber for this axis. */
export function shownUnit(quantity: AxisQuantity, displayUnit: string): string {
  return UNITS_OF[quantity].includes(displayUnit) ? displayUnit : AXIS_INFO[quantity].defaultUnit;
}

/** "5 cm", "90 deg", "6.78 MHz": what the form shows for a stored value; parses back to the same SI. */
export function formatAxisValue(si: number, quantity: AxisQuantity, displayUnit: string): string {
  return `${toDisplayNumber(si, quantity, displayUnit)} ${shownUnit(quantity, displayUnit)}`;
}

/** An axis's name with its unit, for table heads and chart axes: "Distance [cm]". */
export function axisTitle(quantity: AxisQuantity, displayUnit: string): string {
  return `${AXIS_INFO[quantity].label} [${shownUnit(quantity, displayUnit)}]`;
}
