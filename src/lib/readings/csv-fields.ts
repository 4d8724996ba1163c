import { METHOD_SPECS, MEASUREMENT_METHODS, type MeasurementMethod, type RawFieldKind } from '../../physics/measurement/methods';
import { math } from '../units/math';
import { BARE_NUMBER, QUANTITIES, normaliseUnitText, roundSignificant, type QuantityParse } from '../units/quantity';
import { parseQuantity } from '../units';

/**
 * The raw inputs a CSV column can feed, across all methods. A key means the same quantity in every
 * method that has it (txCurrent is I1 for open-circuit and for direct power), so one column serves
 * every method of a file. Pure: the browser's mapping table and the server's import share it.
 */

export interface CsvRawField {
  key: string;
  kind: RawFieldKind;
  /** the label of the first method that has it */
  label: string;
  methods: MeasurementMethod[];
}

function collectFields(): CsvRawField[] {
  const byKey = new Map<string, CsvRawField>();
  for (const method of MEASUREMENT_METHODS) {
    for (const field of METHOD_SPECS[method].fields) {
      const known = byKey.get(field.key);
      if (known) known.methods.push(method);
      else byKey.set(field.key, { key: field.key, kind: field.kind, label: field.label, methods: [method] });
    }
  }
  return [...byKey.values()];
}

export const CSV_RAW_FIELDS: readonly CsvRawField[] = collectFields();
const FIELD_BY_KEY = new Map(CSV_RAW_FIELDS.map((f) => [f.key, f]));

export const csvRawField = (key: string): CsvRawField | undefined => FIELD_BY_KEY.get(key);

/** The unit of a bare number when a column names none: the SI unit (degrees for phases). */
export const siUnit = (kind: RawFieldKind): string => QUANTITIES[kind].si;

/** A unit as typed in a header or the mapping ("µH", "kΩ", "Ohm", "°") in mathjs spelling. */
export function normaliseUnit(unit: string): string {
  return normaliseUnitText(unit).trim().replace(/Ohms?$/i, 'ohm');
}

/** Factor from `unit` to the kind's SI unit, or null when it is not a unit of that kind. */
export function unitFactor(kind: RawFieldKind, unit: string): number | null {
  const si = siUnit(kind);
  const spelled = normaliseUnit(unit) || si;
  try {
    const parsed = math.unit(1, spelled);
    if (!parsed.equalBase(math.unit(si))) return null;
    const factor = parsed.toNumber(si);
    return Number.isFinite(factor) && factor !== 0 ? factor : null;
  } catch {
    return null;
  }
}

/**
 * Reads the cells of one column: a bare number is in the column's unit (scaled by one factor, so
 * 10,000 rows cost no unit parsing), a value with its own unit ("850 nH") is converted on its own.
 */
export function columnReader(kind: RawFieldKind, unit: string, label: string): (text: string) => QuantityParse {
  const defaultUnit = normaliseUnit(unit) || siUnit(kind);
  const factor = unitFactor(kind, defaultUnit);
  return (text) => {
    const trimmed = text.trim();
    if (factor !== null && BARE_NUMBER.test(trimmed)) {
      const value = roundSignificant(Number(trimmed) * factor);
      return Number.isFinite(value) ? { ok: true, value } : { ok: false, message: `${label}: "${trimmed}" is too large a number.` };
    }
    return parseQuantity(trimmed, kind, { field: label, defaultUnit });
  };
}
