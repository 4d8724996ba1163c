import 'server-only';
import type { Knex } from 'knex';
import { db } from '../db';
import { requireStudyAccess } from '../auth/access';
import type { SessionUser } from '../auth/session-user';
import { conflict, forbidden, notFound, unprocessable } from '../http/errors';
import type { PlanPose } from '../plans/points';
import type { PointPrediction } from '../plans/prediction';
import { BENCH_CAUTIONS_VERSION } from '../readings/bench-cautions';
import type { AchievedPose, CalibrationState, ReadingCorrection, ReadingCreate } from '../validations/reading';
import { deriveReading, methodFitWarning } from '../../physics/measurement/derive';
import { METHOD_SPECS, type InstrumentAccuracy, type MeasurementMethod, type RawReading } from '../../physics/measurement/methods';
import { ReadingInputError, type Derivation } from '../../physics/measurement/types';
import { recordAudit } from './audit';
import { fromJsonColumn, toJsonColumn } from './json-column';
import { requirePlanInStudy, requirePlanOnBench } from './plan-lookup';

/**
 * Readings logged at the bench. Every row is immutable: a correction inserts version n + 1 of the
 * same point naming the row it supersedes and the reason, so the history of every value stays
 * readable. The server derives M, k and efficiency itself (src/physics/measurement) and stores the
 * derivation with the formula's id and version next to the raw inputs.
 */

export type ReadingSource = 'form' | 'csv' | 'touchstone';

export interface Reading {
  id: number;
  planId: number;
  pointId: number;
  pointSeq: number;
  repeatIndex: number;
  version: number;
  supersedesId: number | null;
  correctionReason: string | null;
  /** false once a later version of the same point and method exists */
  current: boolean;
  method: MeasurementMethod;
  raw: RawReading;
  accuracy: InstrumentAccuracy;
  derived: Derivation;
  achievedPose: AchievedPose | null;
  instrument: string;
  calibration: CalibrationState;
  temperatureC: number | null;
  setupNotes: string;
  source: ReadingSource;
  importId: string | null;
  attachmentId: number | null;
  createdBy: { id: number; name: string };
  createdAt: string;
}

interface ReadingRow {
  id: number | string;
  plan_id: number;
  point_id: number | string;
  seq: number;
  repeat_index: number;
  version: number;
  supersedes_id: number | string | null;
  correction_reason: string | null;
  latest_version: number | string;
  method: MeasurementMethod;
  raw: unknown;
  accuracy: unknown;
  derived: unknown;
  achieved_pose: unknown;
  instrument: string | null;
  calibration: CalibrationState;
  temperature_c: number | null;
  setup_notes: string | null;
  source: ReadingSource;
  import_id: string | null;
  attachment_id: number | string | null;
  created_by: number;
  author_name: string;
  created_at: Date;
}

const nullableId = (value: number | string | null) => (value === null ? null : Number(value));

function toReading(row: ReadingRow): Reading {
  return {
    id: Number(row.id),
    planId: row.plan_id,
    pointId: Number(row.point_id),
    pointSeq: row.seq,
    repeatIndex: row.repeat_index,
    version: row.version,
    supersedesId: nullableId(row.supersedes_id),
    correctionReason: row.correction_reason,
    current: row.version === Number(row.latest_version),
    method: row.method,
    raw: fromJsonColumn<RawReading>(row.raw),
    accuracy: fromJsonColumn<InstrumentAccuracy>(row.accuracy),
    derived: fromJsonColumn<Derivation>(row.derived),
    achievedPose: row.achieved_pose === null ? null : fromJsonColumn<AchievedPose>(row.achieved_pose),
    instrument: row.instrument ?? '',
    calibration: row.calibration,
    temperatureC: row.temperature_c,
    setupNotes: row.setup_notes ?? '',
    source: row.source,
    importId: row.import_id,
    attachmentId: nullableId(row.attachment_id),
    createdBy: { id: row.created_by, name: row.author_name },
    createdAt: new Date(row.created_at).toISOString(),
  };
}

function readingQuery(trx: Knex | Knex.Transaction, planId: number) {
  return trx('readings')
    .join('sweep_points', 'sweep_points.id', 'readings.point_id')
    .join('users', 'users.id', 'readings.created_by')
    .where('readings.plan_id', planId)
    .select(
      'readings.*',
      'sweep_points.seq',
      'sweep_points.repeat_index',
      'users.name as author_name',
      trx('readings as later').max('later.version')
        .where('later.point_id', trx.ref('readings.point_id'))
        .where('later.method', trx.ref('readings.method'))
        .as('latest_version'),
    );
}

/** Every version of every reading of the plan, in measurement order and then version order. */
export async function listReadings(viewer: SessionUser, studyId: number, planId: number): Promise<Reading[]> {
  await requireStudyAccess(viewer, studyId, 'study.view');
  await requirePlanInStudy(db, studyId, planId);
  const rows: ReadingRow[] = await readingQuery(db, planId).orderBy('sweep_points.seq').orderBy('readings.version');
  return rows.map(toReading);
}

async function getReading(trx: Knex | Knex.Transaction, planId: number, readingId: number): Promise<Reading> {
  const row: ReadingRow | undefined = await readingQuery(trx, planId).where('readings.id', readingId).first();
  if (!row) throw notFound('No such reading on this plan.');
  return toReading(row);
}

// ---------------------------------------------------------------------------------------------
// The bench context: who may log, on which plan, whether the cautions were acknowledged

/** A point of the plan as the logging code needs it. */
export interface BenchPoint {
  id: number;
  seq: number;
  repeatIndex: number;
  pose: PlanPose;
  predicted: PointPrediction | null;
  /** the latest version logged so far per method; absent for a method not yet logged */
  latestVersions: Partial<Record<MeasurementMethod, number>>;
}

export interface BenchContext {
  studyId: number;
  planId: number;
  planName: string;
  pointsById: Map<number, BenchPoint>;
  /** key `${seq}` (seq is unique within a plan) */
  pointsBySeq: Map<number, BenchPoint>;
}

/** Whether `actor` acknowledged the current bench cautions on this plan. */
async function hasAcknowledged(trx: Knex | Knex.Transaction, planId: number, userId: number): Promise<boolean> {
  const row = await trx('caution_acknowledgements').where({ plan_id: planId, user_id: userId, cautions_version: BENCH_CAUTIONS_VERSION }).first('id');
  return Boolean(row);
}

/**
 * Inside a transaction: the actor may log readings on this study, the plan is on the bench, the
 * cautions were acknowledged; returns the plan's points. Shared by the form, the file and the CSV import.
 */
export async function openBench(trx: Knex.Transaction, actor: SessionUser, studyId: number, planId: number): Promise<BenchContext> {
  await requireStudyAccess(actor, studyId, 'readings.log', trx);
  const plan = await requirePlanOnBench(trx, studyId, planId, (state) => `This plan is ${state}: readings are logged only while it is on the bench.`, { lock: true });
  if (!(await hasAcknowledged(trx, planId, actor.id))) {
    throw conflict('Acknowledge the bench cautions before logging the first reading on this plan.', [
      { path: 'cautions', message: 'Read and acknowledge the bench cautions.' },
    ]);
  }
  const rows: { id: number | string; seq: number; repeat_index: number; pose: unknown; predicted: unknown }[] = await trx('sweep_points')
    .where({ plan_id: planId })
    .select('id', 'seq', 'repeat_index', 'pose', 'predicted');
  const logged: { point_id: number | string; method: MeasurementMethod; latest: number | string }[] = await trx('readings')
    .where({ plan_id: planId })
    .groupBy('point_id', 'method')
    .select('point_id', 'method')
    .max('version as latest');
  const latest = new Map<number, Partial<Record<MeasurementMethod, number>>>();
  for (const row of logged) {
    const id = Number(row.point_id);
    latest.set(id, { ...latest.get(id), [row.method]: Number(row.latest) });
  }
  const points = rows.map<BenchPoint>((row) => ({
    id: Number(row.id),
    seq: row.seq,
    repeatIndex: row.repeat_index,
    pose: fromJsonColumn<PlanPose>(row.pose),
    predicted: row.predicted === null ? null : fromJsonColumn<PointPrediction>(row.predicted),
    latestVersions: latest.get(Number(row.id)) ?? {},
  }));
  return {
    studyId,
    planId,
    planName: plan.name,
    pointsById: new Map(points.map((p) => [p.id, p])),
    pointsBySeq: new Map(points.map((p) => [p.seq, p])),
  };
}

// ---------------------------------------------------------------------------------------------
// Deriving and building rows

export type ReadingInput = Omit<ReadingCreate, 'pointId'>;

/**
 * The server's derivation of a reading at a point: measured values, uncertainties, and the warnings
 * (including whether the method suits the predicted k). A raw value no formula can use is a 422 at
 * its field, prefixed with `pathPrefix` (the CSV import puts the row there).
 */
export function deriveAtPoint(point: BenchPoint, input: ReadingInput, pathPrefix = ''): Derivation {
  // a point's prediction carries the coupling and self-inductances a derivation leans on
  const predicted = point.predicted;
  let derived: Derivation;
  try {
    derived = deriveReading(input.method, input.raw, input.accuracy, { predicted });
  } catch (error) {
    if (error instanceof ReadingInputError) {
      throw unprocessable('Some fields need attention.', [{ path: `${pathPrefix}raw.${error.field}`, message: error.message }]);
    }
    throw error;
  }
  const fit = predicted ? methodFitWarning(input.method, predicted.coupling, input.accuracy) : null;
  return fit && !derived.warnings.includes(fit) ? { ...derived, warnings: [fit, ...derived.warnings] } : derived;
}

export interface RowExtras {
  version: number;
  supersedesId?: number | null;
  correctionReason?: string | null;
  source: ReadingSource;
  importId?: string | null;
  attachmentId?: number | null;
}

/** The `readings` row for one reading (derivation included), ready to insert. */
export function readingRow(context: BenchContext, point: BenchPoint, input: ReadingInput, derived: Derivation, actorId: number, extras: RowExtras) {
  return {
    plan_id: context.planId,
    point_id: point.id,
    version: extras.version,
    supersedes_id: extras.supersedesId ?? null,
    correction_reason: extras.correctionReason ?? null,
    method: input.method,
    raw: toJsonColumn(input.raw),
    accuracy: toJsonColumn(input.accuracy),
    derived: toJsonColumn(derived),
    achieved_pose: input.achievedPose ? toJsonColumn(input.achievedPose) : null,
    instrument: input.instrument || null,
    calibration: input.calibration,
    temperature_c: input.temperatureC,
    setup_notes: input.setupNotes || null,
    source: extras.source,
    import_id: extras.importId ?? null,
    attachment_id: extras.attachmentId ?? null,
    created_by: actorId,
  };
}

function pointOf(context: BenchContext, pointId: number): BenchPoint {
  const point = context.pointsById.get(pointId);
  if (!point) throw unprocessable('Some fields need attention.', [{ path: 'pointId', message: 'Choose a point of this plan.' }]);
  return point;
}

/** One current reading per point and method: a second one is a correction, which carries a reason. */
export function refuseSecondReading(point: BenchPoint, method: MeasurementMethod): void {
  if (point.latestVersions[method]) {
    throw conflict(`Point ${point.seq} already has a reading by ${METHOD_SPECS[method].label.toLowerCase()}; correct it instead, with a reason.`, [
      { path: 'pointId', message: 'This point already has a reading by this method.' },
    ]);
  }
}

// ---------------------------------------------------------------------------------------------
// Writes

/** Logs the first reading of a point (students and researchers, plan on the bench). */
export async function createReading(
  actor: SessionUser,
  studyId: number,
  planId: number,
  input: ReadingCreate,
  extras: { source?: ReadingSource; attachmentId?: number | null; notes?: string[] } = {},
): Promise<Reading> {
  const id = await db.transaction(async (trx) => {
    const context = await openBench(trx, actor, studyId, planId);
    const point = pointOf(context, input.pointId);
    refuseSecondReading(point, input.method);
    const derivation = deriveAtPoint(point, input);
    const derived = extras.notes?.length ? { ...derivation, warnings: [...derivation.warnings, ...extras.notes] } : derivation;
    const [readingId] = await trx('readings').insert(
      readingRow(context, point, input, derived, actor.id, { version: 1, source: extras.source ?? 'form', attachmentId: extras.attachmentId ?? null }),
    );
    await recordAudit(trx, {
      studyId, actorId: actor.id, action: 'reading.create', targetTable: 'readings', targetId: readingId,
      details: { plan: context.planName, point: point.seq, method: input.method },
    });
    return Number(readingId);
  });
  return getReading(db, planId, id);
}

/**
 * Corrects a reading: a new version of the same point and method with the reason; the earlier one
 * stays. Only the latest version can be corrected (409 otherwise), and only by the person who logged
 * the first version.
 */
export async function correctReading(actor: SessionUser, studyId: number, planId: number, readingId: number, input: ReadingCorrection): Promise<Reading> {
  const id = await db.transaction(async (trx) => {
    const context = await openBench(trx, actor, studyId, planId);
    const earlier = await trx('readings').where({ id: readingId, plan_id: planId }).forUpdate().first('id', 'point_id', 'method', 'version');
    if (!earlier) throw notFound('No such reading on this plan.');
    const point = context.pointsById.get(Number(earlier.point_id))!;
    const method = earlier.method as MeasurementMethod;
    const latest = point.latestVersions[method] ?? 0;
    if (earlier.version !== latest) {
      throw conflict(`Version ${earlier.version} was already corrected; correct version ${latest} instead.`);
    }
    if (input.method !== method) {
      throw unprocessable('Some fields need attention.', [
        { path: 'method', message: `A correction keeps the method (${METHOD_SPECS[method].label.toLowerCase()}); log another method as its own reading.` },
      ]);
    }
    const first = await trx('readings').where({ point_id: point.id, method, version: 1 }).first('created_by');
    if (first.created_by !== actor.id) throw forbidden('Only the person who logged this reading can correct it.');
    const { reason, ...reading } = input;
    const derived = deriveAtPoint(point, reading);
    const [newId] = await trx('readings').insert(
      readingRow(context, point, reading, derived, actor.id, {
        version: earlier.version + 1, supersedesId: Number(earlier.id), correctionReason: reason, source: 'form',
      }),
    );
    await recordAudit(trx, {
      studyId, actorId: actor.id, action: 'reading.correct', targetTable: 'readings', targetId: newId,
      details: { plan: context.planName, point: point.seq, version: earlier.version + 1, supersedes: Number(earlier.id), reason },
    });
    return Number(newId);
  });
  return getReading(db, planId, id);
}

// ---------------------------------------------------------------------------------------------
// Caution acknowledgements

export interface CautionAcknowledgement {
  version: string;
  acknowledgedAt: string | null;
}

/** Whether the viewer has acknowledged the current bench cautions on this plan. */
export async function getCautionAcknowledgement(viewer: SessionUser, studyId: number, planId: number): Promise<CautionAcknowledgement> {
  await requireStudyAccess(viewer, studyId, 'study.view');
  await requirePlanInStudy(db, studyId, planId);
  const row = await db('caution_acknowledgements')
    .where({ plan_id: planId, user_id: viewer.id, cautions_version: BENCH_CAUTIONS_VERSION })
    .first('acknowledged_at');
  return { version: BENCH_CAUTIONS_VERSION, acknowledgedAt: row ? new Date(row.acknowledged_at).toISOString() : null };
}

/** Stores the acknowledgement (once per person, plan and wording); repeating it changes nothing. */
export async function acknowledgeCautions(actor: SessionUser, studyId: number, planId: number, version: string): Promise<CautionAcknowledgement> {
  if (version !== BENCH_CAUTIONS_VERSION) {
    throw conflict('The cautions changed since the page was loaded; read them again.', [{ path: 'version', message: 'Reload the cautions.' }]);
  }
  await db.transaction(async (trx) => {
    await requireStudyAccess(actor, studyId, 'readings.log', trx);
    await requirePlanInStudy(trx, studyId, planId);
    if (await hasAcknowledged(trx, planId, actor.id)) return;
    const [id] = await trx('caution_acknowledgements').insert({ plan_id: planId, user_id: actor.id, cautions_version: version });
    await recordAudit(trx, {
      studyId, actorId: actor.id, action: 'cautions.acknowledge', targetTable: 'caution_acknowledgements', targetId: id, details: { planId, version },
    });
  });
  return getCautionAcknowledgement(actor, studyId, planId);
}
