/**
 * Weighted least squares for one effective parameter of a model (a tilt error, a distance error, an
 * extra resistance), so a reviewer can see whether one plausible cause explains the residuals. The model
 * is async because the server evaluates it on a worker pool.
 *
 * Gauss-Newton with a central-difference Jacobian (one-sided at a bound), damped by halving the step
 * while chi-square does not fall, clamped to [lower, upper]. The standard uncertainty comes from the
 * weighted normal equations, var(p) = 1 / sum (J_i / u_i)^2, scaled by sqrt(reduced chi-square) when
 * the scatter is larger than the stated uncertainties explain (common practice, e.g. Bevington &
 * Robinson, Data Reduction and Error Analysis, ch. 6-8).
 */

export interface OneParameterProblem {
  /** model values at parameter p, one per measurement, same order */
  evaluate(p: number): Promise<number[]>;
  measured: readonly number[];
  /** standard uncertainties (> 0) of the measured values: weights 1/u^2 */
  uncertainties: readonly number[];
  start: number;
  /** step for the central-difference derivative and the first move, in parameter units */
  step: number;
  lower: number;
  upper: number;
  /** default 30 */
  maxIterations?: number;
}

export interface OneParameterFit {
  value: number;
  /**
   * standard uncertainty: 1/sqrt(sum (J_i/u_i)^2), multiplied by sqrt(reduced chi-square) when that
   * exceeds 1; Infinity when the model does not depend on the parameter at the estimate
   */
  uncertainty: number;
  chiSquare: number;
  /** n - 1 */
  dof: number;
  /** null when dof = 0 */
  reducedChiSquare: number | null;
  iterations: number;
  converged: boolean;
  /** model values at the estimate */
  fitted: number[];
  /** true when the estimate sits on a bound */
  atBound: boolean;
}

/** Bad fit input, with the field to fix. */
export class FitInputError extends Error {
  constructor(message: string, readonly field: string) {
    super(message);
    this.name = 'FitInputError';
  }
}

const DEFAULT_MAX_ITERATIONS = 30;
/** Relative parameter change treated as no change (scaled by max(|p|, step)). */
const PARAMETER_TOL = 1e-6;
/** Relative chi-square change treated as no change. */
const CHI_SQUARE_TOL = 1e-10;
/** Halvings of a step before concluding that no nearby point is better. */
const MAX_HALVINGS = 40;

/** sum ((measured_i - model_i) / u_i)^2 */
export function chiSquare(model: readonly number[], measured: readonly number[], uncertainties: readonly number[]): number {
  let chi2 = 0;
  for (let i = 0; i < measured.length; i++) chi2 += ((measured[i] - model[i]) / uncertainties[i]) ** 2;
  return chi2;
}

function validate(p: OneParameterProblem): void {
  const n = p.measured.length;
  if (n < 1) throw new FitInputError('at least one measured value is needed', 'measured');
  if (p.measured.some((v) => !Number.isFinite(v))) throw new FitInputError('measured values must be finite numbers', 'measured');
  if (p.uncertainties.length !== n) {
    throw new FitInputError(`${p.uncertainties.length} uncertainties given for ${n} measured values`, 'uncertainties');
  }
  if (p.uncertainties.some((u) => !Number.isFinite(u) || u <= 0)) {
    throw new FitInputError('uncertainties must be finite and greater than zero', 'uncertainties');
  }
  if (!Number.isFinite(p.lower) || !Number.isFinite(p.upper) || !(p.lower < p.upper)) {
    throw new FitInputError('bounds must be finite with lower < upper', 'bounds');
  }
  if (!Number.isFinite(p.start) || p.start < p.lower || p.start > p.upper) {
    throw new FitInputError(`start ${p.start} must lie within [${p.lower}, ${p.upper}]`, 'start');
  }
  if (!Number.isFinite(p.step) || p.step <= 0) throw new FitInputError('step must be a finite number greater than zero', 'step');
}

async function modelAt(problem: OneParameterProblem, p: number): Promise<number[]> {
  const values = await problem.evaluate(p);
  if (values.length !== problem.measured.length || values.some((v) => !Number.isFinite(v))) {
    throw new Error(`The model could not be evaluated at p = ${p}`);
  }
  return values;
}

const clamp = (x: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, x));

/** dModel/dp: central difference, shortened or one-sided where a bound is nearer than the step. */
async function jacobian(problem: OneParameterProblem, p: number, atP: readonly number[]): Promise<number[]> {
  const hUp = Math.min(problem.step, problem.upper - p);
  const hDown = Math.min(problem.step, p - problem.lower);
  const up = hUp > 0 ? await modelAt(problem, p + hUp) : atP;
  const down = hDown > 0 ? await modelAt(problem, p - hDown) : atP;
  return up.map((v, i) => (v - down[i]) / (hUp + hDown));
}

/** Gauss-Newton normal equations for one parameter: sum (J/u)^2 and sum J r / u^2. */
function normal(J: readonly number[], model: readonly number[], problem: OneParameterProblem): { jtj: number; jtr: number } {
  let jtj = 0;
  let jtr = 0;
  for (let i = 0; i < J.length; i++) {
    const w = 1 / problem.uncertainties[i] ** 2;
    jtj += J[i] * J[i] * w;
    jtr += J[i] * (problem.measured[i] - model[i]) * w;
  }
  return { jtj, jtr };
}

export async function fitOneParameter(problem: OneParameterProblem): Promise<OneParameterFit> {
  validate(problem);
  const { measured, uncertainties, lower, upper, step } = problem;
  const maxIterations = problem.maxIterations ?? DEFAULT_MAX_ITERATIONS;
  let p = problem.start;
  let model = await modelAt(problem, p);
  let chi2 = chiSquare(model, measured, uncertainties);
  let converged = false;
  let iterations = 0;
  // the Jacobian and where it was taken, reused when the estimate has not moved since
  let J = await jacobian(problem, p, model);
  let jacobianAt = p;

  while (iterations < maxIterations && !converged) {
    iterations += 1;
    if (jacobianAt !== p) {
      J = await jacobian(problem, p, model);
      jacobianAt = p;
    }
    const { jtj, jtr } = normal(J, model, problem);
    const flat = !(jtj > 0 && Number.isFinite(jtr / jtj));
    // a zero Gauss-Newton step with a proper slope: already at the minimum
    if (!flat && jtr === 0) {
      converged = true;
      break;
    }
    // With a flat model here (e.g. an even function at its centre) Gauss-Newton has no direction:
    // probe one step either way instead.
    let delta = flat ? step : jtr / jtj;
    const tol = PARAMETER_TOL * Math.max(Math.abs(p), step);
    let moved = false;
    // A move below the tolerance is still tried once (it costs one evaluation and, with a
    // finite-difference Jacobian, removes most of the remaining error); the fit then stops.
    for (let halving = 0; halving <= MAX_HALVINGS && (halving === 0 || Math.abs(delta) >= tol); halving++) {
      const candidates = flat ? [delta, -delta] : [delta];
      for (const d of candidates) {
        const trial = clamp(p + d, lower, upper);
        if (trial === p) continue;
        const trialModel = await modelAt(problem, trial);
        const trialChi2 = chiSquare(trialModel, measured, uncertainties);
        if (trialChi2 < chi2) {
          const change = Math.abs(trial - p);
          const chiChange = chi2 - trialChi2;
          p = trial;
          model = trialModel;
          converged = change < PARAMETER_TOL * Math.max(Math.abs(p), step) || chiChange <= CHI_SQUARE_TOL * chi2 + Number.MIN_VALUE;
          chi2 = trialChi2;
          moved = true;
          break;
        }
      }
      if (moved) break;
      delta /= 2;
    }
    // no point within the step (down to the tolerance) improves chi-square: this is the minimum
    if (!moved) converged = true;
  }

  if (jacobianAt !== p) J = await jacobian(problem, p, model);
  const { jtj } = normal(J, model, problem);
  const n = measured.length;
  const dof = n - 1;
  const reducedChiSquare = dof > 0 ? chi2 / dof : null;
  const scale = reducedChiSquare !== null && reducedChiSquare > 1 ? Math.sqrt(reducedChiSquare) : 1;
  const uncertainty = jtj > 0 ? scale / Math.sqrt(jtj) : Infinity;
  return {
    value: p, uncertainty, chiSquare: chi2, dof, reducedChiSquare, iterations, converged,
    fitted: model, atBound: p === lower || p === upper,
  };
}
