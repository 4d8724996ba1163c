/**
 * What a derivation returns: measured values with standard uncertainties, the formula that produced
 * them (named and versioned, so a stored reading says how its numbers were obtained), and warnings.
 */

/** A measured quantity and its combined standard uncertainty, in the same SI unit. */
export interface MeasuredValue {
  value: number;
  uncertainty: number;
}

export interface FormulaRef {
  /** stable id, e.g. "open-circuit-voltage" */
  id: string;
  /** bumped whenever the formula or its uncertainty treatment changes */
  version: number;
  name: string;
  /** the published source of the formula */
  source: string;
}

/** The plan point's predicted values a derivation may lean on. */
export interface PredictedForDerivation {
  coupling: number;
  /** [H] */
  txSelfInductance: number;
  /** [H] */
  rxSelfInductance: number;
}

export interface DerivationContext {
  /** null when the point has no prediction yet */
  predicted: PredictedForDerivation | null;
}

export interface Derivation {
  formula: FormulaRef;
  /** [H], signed where the method gives a sign */
  mutualInductance: MeasuredValue | null;
  /** [-] */
  coupling: MeasuredValue | null;
  /** [-], 0..1 (a measured value above 1 is kept and warned about) */
  efficiency: MeasuredValue | null;
  /** where the self-inductances that turn M into k (or k into M) came from */
  selfInductanceSource: 'measured' | 'predicted' | 'none';
  /** plain sentences for the person at the bench */
  warnings: string[];
}

/** A raw value that no derivation can use (Lsc above Loc, fl above fh, zero current...). */
export class ReadingInputError extends Error {
  /** the RawReading key at fault */
  readonly field: string;

  constructor(field: string, message: string) {
    super(message);
    this.name = 'ReadingInputError';
    this.field = field;
  }
}
