/**
 * Physical validation of a solve request. Shape (types, required fields) is the zod schema's job at the
 * API edge; this refuses what is physically impossible or too large, defensively including NaN/Infinity.
 */
import { ABSOLUTE_ZERO_C } from './constants';
import { MATERIALS, REFERENCE_TEMPERATURE_C } from './resistance';
import type { CoilSpec, SolveRequest } from './types';

export interface SolveIssue {
  path: (string | number)[];
  message: string;
}

/** Thrown by solve for physically invalid input; the API maps it to 422 with every issue's path. */
export class SolveInputError extends Error {
  constructor(readonly issues: SolveIssue[]) {
    super(issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; '));
    this.name = 'SolveInputError';
  }
}

/** Accepted tolerance range (PRODUCT.md). */
export const MIN_TOLERANCE = 1e-9;
export const MAX_TOLERANCE = 1e-2;
/** Largest winding accepted ("more than 2,000 turns" is refused). */
export const MAX_TURNS = 2000;
/** Largest strand count accepted (fine litz has a few thousand strands). */
export const MAX_STRANDS = 100_000;

type Check = (path: (string | number)[], message: string) => void;

function finitePositive(v: unknown, path: (string | number)[], add: Check, allowZero = false): v is number {
  if (typeof v !== 'number' || !Number.isFinite(v)) {
    add(path, 'must be a finite number');
    return false;
  }
  if (allowZero ? v < 0 : v <= 0) {
    add(path, allowZero ? 'must not be negative' : 'must be positive');
    return false;
  }
  return true;
}

function checkCoil(c: CoilSpec | undefined, at: string, add: Check): void {
  if (!c || typeof c !== 'object') return add([at], 'is required');
  const wireOk = finitePositive(c.wireDiameter, [at, 'wireDiameter'], add);
  const d = wireOk ? c.wireDiameter : 0;
  if (c.kind === 'loop' || c.kind === 'helix') {
    if (finitePositive(c.radius, [at, 'radius'], add) && wireOk && d / 2 >= c.radius) {
      add([at, 'wireDiameter'], 'wire radius must be smaller than the coil radius');
    }
  }
  if (c.kind === 'helix' || c.kind === 'spiral') {
    if (finitePositive(c.turns, [at, 'turns'], add) && c.turns > MAX_TURNS) {
      add([at, 'turns'], `more than ${MAX_TURNS} turns is too large a request`);
    }
  }
  if (c.kind === 'helix' && finitePositive(c.length, [at, 'length'], add, true) && wireOk && c.turns > 1) {
    if (c.length / c.turns < d) add([at, 'length'], 'turns overlap: length / turns is less than the wire diameter');
  }
  if (c.kind === 'spiral') {
    const inOk = finitePositive(c.innerRadius, [at, 'innerRadius'], add);
    const outOk = finitePositive(c.outerRadius, [at, 'outerRadius'], add);
    if (inOk && outOk && c.outerRadius <= c.innerRadius) add([at, 'outerRadius'], 'must exceed innerRadius');
    else if (inOk && outOk && wireOk) {
      if ((c.outerRadius - c.innerRadius) / c.turns < d) add([at, 'turns'], 'turns overlap: radial pitch is less than the wire diameter');
      if (c.innerRadius < d / 2) add([at, 'innerRadius'], 'must be at least the wire radius');
    }
  }
  if (c.kind !== 'loop' && c.kind !== 'helix' && c.kind !== 'spiral') add([at, 'kind'], 'must be loop, helix or spiral');
  if (c.material !== undefined && !(c.material in MATERIALS)) add([at, 'material'], 'must be copper or aluminium');
  if (c.temperatureC !== undefined) {
    const t = c.temperatureC;
    const alpha = MATERIALS[c.material ?? 'copper']?.alpha20 ?? 0;
    if (typeof t !== 'number' || !Number.isFinite(t)) add([at, 'temperatureC'], 'must be a finite number');
    else if (t <= ABSOLUTE_ZERO_C || 1 + alpha * (t - REFERENCE_TEMPERATURE_C) <= 0) {
      add([at, 'temperatureC'], 'is below the range of the linear resistivity model');
    }
  }
  if (c.strands !== undefined && finitePositive(c.strands, [at, 'strands'], add)) {
    if (!Number.isInteger(c.strands) || c.strands > MAX_STRANDS) add([at, 'strands'], `must be an integer 1..${MAX_STRANDS}`);
    if (c.strands > 1 && c.strandDiameter === undefined) add([at, 'strandDiameter'], 'is required with strands');
  }
  if (c.strandDiameter !== undefined && finitePositive(c.strandDiameter, [at, 'strandDiameter'], add) && wireOk) {
    if (c.strandDiameter > d) add([at, 'strandDiameter'], 'must not exceed wireDiameter');
  }
  if (c.resistance !== undefined) finitePositive(c.resistance, [at, 'resistance'], add);
}

/** Every physical problem of a request (empty when it can be solved); geometry clearance is checked in solve. */
export function validateSolveRequest(r: SolveRequest): SolveIssue[] {
  const issues: SolveIssue[] = [];
  const add: Check = (path, message) => issues.push({ path, message });
  checkCoil(r.transmitter, 'transmitter', add);
  checkCoil(r.receiver, 'receiver', add);
  const p = r.placement;
  if (!p || typeof p !== 'object') add(['placement'], 'is required');
  else if ('normal' in p) {
    [0, 1, 2].forEach((i) => {
      if (!Number.isFinite(p.center?.[i])) add(['placement', 'center', i], 'must be a finite number');
      if (!Number.isFinite(p.normal?.[i])) add(['placement', 'normal', i], 'must be a finite number');
    });
    if (p.normal?.every(Number.isFinite) && Math.hypot(...p.normal) === 0) add(['placement', 'normal'], 'must not be zero');
  } else {
    for (const key of ['distance', 'lateralOffset', 'tiltDeg'] as const) {
      const v = p[key];
      if ((key === 'distance' || v !== undefined) && !Number.isFinite(v)) add(['placement', key], 'must be a finite number');
    }
  }
  const c = r.circuit;
  if (!c || typeof c !== 'object') add(['circuit'], 'is required');
  else {
    finitePositive(c.frequency, ['circuit', 'frequency'], add);
    if (!['SS', 'SP', 'PS', 'PP'].includes(c.topology)) add(['circuit', 'topology'], 'must be SS, SP, PS or PP');
    finitePositive(c.sourceVoltage, ['circuit', 'sourceVoltage'], add, true);
    finitePositive(c.sourceResistance, ['circuit', 'sourceResistance'], add, true);
    finitePositive(c.loadResistance, ['circuit', 'loadResistance'], add);
    if (c.txCapacitance !== undefined) finitePositive(c.txCapacitance, ['circuit', 'txCapacitance'], add);
    if (c.rxCapacitance !== undefined) finitePositive(c.rxCapacitance, ['circuit', 'rxCapacitance'], add);
  }
  if (r.tolerance !== undefined) {
    const t = r.tolerance;
    if (typeof t !== 'number' || !Number.isFinite(t) || t < MIN_TOLERANCE || t > MAX_TOLERANCE) {
      add(['tolerance'], `must be between ${MIN_TOLERANCE} and ${MAX_TOLERANCE}`);
    }
  }
  return issues;
}
