/**
 * From a bench reading to mutual inductance M [H], coupling k and efficiency, each with its GUM
 * first-order standard uncertainty (JCGM 100:2008), the formula that produced it (FORMULAS) and
 * warnings for the person at the bench.
 *
 * Self-inductances that turn M into k (or k into M) come from the reading when measured, else from the
 * plan point's prediction; one measured and one predicted is allowed and reported as 'predicted'. A
 * predicted value is taken as exact, so the uncertainty then leaves out the model's error (said in a
 * warning).
 */
import { METHOD_SPECS, type InstrumentAccuracy, type MeasurementMethod, type RawReading } from './methods';
import { ReadingInputError, type Derivation, type DerivationContext, type MeasuredValue } from './types';
import { FORMULAS } from './formulas';
import { fieldReader, formatPercent, formatQuantity, selfInductance, type FieldReader, type SelfInductance } from './read-fields';
import { directPowerPlan } from './direct-power';
import { addResultWarnings } from './result-warnings';
import { propagateUncertainty, readingUncertainties, type MeasurementInputs } from './uncertainty';

export { FORMULAS } from './formulas';
export { PRIMARY_UNCERTAINTY_WARNING } from './result-warnings';

/** Above this expected relative uncertainty at the predicted k, a method is flagged before measuring. */
export const METHOD_FIT_WARNING = 0.05;
/**
 * An open receiver's voltage is in quadrature with the drive current (V2 = j ω M I1); a phase further
 * than this from ±90° [degrees] means the reading holds more than mutual coupling.
 */
export const QUADRATURE_TOLERANCE_DEG = 30;

const DEG = Math.PI / 180;
const TWO_PI = 2 * Math.PI;
type Fn = (x: MeasurementInputs) => number;

/** What a method contributes before propagation: functions of `inputs` and its own warnings. */
interface Plan {
  inputs: MeasurementInputs;
  mutual: Fn | null;
  coupling: Fn | null;
  efficiency: Fn | null;
  selfInductanceSource: Derivation['selfInductanceSource'];
  warnings: string[];
}

/**
 * Derive M, k or efficiency from one raw reading by the method's formula (FORMULAS[method]), with
 * combined standard uncertainties from the instrument's accuracy applied to each raw value.
 * Throws ReadingInputError naming the field when a value cannot be used (zero current or frequency,
 * Lsc above Loc, fl not below fh, no real input power...).
 */
export function deriveReading(
  method: MeasurementMethod,
  raw: RawReading,
  accuracy: InstrumentAccuracy,
  context: DerivationContext,
): Derivation {
  const read = fieldReader(method, raw);
  const plan = PLANNERS[method](read, context);
  const uncertainties = readingUncertainties(method, raw, accuracy);
  const measure = (f: Fn | null): MeasuredValue | null => {
    if (!f) return null;
    const { value, uncertainty } = propagateUncertainty(f, plan.inputs, uncertainties);
    return { value, uncertainty };
  };
  const derivation: Derivation = {
    formula: FORMULAS[method],
    mutualInductance: measure(plan.mutual),
    coupling: measure(plan.coupling),
    efficiency: measure(plan.efficiency),
    selfInductanceSource: plan.selfInductanceSource,
    warnings: plan.warnings,
  };
  addResultWarnings(method, derivation, context);
  return derivation;
}

const PLANNERS: Record<MeasurementMethod, (read: FieldReader, context: DerivationContext) => Plan> = {
  open_circuit(read, context) {
    const frequency = read.positive('frequency', '\u03c9 = 2\u03c0f divides the reading');
    const txCurrent = read.required('txCurrent');
    if (txCurrent === 0) throw new ReadingInputError('txCurrent', `${read.label('txCurrent')} must not be zero: M = |V2| / (\u03c9 |I1|) divides by it.`);
    const rxVoltage = read.required('rxVoltage');
    const phase = read.optional('phaseDeg');
    const warnings: string[] = [];
    // The sign is fixed before propagation: it is not a smooth function of the phase.
    const sign = phase !== undefined && Math.sin(phase * DEG) < 0 ? -1 : 1;
    if (phase !== undefined && Math.abs(Math.cos(phase * DEG)) > Math.sin(QUADRATURE_TOLERANCE_DEG * DEG)) {
      warnings.push(
        `The phase of V2 against I1 is ${Number(phase.toPrecision(4))}\u00b0, more than ${QUADRATURE_TOLERANCE_DEG}\u00b0 from \u00b190\u00b0. ` +
          'An open receiver\u2019s voltage is in quadrature with the drive current, so part of this reading is not mutual coupling ' +
          '(capacitive pickup, a loaded receiver or a probe ground loop).',
      );
    }
    if (phase === undefined && (context.predicted?.coupling ?? 0) < 0) {
      warnings.push('No phase was entered, so M is taken as positive while the prediction is negative. Enter the phase of V2 against I1 to measure the sign.');
    }
    const mutual: Fn = (x) => (sign * Math.abs(x.rxVoltage)) / (TWO_PI * x.frequency * Math.abs(x.txCurrent));
    return mutualFirst(read, context, { frequency, txCurrent, rxVoltage }, mutual, warnings);
  },

  aiding_opposing(read, context) {
    const aidingInductance = read.positive('aidingInductance');
    const opposingInductance = read.nonNegative('opposingInductance');
    const warnings: string[] = [];
    if (aidingInductance < opposingInductance) {
      warnings.push('La is below Lo, so M comes out negative. With the fields adding La is the larger reading: check that the two were not swapped.');
    }
    const mutual: Fn = (x) => (x.aidingInductance - x.opposingInductance) / 4;
    return mutualFirst(read, context, { aidingInductance, opposingInductance }, mutual, warnings);
  },

  short_open(read, context) {
    const openInductance = read.positive('openInductance');
    const shortInductance = read.nonNegative('shortInductance');
    if (shortInductance > openInductance) {
      throw new ReadingInputError(
        'shortInductance',
        `Lsc (${formatQuantity(shortInductance, 'H')}) is above Loc (${formatQuantity(openInductance, 'H')}): shorting the receiver can only ` +
          'lower the inductance seen at the transmitter. Check that the two readings were not swapped.',
      );
    }
    const coupling: Fn = (x) => Math.sqrt(1 - x.shortInductance / x.openInductance);
    const inputs: MeasurementInputs = { shortInductance, openInductance };
    const rx = selfInductance(read, 'rxSelfInductance', context.predicted);
    const warnings: string[] = [];
    if (!rx) {
      warnings.push('M = k sqrt(Loc L2) needs L2: enter it measured alone, or compute the prediction first.');
      return { inputs, mutual: null, coupling, efficiency: null, selfInductanceSource: 'none', warnings };
    }
    inputs.rxSelfInductance = rx.value;
    if (!rx.measured) warnings.push(predictedNote('M', ['L2']));
    const mutual: Fn = (x) => coupling(x) * Math.sqrt(x.openInductance * x.rxSelfInductance);
    return { inputs, mutual, coupling, efficiency: null, selfInductanceSource: rx.measured ? 'measured' : 'predicted', warnings };
  },

  two_port(read) {
    const frequency = read.positive('frequency', '\u03c9 = 2\u03c0f divides the reading');
    const omega = TWO_PI * frequency;
    const z11Im = read.required('z11Im');
    const z22Im = read.required('z22Im');
    const z21Im = read.required('z21Im');
    for (const [key, value, coil] of [['z11Im', z11Im, 'L1'], ['z22Im', z22Im, 'L2']] as const) {
      if (!(value > 0)) {
        throw new ReadingInputError(
          key,
          `${read.label(key)} must be above zero for ${coil} = Im / \u03c9 to be an inductance (got ${formatQuantity(value, '\u03a9')} at ` +
            `${formatQuantity(frequency, 'Hz')}, ${coil} = ${formatQuantity(value / omega, 'H')}): is the coil above its self-resonance?`,
        );
      }
    }
    return {
      inputs: { frequency, z11Im, z22Im, z21Im },
      mutual: (x) => x.z21Im / (TWO_PI * x.frequency),
      // omega cancels: k = Im Z21 / sqrt(Im Z11 Im Z22)
      coupling: (x) => x.z21Im / Math.sqrt(x.z11Im * x.z22Im),
      efficiency: null,
      selfInductanceSource: 'measured',
      warnings: [],
    };
  },

  split_peaks(read, context) {
    const lowPeak = read.positive('lowPeak');
    const highPeak = read.positive('highPeak');
    if (lowPeak >= highPeak) {
      throw new ReadingInputError(
        'lowPeak',
        `The lower peak fl (${formatQuantity(lowPeak, 'Hz')}) must be below the upper peak fh (${formatQuantity(highPeak, 'Hz')}).`,
      );
    }
    const coupling: Fn = (x) => (x.highPeak ** 2 - x.lowPeak ** 2) / (x.highPeak ** 2 + x.lowPeak ** 2);
    const inputs: MeasurementInputs = { lowPeak, highPeak };
    const ls = bothSelfInductances(read, context);
    if (!ls) {
      return { inputs, mutual: null, coupling, efficiency: null, selfInductanceSource: 'none', warnings: [missingSelfNote('M = k sqrt(L1 L2)')] };
    }
    Object.assign(inputs, { txSelfInductance: ls.tx.value, rxSelfInductance: ls.rx.value });
    const mutual: Fn = (x) => coupling(x) * Math.sqrt(x.txSelfInductance * x.rxSelfInductance);
    const warnings = ls.source === 'predicted' ? [predictedNote('M', predictedNames(ls))] : [];
    return { inputs, mutual, coupling, efficiency: null, selfInductanceSource: ls.source, warnings };
  },

  direct_power(read) {
    return { ...directPowerPlan(read), mutual: null, coupling: null, selfInductanceSource: 'none', warnings: [] };
  },
};

/** M from the method, then k = M / sqrt(L1 L2) where both self-inductances are known. */
function mutualFirst(read: FieldReader, context: DerivationContext, inputs: MeasurementInputs, mutual: Fn, warnings: string[]): Plan {
  const ls = bothSelfInductances(read, context);
  if (!ls) {
    warnings.push(missingSelfNote('k = M / sqrt(L1 L2)'));
    return { inputs, mutual, coupling: null, efficiency: null, selfInductanceSource: 'none', warnings };
  }
  const all = { ...inputs, txSelfInductance: ls.tx.value, rxSelfInductance: ls.rx.value };
  if (ls.source === 'predicted') warnings.push(predictedNote('k', predictedNames(ls)));
  const coupling: Fn = (x) => mutual(x) / Math.sqrt(x.txSelfInductance * x.rxSelfInductance);
  return { inputs: all, mutual, coupling, efficiency: null, selfInductanceSource: ls.source, warnings };
}

interface SelfPair {
  tx: SelfInductance;
  rx: SelfInductance;
  source: 'measured' | 'predicted';
}

function bothSelfInductances(read: FieldReader, context: DerivationContext): SelfPair | null {
  const tx = selfInductance(read, 'txSelfInductance', context.predicted);
  const rx = selfInductance(read, 'rxSelfInductance', context.predicted);
  if (!tx || !rx) return null;
  return { tx, rx, source: tx.measured && rx.measured ? 'measured' : 'predicted' };
}

const predictedNames = (ls: SelfPair): string[] => [...(ls.tx.measured ? [] : ['L1']), ...(ls.rx.measured ? [] : ['L2'])];

function predictedNote(quantity: string, names: string[]): string {
  const which = names.join(' and ');
  return (
    `${quantity} uses the predicted ${which}, taken as exact: its uncertainty leaves out the model\u2019s error. ` +
    `Measure ${which} alone for a full uncertainty.`
  );
}

const missingSelfNote = (formula: string) =>
  `${formula} needs L1 and L2: enter them measured alone, or compute the prediction first.`;

/**
 * The relative standard uncertainty the method's primary result would carry at coupling k with this
 * instrument, from the same propagation on a synthetic reading with L1 = L2 = 1 H: aiding/opposing
 * La = 2(1 + k), Lo = 2(1 - k) (M = k); short/open Lsc = 1 - k^2, Loc = 1. Null for the other methods,
 * whose relative precision does not depend on k, and for |k| > 1.
 * (REFERENCES: at 0.1 % meter error, aiding/opposing gives M to about 0.07 %/k, short/open k to about
 * 7 % at k = 0.1.)
 */
export function expectedRelativeUncertainty(method: MeasurementMethod, k: number, accuracy: InstrumentAccuracy): number | null {
  const size = Math.abs(k);
  if (!Number.isFinite(size) || size > 1) return null;
  let result: MeasuredValue | null;
  if (method === 'aiding_opposing') {
    result = deriveReading(method, { aidingInductance: 2 * (1 + size), opposingInductance: 2 * (1 - size) }, accuracy, { predicted: null }).mutualInductance;
  } else if (method === 'short_open') {
    result = deriveReading(method, { shortInductance: 1 - size * size, openInductance: 1 }, accuracy, { predicted: null }).coupling;
  } else {
    return null;
  }
  if (!result) return null;
  return result.value === 0 ? Number.POSITIVE_INFINITY : result.uncertainty / Math.abs(result.value);
}

/**
 * The warning shown before measuring when a method is a poor fit at the predicted coupling: its
 * expected relative uncertainty (expectedRelativeUncertainty) is above METHOD_FIT_WARNING. Null when the
 * method fits, and for methods whose precision does not depend on k.
 */
export function methodFitWarning(method: MeasurementMethod, predictedK: number, accuracy: InstrumentAccuracy): string | null {
  const relative = expectedRelativeUncertainty(method, predictedK, accuracy);
  if (relative === null || !(relative > METHOD_FIT_WARNING)) return null;
  const result = method === 'aiding_opposing' ? 'M' : 'k';
  const expected = Number.isFinite(relative)
    ? `would give ${result} to about \u00b1${formatPercent(relative)} (one standard uncertainty)`
    : `cannot resolve ${result} at all`;
  return (
    `At the predicted k = ${Number(predictedK.toPrecision(3))}, the ${METHOD_SPECS[method].label.toLowerCase()} method ${expected} ` +
    `with a ${formatPercent(accuracy.relative)} instrument, because it subtracts two nearly equal readings. ` +
    'The open-circuit-voltage or two-port method suits this coupling better.'
  );
}
