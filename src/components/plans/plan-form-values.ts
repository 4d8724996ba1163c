import { formatAxisValue, parseAxisValue } from './axis-units';
import { countPlanPoints } from './plan-count';
import { oversizeMessage } from '@/lib/plans/points';
import { type AxisQuantity, type AxisSpec, type OrderMode, type Plan, type PlanInput } from './plan-types';

/**
 * The plan designer's text fields and how they become the request body. Pure, so the typed-value
 * conversion is tested on its own and shared by the live count and the submit.
 */

export interface AxisFormValues {
  quantity: AxisQuantity;
  mode: 'range' | 'count' | 'list';
  start: string;
  stop: string;
  step: string;
  count: string;
  spacing: 'linear' | 'log';
  /** comma- or semicolon-separated: "5 cm, 7.5 cm, 10 cm" */
  values: string;
}

export interface PlanFormValues {
  name: string;
  setupId: string;
  axes: AxisFormValues[];
  repeats: string;
  referenceEvery: string;
  orderMode: OrderMode;
  shuffleSeed: string;
  minutesPerPoint: string;
  notes: string;
}

export interface FormIssue {
  /** a field path of the form: "axes.0.start", "repeats" */
  path: string;
  message: string;
}

export const NEW_AXIS: Record<AxisQuantity, AxisFormValues> = {
  distance: { quantity: 'distance', mode: 'range', start: '5 cm', stop: '15 cm', step: '5 cm', count: '5', spacing: 'linear', values: '' },
  lateralOffset: { quantity: 'lateralOffset', mode: 'range', start: '0 cm', stop: '4 cm', step: '1 cm', count: '5', spacing: 'linear', values: '' },
  tiltDeg: { quantity: 'tiltDeg', mode: 'range', start: '0 deg', stop: '90 deg', step: '30 deg', count: '4', spacing: 'linear', values: '' },
  frequencyHz: { quantity: 'frequencyHz', mode: 'list', start: '100 kHz', stop: '13.56 MHz', step: '', count: '5', spacing: 'log', values: '6.78 MHz, 13.56 MHz' },
  loadResistance: { quantity: 'loadResistance', mode: 'count', start: '1 ohm', stop: '1000 ohm', step: '', count: '7', spacing: 'log', values: '' },
};

/** A random seed people can read back to a colleague: six digits. */
export const newSeed = () => 100000 + Math.floor(Math.random() * 900000);

export const emptyPlanForm = (setupId: string): PlanFormValues => ({
  name: '',
  setupId,
  axes: [{ ...NEW_AXIS.distance }],
  repeats: '1',
  referenceEvery: '',
  orderMode: 'as_listed',
  shuffleSeed: String(newSeed()),
  minutesPerPoint: '2',
  notes: '',
});

/** Reads one axis; every typed value keeps the unit of the first value typed (the start or the list's first). */
export function readAxis(axis: AxisFormValues, index: number, issues: FormIssue[]): AxisSpec | null {
  const at = (field: string) => `axes.${index}.${field}`;
  const read = (field: 'start' | 'stop' | 'step', label: string) => {
    const parsed = parseAxisValue(axis[field], axis.quantity, label);
    if (parsed.ok) return parsed;
    issues.push({ path: at(field), message: parsed.message });
    return null;
  };
  const before = issues.length;
  if (axis.mode === 'list') {
    const parts = axis.values.split(/[,;]/).map((part) => part.trim()).filter(Boolean);
    if (parts.length === 0) {
      issues.push({ path: at('values'), message: 'Values: list at least one value, separated by commas.' });
      return null;
    }
    const parsed = parts.map((part) => parseAxisValue(part, axis.quantity, 'Values'));
    const failed = parsed.find((p) => !p.ok);
    if (failed && !failed.ok) {
      issues.push({ path: at('values'), message: failed.message });
      return null;
    }
    const values = parsed.map((p) => (p.ok ? p.value : 0));
    return { quantity: axis.quantity, displayUnit: parsed[0].ok ? parsed[0].unit : '', mode: 'list', values };
  }
  const start = read('start', 'Start');
  const stop = read('stop', 'Stop');
  if (axis.mode === 'range') {
    const step = read('step', 'Step');
    if (step && !(step.value > 0)) issues.push({ path: at('step'), message: 'Step: must be above zero.' });
    if (issues.length > before || !start || !stop || !step) return null;
    return { quantity: axis.quantity, displayUnit: start.unit, mode: 'range', start: start.value, stop: stop.value, step: step.value };
  }
  const count = Number(axis.count);
  if (!Number.isInteger(count) || count < 1) issues.push({ path: at('count'), message: 'Count: a whole number of 1 or more.' });
  if (axis.spacing === 'log' && start && stop && !(start.value > 0 && stop.value > 0)) {
    issues.push({ path: at('start'), message: 'Start: logarithmic spacing needs values above zero.' });
  }
  if (issues.length > before || !start || !stop) return null;
  return { quantity: axis.quantity, displayUnit: start.unit, mode: 'count', start: start.value, stop: stop.value, count, spacing: axis.spacing };
}

function wholeNumber(text: string, path: string, label: string, issues: FormIssue[], { min, optional = false }: { min: number; optional?: boolean }): number | null {
  if (text.trim() === '' && optional) return null;
  const value = Number(text);
  if (text.trim() === '' || !Number.isInteger(value) || value < min) {
    issues.push({ path, message: `${label}: a whole number of ${min} or more.` });
    return null;
  }
  return value;
}

/** The request body from the form, or the issues to put beside the fields. */
export function readPlanForm(form: PlanFormValues): { input: PlanInput | null; issues: FormIssue[]; pointCount: number } {
  const issues: FormIssue[] = [];
  if (form.name.trim() === '') issues.push({ path: 'name', message: 'Name: give the plan a name.' });
  const setupId = Number(form.setupId);
  if (!Number.isInteger(setupId) || setupId < 1) issues.push({ path: 'setupId', message: 'Setup: choose the saved setup this plan sweeps.' });
  if (form.axes.length === 0) issues.push({ path: 'axes', message: 'Axes: add at least one axis.' });
  const quantities = form.axes.map((a) => a.quantity);
  quantities.forEach((q, i) => {
    if (quantities.indexOf(q) !== i) issues.push({ path: `axes.${i}.quantity`, message: 'Quantity: each axis sweeps a different quantity.' });
  });
  const axes = form.axes.map((axis, index) => readAxis(axis, index, issues));
  const repeats = wholeNumber(form.repeats, 'repeats', 'Repeats', issues, { min: 1 });
  const referenceEvery = wholeNumber(form.referenceEvery, 'referenceEvery', 'Reference every', issues, { min: 2, optional: true });
  const shuffleSeed = form.orderMode === 'shuffled' ? wholeNumber(form.shuffleSeed, 'shuffleSeed', 'Seed', issues, { min: 0 }) : null;
  const minutes = Number(form.minutesPerPoint);
  if (form.minutesPerPoint.trim() === '' || !Number.isFinite(minutes) || minutes <= 0) {
    issues.push({ path: 'minutesPerPoint', message: 'Minutes per point: a number of minutes, such as 2 or 0.5.' });
  }
  const complete = axes.every((a): a is AxisSpec => a !== null);
  const pointCount = complete ? countPlanPoints(axes, repeats ?? 1, referenceEvery) : Number.NaN;
  const oversize = complete ? oversizeMessage({ axes, repeats: repeats ?? 1, referenceEvery }) : null;
  if (oversize) issues.push({ path: 'axes', message: oversize });
  if (issues.length > 0 || !complete) return { input: null, issues, pointCount };
  return {
    input: {
      name: form.name.trim(),
      setupId,
      axes,
      repeats: repeats!,
      referenceEvery,
      orderMode: form.orderMode,
      shuffleSeed,
      minutesPerPoint: minutes,
      notes: form.notes,
    },
    issues,
    pointCount,
  };
}

/** A stored plan as form text, each value in the unit it was typed in. */
export function planToFormValues(plan: Plan): PlanFormValues {
  return {
    name: plan.name,
    setupId: String(plan.setupId),
    axes: plan.axes.map((axis): AxisFormValues => {
      const show = (v: number) => formatAxisValue(v, axis.quantity, axis.displayUnit);
      const base = { ...NEW_AXIS[axis.quantity], quantity: axis.quantity, mode: axis.mode };
      if (axis.mode === 'list') return { ...base, values: axis.values.map(show).join(', ') };
      if (axis.mode === 'range') return { ...base, start: show(axis.start), stop: show(axis.stop), step: show(axis.step) };
      return { ...base, start: show(axis.start), stop: show(axis.stop), count: String(axis.count), spacing: axis.spacing };
    }),
    repeats: String(plan.repeats),
    referenceEvery: plan.referenceEvery === null ? '' : String(plan.referenceEvery),
    orderMode: plan.orderMode,
    shuffleSeed: String(plan.shuffleSeed ?? newSeed()),
    minutesPerPoint: String(plan.minutesPerPoint),
    notes: plan.notes,
  };
}
