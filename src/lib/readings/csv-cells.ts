import { MEASUREMENT_METHODS, METHOD_SPECS, type MeasurementMethod } from '../../physics/measurement/methods';
import { CALIBRATION_LABELS, CALIBRATION_STATES, type CalibrationState } from '../validations/reading';

/**
 * Readers for the CSV cells that are not raw inputs: the point's seq and repeat, the method, the
 * calibration state and the temperature. Each returns the value or the sentence that says what to write.
 */

export type CellRead<T> = { ok: true; value: T } | { ok: false; message: string };

const WHOLE = /^\+?\d{1,9}$/;

export function readSeq(text: string): CellRead<number> {
  if (text === '') return { ok: false, message: 'Enter the point’s seq from the run sheet.' };
  if (!WHOLE.test(text) || Number(text) < 1) return { ok: false, message: `“${text}” is not a seq; use the point’s number from the run sheet (1, 2, 3 …).` };
  return { ok: true, value: Number(text) };
}

/** An empty repeat cell is not checked (null). */
export function readRepeat(text: string): CellRead<number | null> {
  if (text === '') return { ok: true, value: null };
  if (!WHOLE.test(text) || Number(text) < 1) return { ok: false, message: `“${text}” is not a repeat; use the run sheet’s repeat (1, 2 …) or leave it empty.` };
  return { ok: true, value: Number(text) };
}

const methodKey = (text: string) => text.toLowerCase().replace(/[\s_-]+/g, ' ').trim();
const METHOD_BY_NAME = new Map<string, MeasurementMethod>();
for (const method of MEASUREMENT_METHODS) {
  METHOD_BY_NAME.set(methodKey(method), method);
  METHOD_BY_NAME.set(methodKey(METHOD_SPECS[method].label), method);
}

/** A method cell holds the method's id ("open_circuit") or its label ("Open-circuit voltage"), in any case. */
export function readMethod(text: string): CellRead<MeasurementMethod> {
  if (text === '') return { ok: false, message: `Enter the method, one of ${MEASUREMENT_METHODS.join(', ')}.` };
  const method = METHOD_BY_NAME.get(methodKey(text));
  if (!method) return { ok: false, message: `“${text}” is not a measurement method; write one of ${MEASUREMENT_METHODS.join(', ')} or its name.` };
  return { ok: true, value: method };
}

const CALIBRATION_BY_NAME = new Map<string, CalibrationState>([['', 'unknown']]);
for (const state of CALIBRATION_STATES) {
  CALIBRATION_BY_NAME.set(methodKey(state), state);
  CALIBRATION_BY_NAME.set(methodKey(CALIBRATION_LABELS[state]), state);
}

export function readCalibration(text: string): CellRead<CalibrationState> {
  const state = CALIBRATION_BY_NAME.get(methodKey(text));
  if (!state) return { ok: false, message: `“${text}” is not a calibration state; write in date, overdue or not known.` };
  return { ok: true, value: state };
}

const CELSIUS = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?)\s*(?:\u00b0\s*C|C|degC)?$/i;

/** Degrees Celsius, bare or with °C; empty is not recorded (null). */
export function readTemperature(text: string): CellRead<number | null> {
  if (text === '') return { ok: true, value: null };
  const match = CELSIUS.exec(text);
  if (!match) return { ok: false, message: `“${text}” is not a temperature; write degrees Celsius, such as 21.5.` };
  return { ok: true, value: Number(match[1]) };
}
