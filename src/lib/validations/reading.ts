import { z } from 'zod';
import { DEFAULT_ACCURACY, MEASUREMENT_METHODS, METHOD_SPECS, type MeasurementMethod, type RawFieldKind } from '../../physics/measurement/methods';

/**
 * A reading as the bench sends it: the method, its raw inputs in SI (phases in degrees), the
 * instrument's accuracy and the circumstances. Every problem carries its field path ("raw.txCurrent").
 * Used by the form route, the CSV import (one row at a time) and the correction route.
 */

/** Plausible bounds for each raw kind: generous, only there to catch a unit slip or garbage. */
const RAW_BOUNDS: Record<RawFieldKind, { min: number; max: number; what: string; allowNegative: boolean }> = {
  frequency: { min: 1e-3, max: 1e11, what: 'a frequency above zero, at most 100 GHz', allowNegative: false },
  voltage: { min: 0, max: 1e6, what: 'a voltage from 0 to 1 MV', allowNegative: false },
  current: { min: 0, max: 1e5, what: 'a current from 0 to 100 kA', allowNegative: false },
  inductance: { min: 0, max: 1e3, what: 'an inductance from 0 to 1 kH', allowNegative: false },
  resistance: { min: -1e9, max: 1e9, what: 'an impedance part within \u00b11 G\u03a9', allowNegative: true },
  angle: { min: -180, max: 180, what: 'a phase from \u2212180\u00b0 to 180\u00b0', allowNegative: true },
  power: { min: 0, max: 1e7, what: 'a power from 0 to 10 MW', allowNegative: false },
};

export const rawValueMessage = (kind: RawFieldKind) => `Enter ${RAW_BOUNDS[kind].what}.`;

/** Problems with one method's raw inputs: unknown keys, missing required values, out-of-range values. */
export function rawReadingIssues(method: MeasurementMethod, raw: Record<string, unknown>): { key: string; message: string }[] {
  const spec = METHOD_SPECS[method];
  const issues: { key: string; message: string }[] = [];
  const known = new Set(spec.fields.map((f) => f.key));
  for (const key of Object.keys(raw)) {
    if (!known.has(key)) issues.push({ key, message: `${spec.label} has no input “${key}”.` });
  }
  for (const field of spec.fields) {
    const value = raw[field.key];
    if (value === undefined || value === null) {
      if (field.required) issues.push({ key: field.key, message: `Enter ${field.label}.` });
      continue;
    }
    const bounds = RAW_BOUNDS[field.kind];
    if (typeof value !== 'number' || !Number.isFinite(value) || value < bounds.min || value > bounds.max) {
      issues.push({ key: field.key, message: `${field.label}: ${rawValueMessage(field.kind).toLowerCase()}` });
    }
  }
  if (spec.alternatives && issues.length === 0) {
    const complete = spec.alternatives.some((group) => group.every((key) => typeof raw[key] === 'number'));
    if (!complete) {
      const groups = spec.alternatives.map((group) => group.map((key) => spec.fields.find((f) => f.key === key)?.label ?? key).join(', '));
      issues.push({ key: spec.alternatives[0][0], message: `Enter either ${groups.join(' or ')}.` });
    }
  }
  return issues;
}

const rawSchema = z.record(z.string(), z.number({ error: 'Enter a number.' }).finite('Enter a finite number.').nullable(), { error: 'Give the raw readings as an object of numbers.' });

export const accuracySchema = z.object({
  relative: z
    .number({ error: 'Enter the instrument\u2019s relative accuracy.' })
    .finite('Enter the instrument\u2019s relative accuracy.')
    .min(0, 'Accuracy cannot be negative.')
    .max(0.5, 'A relative accuracy above 50 % is not a measurement.'),
  phaseDeg: z
    .number({ error: 'Enter the phase accuracy in degrees.' })
    .finite('Enter the phase accuracy in degrees.')
    .min(0, 'Accuracy cannot be negative.')
    .max(45, 'A phase accuracy above 45\u00b0 is not a measurement.'),
});

const achievedPoseSchema = z.object({
  distance: z.number({ error: 'Enter the achieved distance.' }).finite('Enter the achieved distance.').min(0, 'The distance cannot be negative.').max(100, 'At most 100 m.'),
  lateralOffset: z.number({ error: 'Enter the achieved lateral offset.' }).finite('Enter the achieved lateral offset.').min(-100, 'Within \u00b1100 m.').max(100, 'Within \u00b1100 m.'),
  tiltDeg: z.number({ error: 'Enter the achieved tilt.' }).finite('Enter the achieved tilt.').min(-180, 'Tilt is \u2212180\u00b0 to 180\u00b0.').max(180, 'Tilt is \u2212180\u00b0 to 180\u00b0.'),
});
export type AchievedPose = z.infer<typeof achievedPoseSchema>;

export const CALIBRATION_STATES = ['in_date', 'overdue', 'unknown'] as const;
export type CalibrationState = (typeof CALIBRATION_STATES)[number];
export const CALIBRATION_LABELS: Record<CalibrationState, string> = { in_date: 'in date', overdue: 'overdue', unknown: 'not known' };

/** Everything of a reading except which point it belongs to. */
const readingBody = {
  method: z.enum(MEASUREMENT_METHODS, { error: 'Choose a measurement method.' }),
  raw: rawSchema,
  accuracy: accuracySchema.default(DEFAULT_ACCURACY),
  achievedPose: achievedPoseSchema.nullable().default(null),
  instrument: z.string({ error: 'The instrument is text.' }).trim().max(200, 'Use at most 200 characters.').default(''),
  calibration: z.enum(CALIBRATION_STATES, { error: 'Choose in date, overdue or not known.' }).default('unknown'),
  temperatureC: z.number({ error: 'Enter the temperature in \u00b0C.' }).finite('Enter the temperature in \u00b0C.').min(-60, 'Between \u221260 and 200 \u00b0C.').max(200, 'Between \u221260 and 200 \u00b0C.').nullable().default(null),
  setupNotes: z.string({ error: 'Notes are text.' }).trim().max(2000, 'Use at most 2,000 characters.').default(''),
};

function refineRaw(value: { method: MeasurementMethod; raw: Record<string, number | null> }, ctx: z.RefinementCtx): void {
  for (const issue of rawReadingIssues(value.method, value.raw)) ctx.addIssue({ code: 'custom', path: ['raw', issue.key], message: issue.message });
}

/** Drops null raw values (an empty optional field) so the stored raw holds only what was read. */
function compactRaw<T extends { raw: Record<string, number | null> }>(value: T): Omit<T, 'raw'> & { raw: Record<string, number> } {
  const raw: Record<string, number> = {};
  for (const [key, v] of Object.entries(value.raw)) if (v !== null) raw[key] = v;
  return { ...value, raw };
}

const pointIdSchema = z.number({ error: 'Choose a point of the plan.' }).int('Choose a point of the plan.').positive('Choose a point of the plan.');

/** A first reading of a point. */
export const readingCreateSchema = z.object({ pointId: pointIdSchema, ...readingBody }).superRefine(refineRaw).transform(compactRaw);
export type ReadingCreate = z.output<typeof readingCreateSchema>;

/** The reason every correction carries. */
export const correctionReasonSchema = z
  .string({ error: 'Say why the reading is corrected.' })
  .trim()
  .min(3, 'Say why the reading is corrected.')
  .max(1000, 'Use at most 1,000 characters.');

/** A correction: a whole new reading of the same point, with the reason. */
export const readingCorrectionSchema = z.object({ ...readingBody, reason: correctionReasonSchema }).superRefine(refineRaw).transform(compactRaw);
export type ReadingCorrection = z.output<typeof readingCorrectionSchema>;

/**
 * A two-port reading taken from a Touchstone file attached to the plan: the server reads the
 * Z-parameters at `frequency` (empty: the point's frequency) instead of typed ones.
 */
export const readingFromFileSchema = z.object({
  pointId: pointIdSchema,
  attachmentId: z.number({ error: 'Choose an uploaded Touchstone file.' }).int('Choose an uploaded Touchstone file.').positive('Choose an uploaded Touchstone file.'),
  frequency: z.number({ error: 'Enter the frequency in hertz.' }).finite('Enter the frequency in hertz.').positive('The frequency must be above zero.').max(1e11, 'At most 100 GHz.').nullable().default(null),
  accuracy: readingBody.accuracy,
  achievedPose: readingBody.achievedPose,
  instrument: readingBody.instrument,
  calibration: readingBody.calibration,
  temperatureC: readingBody.temperatureC,
  setupNotes: readingBody.setupNotes,
});
export type ReadingFromFile = z.output<typeof readingFromFileSchema>;

/** Fields of a reading that are not raw inputs, for forms and the CSV mapping. */
export type ReadingCircumstances = Pick<ReadingCreate, 'accuracy' | 'achievedPose' | 'instrument' | 'calibration' | 'temperatureC' | 'setupNotes'>;
