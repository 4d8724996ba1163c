/**
 * Warnings that look at a derivation's results: |k| above 1, efficiency above 1, a primary result
 * whose relative uncertainty is above PRIMARY_UNCERTAINTY_WARNING, and a sign the method cannot see.
 */
import { METHOD_SPECS, type MeasurementMethod } from './methods';
import type { Derivation, DerivationContext } from './types';
import { formatPercent } from './read-fields';

/** Above this relative standard uncertainty of the method's primary result, the reading is flagged. */
export const PRIMARY_UNCERTAINTY_WARNING = 0.1;

const QUANTITY_NAMES = { mutualInductance: 'mutual inductance M', coupling: 'coupling k', efficiency: 'efficiency \u03b7' } as const;
/** Methods that subtract nearly equal readings, whose precision collapses at low coupling. */
const DIFFERENCE_METHODS: readonly MeasurementMethod[] = ['aiding_opposing', 'short_open'];
/** Methods that give |M| or |k| only. */
const UNSIGNED_METHODS: readonly MeasurementMethod[] = ['aiding_opposing', 'short_open', 'split_peaks'];

/** Warnings that look at the derived values: |k| > 1, eta > 1, a loose primary result, an unmeasured sign. */
export function addResultWarnings(method: MeasurementMethod, d: Derivation, context: DerivationContext): void {
  if (d.coupling && Math.abs(d.coupling.value) > 1) {
    d.warnings.push(`|k| = ${Number(Math.abs(d.coupling.value).toPrecision(4))} is above 1, which no pair of coils can reach: check the readings and the self-inductances.`);
  }
  if (d.efficiency && d.efficiency.value > 1) {
    d.warnings.push(`\u03b7 = ${Number(d.efficiency.value.toPrecision(4))} is above 1: check the meters\u2019 calibration and connections.`);
  }
  const primary = METHOD_SPECS[method].yields[0];
  const result = d[primary];
  if (result) {
    const name = QUANTITY_NAMES[primary];
    const relative = result.uncertainty / Math.abs(result.value);
    const hint = DIFFERENCE_METHODS.includes(method)
      ? ' This method subtracts two nearly equal readings at low coupling; the open-circuit-voltage or two-port method is more precise here.'
      : '';
    if (Number.isNaN(result.uncertainty)) {
      d.warnings.push(`The uncertainty of the ${name} could not be evaluated at this reading.`);
    } else if (result.value === 0) {
      d.warnings.push(`The ${name} came out as zero, so its relative uncertainty is unbounded.${hint}`);
    } else if (relative > PRIMARY_UNCERTAINTY_WARNING) {
      d.warnings.push(
        `The ${name} carries a relative standard uncertainty of ${formatPercent(relative)}, above ${formatPercent(PRIMARY_UNCERTAINTY_WARNING)}.${hint}`,
      );
    }
  }
  const signed = d.coupling ?? d.mutualInductance;
  if (UNSIGNED_METHODS.includes(method) && signed && signed.value >= 0 && (context.predicted?.coupling ?? 0) < 0) {
    d.warnings.push(
      'This method gives the magnitude of the coupling, not its sign; the predicted coupling is negative (its sign follows the winding senses), so compare magnitudes.',
    );
  }
}
