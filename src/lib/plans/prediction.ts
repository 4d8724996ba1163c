/** Predicted values of one plan point, in SI. */
export interface PointPrediction {
  /** [H], signed */
  mutualInductance: number;
  /** [-] */
  coupling: number;
  /** [H] */
  txSelfInductance: number;
  /** [H] */
  rxSelfInductance: number;
  /** AC resistance [ohm] */
  txResistance: number;
  /** AC resistance [ohm] */
  rxResistance: number;
  /** link efficiency [-] */
  efficiency: number;
  /** [W] */
  loadPower: number;
  /** field at the setup's operator point over the most restrictive reference level [-]; null without a point */
  fieldRatio: number | null;
}

export const PREDICTION_STATUSES = ['none', 'running', 'done', 'failed', 'cancelled'] as const;
export type PredictionStatus = (typeof PREDICTION_STATUSES)[number];
