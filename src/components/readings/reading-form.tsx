'use client';

import { useMemo, useState, type FormEvent } from 'react';
import { Alert } from '@/components/ui/alert';
import { FormActions } from '@/components/ui/form-actions';
import { SelectField } from '@/components/ui/select';
import { TextAreaField, TextField } from '@/components/ui/field';
import { ApiError, fetchJson } from '@/lib/client/fetch-json';
import { formatQuantity, parseQuantity, QUANTITIES } from '@/lib/units';
import { CALIBRATION_LABELS, CALIBRATION_STATES, type CalibrationState } from '@/lib/validations/reading';
import { deriveReading, methodFitWarning } from '@/physics/measurement/derive';
import { ReadingInputError, type Derivation } from '@/physics/measurement/types';
import type { PlanPoint } from '@/components/plans/plan-types';
import { DerivedValues } from './derived-values';
import { TouchstoneReading } from './touchstone-reading';
import { MEASUREMENT_METHODS, METHOD_SPECS, type MeasurementMethod, type Reading } from './reading-types';

/** What the form keeps between two readings of a session: the instrument rarely changes. */
export interface BenchCircumstances {
  accuracyPercent: string;
  phaseAccuracyDeg: string;
  instrument: string;
  calibration: CalibrationState;
  temperature: string;
}

export const INITIAL_CIRCUMSTANCES: BenchCircumstances = { accuracyPercent: '0.5', phaseAccuracyDeg: '1', instrument: '', calibration: 'unknown', temperature: '' };

interface ReadingFormProps {
  studyId: number;
  planId: number;
  point: PlanPoint;
  /** methods already logged at this point (offered last, since a second one is a correction) */
  loggedMethods: readonly MeasurementMethod[];
  /** set when correcting: the form starts from this version and asks for a reason */
  correcting?: Reading;
  circumstances: BenchCircumstances;
  onSaved: (reading: Reading, circumstances: BenchCircumstances) => void;
  onCancel?: () => void;
}

type Errors = Record<string, string>;

const numberText = (value: number | null | undefined) => (value === null || value === undefined ? '' : String(value));

function initialValues(correcting?: Reading): Record<string, string> {
  if (!correcting) return {};
  const spec = METHOD_SPECS[correcting.method];
  return Object.fromEntries(
    spec.fields.filter((f) => correcting.raw[f.key] !== undefined).map((f) => [f.key, formatQuantity(correcting.raw[f.key], f.kind, 8)]),
  );
}

function circumstancesOf(reading: Reading): BenchCircumstances {
  return {
    accuracyPercent: String(Number((reading.accuracy.relative * 100).toPrecision(6))),
    phaseAccuracyDeg: String(reading.accuracy.phaseDeg),
    instrument: reading.instrument,
    calibration: reading.calibration,
    temperature: numberText(reading.temperatureC),
  };
}

/** Parses what was typed; returns the body for the API or the field errors. */
function readForm(method: MeasurementMethod, values: Record<string, string>, c: BenchCircumstances, pose: PoseText | null) {
  const errors: Errors = {};
  const raw: Record<string, number> = {};
  for (const field of METHOD_SPECS[method].fields) {
    const parsed = parseQuantity(values[field.key] ?? '', field.kind, { field: field.label, required: field.required, defaultUnit: field.kind === 'angle' ? 'deg' : undefined });
    if (!parsed.ok) errors[`raw.${field.key}`] = parsed.message;
    else if (parsed.value !== null) raw[field.key] = parsed.value;
  }
  const percent = Number(c.accuracyPercent);
  if (c.accuracyPercent.trim() === '' || !Number.isFinite(percent) || percent < 0 || percent > 50) errors['accuracy.relative'] = 'Enter the accuracy in percent, 0 to 50.';
  const phase = Number(c.phaseAccuracyDeg);
  if (c.phaseAccuracyDeg.trim() === '' || !Number.isFinite(phase) || phase < 0 || phase > 45) errors['accuracy.phaseDeg'] = 'Enter the phase accuracy in degrees, 0 to 45.';
  const temperature = c.temperature.trim() === '' ? null : Number(c.temperature);
  if (temperature !== null && !Number.isFinite(temperature)) errors.temperatureC = 'Enter the temperature in \u00b0C as a number, or leave it empty.';
  let achievedPose = null;
  if (pose) {
    const distance = parseQuantity(pose.distance, 'length', { field: 'Achieved distance', required: true, defaultUnit: 'cm' });
    const offset = parseQuantity(pose.lateralOffset, 'length', { field: 'Achieved lateral offset', required: true, defaultUnit: 'cm' });
    const tilt = Number(pose.tiltDeg);
    if (!distance.ok) errors['achievedPose.distance'] = distance.message;
    if (!offset.ok) errors['achievedPose.lateralOffset'] = offset.message;
    if (pose.tiltDeg.trim() === '' || !Number.isFinite(tilt)) errors['achievedPose.tiltDeg'] = 'Enter the achieved tilt in degrees.';
    if (distance.ok && offset.ok && Number.isFinite(tilt)) achievedPose = { distance: distance.value!, lateralOffset: offset.value!, tiltDeg: tilt };
  }
  const accuracy = { relative: percent / 100, phaseDeg: phase };
  return { errors, body: { method, raw, accuracy, achievedPose, instrument: c.instrument, calibration: c.calibration, temperatureC: temperature } };
}

interface PoseText {
  distance: string;
  lateralOffset: string;
  tiltDeg: string;
}

/**
 * One reading at one point: the method's raw inputs with units, the instrument's accuracy and the
 * circumstances. While typing, the derived values are previewed with the same formulas the server
 * uses; the server derives them again when the reading is saved.
 */
export function ReadingForm({ studyId, planId, point, loggedMethods, correcting, circumstances, onSaved, onCancel }: ReadingFormProps) {
  const firstFree = MEASUREMENT_METHODS.find((m) => !loggedMethods.includes(m)) ?? 'open_circuit';
  const [method, setMethod] = useState<MeasurementMethod>(correcting?.method ?? firstFree);
  const [values, setValues] = useState<Record<string, string>>(() => initialValues(correcting));
  const [c, setC] = useState<BenchCircumstances>(correcting ? circumstancesOf(correcting) : circumstances);
  const [notes, setNotes] = useState(correcting?.setupNotes ?? '');
  const [reason, setReason] = useState('');
  const [pose, setPose] = useState<PoseText | null>(
    correcting?.achievedPose
      ? { distance: `${correcting.achievedPose.distance * 100} cm`, lateralOffset: `${correcting.achievedPose.lateralOffset * 100} cm`, tiltDeg: String(correcting.achievedPose.tiltDeg) }
      : null,
  );
  const [errors, setErrors] = useState<Errors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const spec = METHOD_SPECS[method];
  const predicted = point.predicted;
  const parsed = useMemo(() => readForm(method, values, c, pose), [method, values, c, pose]);
  const preview = useMemo((): { derived: Derivation | null; problem: string | null } => {
    if (Object.keys(parsed.errors).length > 0) return { derived: null, problem: null };
    try {
      return { derived: deriveReading(method, parsed.body.raw, parsed.body.accuracy, { predicted }), problem: null };
    } catch (error) {
      return { derived: null, problem: error instanceof ReadingInputError || error instanceof RangeError ? error.message : null };
    }
  }, [parsed, method, predicted]);
  const fitWarning = predicted ? methodFitWarning(method, predicted.coupling, parsed.body.accuracy) : null;

  const methodOptions = MEASUREMENT_METHODS.map((m) => ({
    value: m,
    label: `${METHOD_SPECS[m].label}${!correcting && loggedMethods.includes(m) ? ' (logged; correct it below)' : ''}`,
  }));

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setFormError(null);
    // a copy: `parsed` is memoised, and the reason check below must not stick to it
    const found: Errors = { ...parsed.errors };
    const { body } = parsed;
    if (correcting && reason.trim().length < 3) found.reason = 'Say why the reading is corrected.';
    setErrors(found);
    if (Object.keys(found).length > 0) {
      setFormError('Some fields need attention.');
      return;
    }
    setBusy(true);
    try {
      const url = correcting
        ? `/api/studies/${studyId}/plans/${planId}/readings/${correcting.id}/corrections`
        : `/api/studies/${studyId}/plans/${planId}/readings`;
      const payload = correcting ? { ...body, setupNotes: notes, reason } : { ...body, setupNotes: notes, pointId: point.id };
      const { reading } = await fetchJson<{ reading: Reading }>(url, { method: 'POST', body: payload });
      onSaved(reading, c);
      if (!correcting) setValues({});
    } catch (failure) {
      if (failure instanceof ApiError) {
        setFormError(failure.message);
        setErrors(Object.fromEntries(failure.issues.map((issue) => [issue.path, issue.message])));
      } else {
        setFormError('Couplet could not be reached. Check your connection and try again.');
      }
    } finally {
      setBusy(false);
    }
  };

  const set = (key: string) => (event: { target: { value: string } }) => setValues((v) => ({ ...v, [key]: event.target.value }));
  const setCirc = <K extends keyof BenchCircumstances>(key: K, value: BenchCircumstances[K]) => setC((prev) => ({ ...prev, [key]: value }));

  return (
    <form onSubmit={submit} noValidate className="space-y-5" aria-label={correcting ? 'Correct the reading' : 'Log a reading'}>
      <SelectField
        label="Method"
        value={method}
        disabled={Boolean(correcting)}
        options={methodOptions}
        hint={spec.summary}
        onChange={(event) => {
          setMethod(event.target.value as MeasurementMethod);
          setErrors({});
        }}
      />
      {fitWarning && <Alert tone="caution">{fitWarning}</Alert>}

      {method === 'two_port' && !correcting && (
        <fieldset className="rounded-md border border-ink-200 p-4">
          <legend className="px-1 text-sm font-semibold text-ink-900">From a Touchstone file</legend>
          <TouchstoneReading
            studyId={studyId}
            planId={planId}
            pointId={point.id}
            circumstances={{ ...parsed.body, setupNotes: notes }}
            onSaved={(reading) => onSaved(reading, c)}
          />
        </fieldset>
      )}

      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-semibold text-ink-900">{method === 'two_port' && !correcting ? 'Or type the Z-parameters' : 'Instrument readings'}</legend>
        {spec.fields.map((field) => (
          <TextField
            key={`${method}-${field.key}`}
            label={field.label}
            value={values[field.key] ?? ''}
            onChange={set(field.key)}
            placeholder={QUANTITIES[field.kind].examples.split(' or ')[0]}
            hint={`${field.required ? '' : 'Optional. '}${field.hint}`}
            error={errors[`raw.${field.key}`]}
            autoComplete="off"
            spellCheck={false}
          />
        ))}
      </fieldset>

      <fieldset className="grid gap-4 sm:grid-cols-3">
        <legend className="mb-2 text-sm font-semibold text-ink-900">Instrument and conditions</legend>
        <TextField label="Instrument" value={c.instrument} onChange={(e) => setCirc('instrument', e.target.value)} placeholder="e.g. scope + current probe, unit 3" className="sm:col-span-3" />
        <TextField
          label="Accuracy (%)"
          inputMode="decimal"
          value={c.accuracyPercent}
          onChange={(e) => setCirc('accuracyPercent', e.target.value)}
          hint="Standard uncertainty of each magnitude read, from the instrument's data sheet."
          error={errors['accuracy.relative']}
        />
        <TextField
          label="Phase accuracy (°)"
          inputMode="decimal"
          value={c.phaseAccuracyDeg}
          onChange={(e) => setCirc('phaseAccuracyDeg', e.target.value)}
          error={errors['accuracy.phaseDeg']}
        />
        <SelectField
          label="Calibration"
          value={c.calibration}
          options={CALIBRATION_STATES.map((s) => ({ value: s, label: CALIBRATION_LABELS[s] }))}
          onChange={(e) => setCirc('calibration', e.target.value as CalibrationState)}
        />
        <TextField label="Temperature (°C)" inputMode="decimal" value={c.temperature} onChange={(e) => setCirc('temperature', e.target.value)} error={errors.temperatureC} />
      </fieldset>

      <div className="space-y-3">
        <label className="flex items-center gap-2 text-sm font-medium text-ink-800">
          <input
            type="checkbox"
            className="size-4 accent-copper-600"
            checked={pose !== null}
            onChange={(e) =>
              setPose(
                e.target.checked
                  ? { distance: `${Number((point.pose.distance * 100).toPrecision(6))} cm`, lateralOffset: `${Number((point.pose.lateralOffset * 100).toPrecision(6))} cm`, tiltDeg: String(point.pose.tiltDeg) }
                  : null,
              )
            }
          />
          The achieved pose differs from the planned one
        </label>
        {pose && (
          <div className="grid gap-4 sm:grid-cols-3">
            <TextField label="Achieved distance" value={pose.distance} onChange={(e) => setPose({ ...pose, distance: e.target.value })} error={errors['achievedPose.distance']} />
            <TextField label="Achieved lateral offset" value={pose.lateralOffset} onChange={(e) => setPose({ ...pose, lateralOffset: e.target.value })} error={errors['achievedPose.lateralOffset']} />
            <TextField label="Achieved tilt (°)" value={pose.tiltDeg} onChange={(e) => setPose({ ...pose, tiltDeg: e.target.value })} error={errors['achievedPose.tiltDeg']} />
          </div>
        )}
      </div>

      <TextAreaField
        label="Setup notes"
        value={notes}
        onChange={(e) => setNotes(e.target.value)}
        hint="Nearby metal, fixtures, cable routing: anything that may explain a difference from the prediction."
        rows={2}
        error={errors.setupNotes}
      />
      {correcting && (
        <TextAreaField label="Reason for the correction" value={reason} onChange={(e) => setReason(e.target.value)} rows={2} error={errors.reason} hint="Kept with the new version; the earlier version stays in the history." />
      )}

      <div className="rounded-md border border-ink-200 bg-ink-50 px-4 py-3" aria-live="polite">
        <p className="mb-2 text-xs font-semibold uppercase tracking-wide text-ink-500">Derived (preview)</p>
        {preview.derived ? (
          <DerivedValues derived={preview.derived} predicted={predicted} />
        ) : (
          <p className="text-sm text-ink-600">{preview.problem ?? 'Enter the required readings to see the derived values.'}</p>
        )}
      </div>

      {formError && <Alert tone="error">{formError}</Alert>}
      <FormActions submitLabel={correcting ? 'Save correction' : 'Save reading'} busy={busy} onCancel={onCancel} />
    </form>
  );
}
