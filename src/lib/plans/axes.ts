/**
 * Sweep-plan axes: what varies, and how its values are written down. Pure: no server
 * imports, so the plan form shows the same values and counts the server stores. Values are SI
 * (metres, degrees, hertz, ohms); `displayUnit` is the unit the person typed, for showing them back.
 */

export const AXIS_QUANTITIES = ['distance', 'lateralOffset', 'tiltDeg', 'frequencyHz', 'loadResistance'] as const;
export type AxisQuantity = (typeof AXIS_QUANTITIES)[number];

export const AXIS_LABELS: Record<AxisQuantity, string> = {
  distance: 'distance',
  lateralOffset: 'lateral offset',
  tiltDeg: 'tilt',
  frequencyHz: 'frequency',
  loadResistance: 'load resistance',
};

interface AxisBase {
  quantity: AxisQuantity;
  /** the unit the values were typed in ("cm", "deg", "MHz", "ohm"); values themselves are SI */
  displayUnit: string;
}

export type PlanAxis =
  | (AxisBase & { mode: 'range'; start: number; stop: number; step: number })
  | (AxisBase & { mode: 'count'; start: number; stop: number; count: number; spacing: 'linear' | 'log' })
  | (AxisBase & { mode: 'list'; values: number[] });

export interface AxisIssue {
  /** path inside the axis ("step", "values.2") */
  path: string;
  message: string;
}

/** Most values one axis may have (the whole plan is capped at MAX_PLAN_POINTS anyway). */
export const MAX_AXIS_VALUES = 5000;

/** Relative slack for a range whose stop is a whole number of steps away in decimal but not in binary. */
const RANGE_SLACK = 1e-9;

/** Removes binary noise (0.1 + 0.2) so stored values read as typed; 12 significant digits. */
function clean(value: number): number {
  return value === 0 ? 0 : Number(value.toPrecision(12));
}

/** Physical limits of each quantity [SI], as the setup form enforces them. */
const LIMITS: Record<AxisQuantity, { min: number; max: number; minExclusive?: boolean; message: string }> = {
  distance: { min: -100, max: 100, message: 'Distances must be within 100 m.' },
  lateralOffset: { min: -100, max: 100, message: 'Lateral offsets must be within 100 m.' },
  tiltDeg: { min: -180, max: 180, message: 'Tilts must be between -180 and 180 degrees.' },
  frequencyHz: { min: 1, max: 300e6, message: 'Frequencies must be between 1 Hz and 300 MHz.' },
  loadResistance: { min: 0, max: 1e9, minExclusive: true, message: 'Load resistances must be greater than zero.' },
};

/** How many values the axis has, without building them (NaN when the axis is not well formed). */
export function axisValueCount(axis: PlanAxis): number {
  switch (axis.mode) {
    case 'list':
      return axis.values.length;
    case 'count':
      return axis.count;
    case 'range': {
      if (!(axis.step > 0)) return NaN;
      const steps = Math.abs(axis.stop - axis.start) / axis.step;
      return Math.floor(steps + RANGE_SLACK * Math.max(1, steps)) + 1;
    }
  }
}

/** Problems with one axis, with paths inside it; empty when it can be expanded. */
export function axisIssues(axis: PlanAxis): AxisIssue[] {
  const issues: AxisIssue[] = [];
  const finite = (value: number, path: string) => {
    if (!Number.isFinite(value)) issues.push({ path, message: 'Enter a number.' });
  };
  if (axis.mode === 'range') {
    finite(axis.start, 'start');
    finite(axis.stop, 'stop');
    if (!(axis.step > 0) || !Number.isFinite(axis.step)) issues.push({ path: 'step', message: 'The step must be greater than zero.' });
  } else if (axis.mode === 'count') {
    finite(axis.start, 'start');
    finite(axis.stop, 'stop');
    if (!Number.isInteger(axis.count) || axis.count < 1) issues.push({ path: 'count', message: 'The count must be a whole number of at least 1.' });
    if (axis.spacing === 'log' && !(axis.start > 0 && axis.stop > 0)) {
      issues.push({ path: axis.start > 0 ? 'stop' : 'start', message: 'Logarithmic spacing needs a start and stop above zero.' });
    }
  } else {
    if (axis.values.length === 0) issues.push({ path: 'values', message: 'List at least one value.' });
    axis.values.forEach((value, i) => finite(value, `values.${i}`));
  }
  if (issues.length > 0) return issues;
  const count = axisValueCount(axis);
  if (count > MAX_AXIS_VALUES) {
    issues.push({ path: axis.mode === 'range' ? 'step' : axis.mode === 'count' ? 'count' : 'values', message: `An axis has at most ${MAX_AXIS_VALUES.toLocaleString('en')} values; this one has ${count.toLocaleString('en')}.` });
    return issues;
  }
  const limit = LIMITS[axis.quantity];
  const values = expandAxis(axis);
  const outside = values.findIndex((v) => v > limit.max || (limit.minExclusive ? v <= limit.min : v < limit.min));
  if (outside >= 0) issues.push({ path: axis.mode === 'list' ? `values.${outside}` : outside === 0 ? 'start' : 'stop', message: limit.message });
  return issues;
}

/**
 * The axis's values in order. A range includes its stop when the stop is a whole number of steps from
 * the start (0.05..0.2 by 0.05 gives 4 values, though 0.15 / 0.05 is 2.9999999999999996 in binary) and
 * runs downwards when stop < start. Log spacing is geometric between start and stop, both kept exact.
 */
export function expandAxis(axis: PlanAxis): number[] {
  if (axis.mode === 'list') return [...axis.values];
  const n = axisValueCount(axis);
  if (!(n >= 1)) return [];
  if (axis.mode === 'range') {
    const direction = axis.stop >= axis.start ? 1 : -1;
    return Array.from({ length: n }, (_, i) => {
      const value = axis.start + direction * i * axis.step;
      // the last value snaps to the stop when it is within the slack, so the stop is stored as typed
      return Math.abs(value - axis.stop) <= RANGE_SLACK * axis.step ? axis.stop : clean(value);
    });
  }
  if (n === 1) return [axis.start];
  return Array.from({ length: n }, (_, i) => {
    if (i === 0) return axis.start;
    if (i === n - 1) return axis.stop;
    const t = i / (n - 1);
    return clean(axis.spacing === 'log' ? axis.start * Math.pow(axis.stop / axis.start, t) : axis.start + (axis.stop - axis.start) * t);
  });
}
