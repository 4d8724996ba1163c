import 'server-only';
import type { Knex } from 'knex';
import Papa from 'papaparse';
import { db } from '../db';
import { requireStudyAccess } from '../auth/access';
import type { SessionUser } from '../auth/session-user';
import type { PlanPose } from '../plans/points';
import type { PointPrediction } from '../plans/prediction';
import { fromJsonColumn } from './json-column';
import { requirePlanInStudy } from './plan-lookup';

/** One point of a plan's run sheet, SI. */
export interface PlanPoint {
  id: number;
  /** measurement order, 1..n */
  seq: number;
  /** 1..repeats; reference points are 1 */
  repeatIndex: number;
  isReference: boolean;
  pose: PlanPose;
  predicted: PointPrediction | null;
  solverVersion: string | null;
}

interface PointRow {
  id: number | string;
  seq: number;
  repeat_index: number;
  is_reference: number | boolean;
  pose: unknown;
  predicted: unknown;
  solver_version: string | null;
}

/** The plan's points in measurement order, read inside the caller's access check (or transaction). */
export async function planPointRows(trx: Knex | Knex.Transaction, planId: number): Promise<PlanPoint[]> {
  const rows: PointRow[] = await trx('sweep_points').where({ plan_id: planId }).orderBy('seq')
    .select('id', 'seq', 'repeat_index', 'is_reference', 'pose', 'predicted', 'solver_version');
  return rows.map((row) => ({
    id: Number(row.id),
    seq: row.seq,
    repeatIndex: row.repeat_index,
    isReference: Boolean(row.is_reference),
    pose: fromJsonColumn<PlanPose>(row.pose),
    predicted: row.predicted === null ? null : fromJsonColumn<PointPrediction>(row.predicted),
    solverVersion: row.solver_version,
  }));
}

/** The plan's points in measurement order, with the pose and the published predictions. */
export async function listPlanPoints(viewer: SessionUser, studyId: number, planId: number): Promise<PlanPoint[]> {
  await requireStudyAccess(viewer, studyId, 'study.view');
  await requirePlanInStudy(db, studyId, planId);
  return planPointRows(db, planId);
}

/**
 * The run sheet's columns: CSV name (unit in the name, SI), meaning, and the value of a point.
 * The same list writes the header and the data dictionary, so the two cannot disagree.
 */
export const RUN_SHEET_COLUMNS: { name: string; unit: string; meaning: string; value: (p: PlanPoint) => number | string | boolean | null }[] = [
  { name: 'seq', unit: '-', meaning: 'Measurement order, 1 to n.', value: (p) => p.seq },
  { name: 'repeat', unit: '-', meaning: 'Repeat of this pose, 1 to the plan\'s repeats (reference points are 1).', value: (p) => p.repeatIndex },
  { name: 'is_reference', unit: '-', meaning: 'true for a re-measurement of the reference pose (the first pose), taken to catch drift.', value: (p) => p.isReference },
  { name: 'distance_m', unit: 'm', meaning: 'Receiver centre height above the transmitter centre (along the transmitter axis).', value: (p) => p.pose.distance },
  { name: 'lateral_offset_m', unit: 'm', meaning: 'Receiver centre offset along x.', value: (p) => p.pose.lateralOffset },
  { name: 'tilt_deg', unit: 'degrees', meaning: 'Receiver tilt about its local y axis; positive turns its axis toward +x.', value: (p) => p.pose.tiltDeg },
  { name: 'frequency_Hz', unit: 'Hz', meaning: 'Drive frequency when an axis sets it; empty means the setup\'s frequency.', value: (p) => p.pose.frequencyHz ?? null },
  { name: 'load_resistance_ohm', unit: 'ohm', meaning: 'Load resistance when an axis sets it; empty means the setup\'s load.', value: (p) => p.pose.loadResistance ?? null },
  { name: 'mutual_inductance_H', unit: 'H', meaning: 'Predicted mutual inductance M (signed; positive for coaxial coils wound the same way).', value: (p) => p.predicted?.mutualInductance ?? null },
  { name: 'coupling', unit: '-', meaning: 'Predicted coupling coefficient k = M / sqrt(L1 L2).', value: (p) => p.predicted?.coupling ?? null },
  { name: 'tx_self_inductance_H', unit: 'H', meaning: 'Predicted transmitter self-inductance L1.', value: (p) => p.predicted?.txSelfInductance ?? null },
  { name: 'rx_self_inductance_H', unit: 'H', meaning: 'Predicted receiver self-inductance L2.', value: (p) => p.predicted?.rxSelfInductance ?? null },
  { name: 'tx_resistance_ohm', unit: 'ohm', meaning: 'Predicted transmitter AC resistance at the drive frequency.', value: (p) => p.predicted?.txResistance ?? null },
  { name: 'rx_resistance_ohm', unit: 'ohm', meaning: 'Predicted receiver AC resistance at the drive frequency.', value: (p) => p.predicted?.rxResistance ?? null },
  { name: 'efficiency', unit: '-', meaning: 'Predicted link efficiency: load power over the real power entering the transmitter terminals (0 to 1).', value: (p) => p.predicted?.efficiency ?? null },
  { name: 'load_power_W', unit: 'W', meaning: 'Predicted power in the load.', value: (p) => p.predicted?.loadPower ?? null },
  { name: 'field_ratio', unit: '-', meaning: 'Predicted rms field at the setup\'s operator point over the most restrictive reference level; empty without an operator point.', value: (p) => p.predicted?.fieldRatio ?? null },
  { name: 'solver_version', unit: '-', meaning: 'Version of the solver that computed the predicted values; empty while not computed.', value: (p) => p.solverVersion },
];

/** The run sheet: a header row with units in the names, then one row per point in measurement order. */
export function runSheetCsv(points: PlanPoint[]): string {
  return Papa.unparse({
    fields: RUN_SHEET_COLUMNS.map((c) => c.name),
    data: points.map((p) => RUN_SHEET_COLUMNS.map((c) => c.value(p) ?? '')),
  });
}

/** The data dictionary of the run sheet, a CSV of its own: column, unit, meaning. */
export function runSheetDictionaryCsv(): string {
  return Papa.unparse({ fields: ['column', 'unit', 'meaning'], data: RUN_SHEET_COLUMNS.map((c) => [c.name, c.unit, c.meaning]) });
}
