/**
 * First-order propagation of uncertainty for uncorrelated inputs, the GUM's law of propagation of
 * uncertainty (JCGM 100:2008, 5.1.2, eq. 10):
 *   u_c^2(y) = sum_i (df/dx_i)^2 u^2(x_i).
 * The sensitivity coefficients df/dx_i come from central differences, so any derivation formula can be
 * propagated without writing its partial derivatives by hand.
 */
import { METHOD_SPECS, type InstrumentAccuracy, type MeasurementMethod, type RawFieldKind, type RawReading } from './methods';
import type { MeasuredValue } from './types';

/** Named inputs of a measurement function, in SI (phases in degrees). */
export type MeasurementInputs = Record<string, number>;

export interface Propagation extends MeasuredValue {
  /** |df/dx_i| u(x_i) for each input with an uncertainty, in the unit of the result (the GUM's u_i(y)) */
  contributions: Record<string, number>;
}

/**
 * Relative step of the central difference: eps^(1/3) balances the truncation error (~h^2) against
 * rounding (~eps/h) (W. H. Press et al., Numerical Recipes, 3rd ed., 5.7).
 */
const RELATIVE_STEP = Math.cbrt(Number.EPSILON);

/**
 * y = f(x) and its combined standard uncertainty u_c(y) by the GUM's first-order law (JCGM 100:2008,
 * eq. 10), inputs uncorrelated. Inputs missing from `uncertainties`, or with zero uncertainty, are taken
 * as exact. The step for input i is RELATIVE_STEP * max(|x_i|, u(x_i)): relative to the input where it
 * has a scale, and scaled from its uncertainty where it sits at zero (a phase of 0 degrees).
 * Where f is undefined just beside x_i (a square root at its branch point: k = sqrt(1 - Lsc/Loc) with
 * Lsc = Loc) the derivative does not exist and the first-order law does not hold; the spread of f over
 * one standard uncertainty on the defined side, |f(x) - f(x -+ u)|, stands in for |c_i| u_i, so the
 * result still says how far the value could reasonably be. Where f is undefined on both sides, the
 * contribution, and so u_c, is NaN.
 */
export function propagateUncertainty(
  f: (inputs: MeasurementInputs) => number,
  inputs: MeasurementInputs,
  uncertainties: Record<string, number>,
): Propagation {
  const value = f(inputs);
  const contributions: Record<string, number> = {};
  let sumOfSquares = 0;
  for (const [name, u] of Object.entries(uncertainties)) {
    if (!(name in inputs) || u === 0) continue;
    if (!(u > 0) || !Number.isFinite(u)) throw new RangeError(`The uncertainty of ${name} must be a finite number of zero or more, not ${u}.`);
    const contribution = Math.abs(sensitivity(f, inputs, name, value, u)) * u;
    contributions[name] = contribution;
    sumOfSquares += contribution * contribution;
  }
  return { value, uncertainty: Math.sqrt(sumOfSquares), contributions };
}

/** df/dx_name by a central difference; at a branch point, the one-sided secant over the uncertainty. */
function sensitivity(
  f: (inputs: MeasurementInputs) => number,
  inputs: MeasurementInputs,
  name: string,
  value: number,
  u: number,
): number {
  const x = inputs[name];
  const h = RELATIVE_STEP * Math.max(Math.abs(x), u);
  // Divide by the difference of the representable abscissae, not by 2h, so the step's rounding cancels.
  const xPlus = x + h;
  const xMinus = x - h;
  const fPlus = f({ ...inputs, [name]: xPlus });
  const fMinus = f({ ...inputs, [name]: xMinus });
  const plusOk = Number.isFinite(fPlus);
  const minusOk = Number.isFinite(fMinus);
  if (plusOk && minusOk) return (fPlus - fMinus) / (xPlus - xMinus);
  if (!plusOk && !minusOk) return Number.NaN;
  const side = plusOk ? x + u : x - u;
  return (f({ ...inputs, [name]: side }) - value) / (side - x);
}

/** Throws a RangeError unless both parts of the accuracy are finite and not negative. */
export function checkAccuracy(accuracy: InstrumentAccuracy): void {
  if (!(accuracy.relative >= 0) || !Number.isFinite(accuracy.relative)) {
    throw new RangeError(`The instrument's relative uncertainty must be a finite number of zero or more, not ${accuracy.relative}.`);
  }
  if (!(accuracy.phaseDeg >= 0) || !Number.isFinite(accuracy.phaseDeg)) {
    throw new RangeError(`The instrument's phase uncertainty must be a finite number of degrees, zero or more, not ${accuracy.phaseDeg}.`);
  }
}

/**
 * Standard uncertainty of one raw value from the instrument's accuracy: relative * |x| for magnitudes
 * (frequency, voltage, current, inductance, resistance, power; impedance parts each on their own value),
 * the fixed phase uncertainty [degrees] for angles.
 */
export function inputUncertainty(kind: RawFieldKind, value: number, accuracy: InstrumentAccuracy): number {
  return kind === 'angle' ? accuracy.phaseDeg : accuracy.relative * Math.abs(value);
}

/**
 * The standard uncertainty of every raw value the method takes that is present in the reading, keyed
 * like the reading, from METHOD_SPECS' field kinds.
 */
export function readingUncertainties(
  method: MeasurementMethod,
  raw: RawReading,
  accuracy: InstrumentAccuracy,
): Record<string, number> {
  checkAccuracy(accuracy);
  const out: Record<string, number> = {};
  for (const field of METHOD_SPECS[method].fields) {
    const value = raw[field.key];
    if (typeof value === 'number' && Number.isFinite(value)) out[field.key] = inputUncertainty(field.kind, value, accuracy);
  }
  return out;
}
