import 'server-only';
import type { Knex } from 'knex';
import { requestPaths, validateSolveRequest } from '../../physics';
import { checkClearance } from '../../physics/clearance';
import type { CircuitSpec, CoilSpec } from '../../physics/types';
import { db } from '../db';
import { requireStudyAccess } from '../auth/access';
import type { SessionUser } from '../auth/session-user';
import { conflict, notFound, unprocessable, type FieldIssue } from '../http/errors';
import type { SetupCreate, SetupUpdate } from '../validations/setup';
import { recordAudit } from './audit';
import { describeCoilUses, findSetupUses } from './coil-usage';
import { beginRunsForSetups, launchPredictionRuns } from './plan-predictions';
import { fromJsonColumn, toJsonColumn } from './json-column';

export type Vec3 = [number, number, number];

export interface SetupPlacement {
  /** [m] */
  distance: number;
  /** [m] */
  lateralOffset: number;
  /** [degrees] */
  tiltDeg: number;
}

export interface Setup {
  id: number;
  studyId: number;
  name: string;
  transmitterCoilId: number;
  receiverCoilId: number;
  placement: SetupPlacement;
  circuit: CircuitSpec;
  /** where an operator stands [m], or null */
  operatorPoint: Vec3 | null;
  /** the 3D view's camera [m], or null */
  view: { position: Vec3; target: Vec3 } | null;
  notes: string;
  createdAt: string;
  updatedAt: string;
}

interface SetupRow {
  id: number;
  study_id: number;
  name: string;
  transmitter_coil_id: number;
  receiver_coil_id: number;
  placement: unknown;
  circuit: unknown;
  operator_point: unknown;
  view: unknown;
  notes: string | null;
  created_at: Date;
  updated_at: Date;
}

function toSetup(row: SetupRow): Setup {
  return {
    id: row.id,
    studyId: row.study_id,
    name: row.name,
    transmitterCoilId: row.transmitter_coil_id,
    receiverCoilId: row.receiver_coil_id,
    placement: fromJsonColumn<SetupPlacement>(row.placement),
    circuit: fromJsonColumn<CircuitSpec>(row.circuit),
    operatorPoint: row.operator_point === null ? null : fromJsonColumn<Vec3>(row.operator_point),
    view: row.view === null ? null : fromJsonColumn<Setup['view']>(row.view),
    notes: row.notes ?? '',
    createdAt: new Date(row.created_at).toISOString(),
    updatedAt: new Date(row.updated_at).toISOString(),
  };
}

/** The study's saved setups by name. */
export async function listSetups(viewer: SessionUser, studyId: number): Promise<Setup[]> {
  await requireStudyAccess(viewer, studyId, 'study.view');
  const rows: SetupRow[] = await db('setups').where({ study_id: studyId }).orderBy('name').orderBy('id');
  return rows.map(toSetup);
}

/** One setup of the study; 404 when it is not in this study. */
export async function getSetup(viewer: SessionUser, studyId: number, setupId: number): Promise<Setup> {
  await requireStudyAccess(viewer, studyId, 'study.view');
  const row: SetupRow | undefined = await db('setups').where({ id: setupId, study_id: studyId }).first();
  if (!row) throw notFound('No such setup in this study.');
  return toSetup(row);
}

interface SetupGeometry {
  transmitterCoilId: number;
  receiverCoilId: number;
  placement: SetupPlacement;
  circuit: CircuitSpec;
}

/**
 * The setup's coils must be in this study (locked for share, so neither can be deleted meanwhile) and
 * the whole setup must be solvable: the solver's own checks, and the receiver clear of the transmitter.
 */
async function checkSolvable(trx: Knex.Transaction, studyId: number, setup: SetupGeometry): Promise<void> {
  const ids = [setup.transmitterCoilId, setup.receiverCoilId];
  const rows = await trx('coils').where('study_id', studyId).whereIn('id', ids).forShare().select('id', 'spec');
  const specs = new Map(rows.map((row) => [row.id as number, fromJsonColumn<CoilSpec>(row.spec)]));
  const missing: FieldIssue[] = (['transmitterCoilId', 'receiverCoilId'] as const)
    .filter((field) => !specs.has(setup[field]))
    .map((field) => ({ path: field, message: 'Choose a coil of this study.' }));
  if (missing.length > 0) throw unprocessable('Some fields need attention.', missing);

  const request = { transmitter: specs.get(setup.transmitterCoilId)!, receiver: specs.get(setup.receiverCoilId)!, placement: setup.placement, circuit: setup.circuit };
  const issues: FieldIssue[] = validateSolveRequest(request).map((issue) => ({ path: issue.path.join('.'), message: issue.message }));
  if (issues.length === 0) {
    const paths = requestPaths(request);
    if (checkClearance(paths.tx, paths.rx, paths.tx.wireRadius + paths.rx.wireRadius).touching) {
      issues.push({ path: 'placement', message: 'At this placement the receiver touches or passes through the transmitter. Move it further away.' });
    }
  }
  if (issues.length > 0) throw unprocessable('This setup cannot be solved.', issues);
}

async function refuseDuplicateName(trx: Knex.Transaction, studyId: number, name: string, exceptId?: number): Promise<void> {
  const query = trx('setups').where({ study_id: studyId, name });
  if (exceptId !== undefined) query.whereNot('id', exceptId);
  if (await query.first('id')) {
    throw conflict(`This study already has a setup named “${name}”.`, [{ path: 'name', message: 'Choose another name.' }]);
  }
}

/** Saves a placement of two of the study's coils with its circuit (researchers and admins). */
export async function createSetup(actor: SessionUser, studyId: number, input: SetupCreate): Promise<Setup> {
  const setupId = await db.transaction(async (trx) => {
    await requireStudyAccess(actor, studyId, 'study.edit', trx);
    await refuseDuplicateName(trx, studyId, input.name);
    await checkSolvable(trx, studyId, input);
    const [id] = await trx('setups').insert({
      study_id: studyId,
      name: input.name,
      transmitter_coil_id: input.transmitterCoilId,
      receiver_coil_id: input.receiverCoilId,
      placement: toJsonColumn(input.placement),
      circuit: toJsonColumn(input.circuit),
      operator_point: toJsonColumn(input.operatorPoint),
      view: toJsonColumn(input.view),
      notes: input.notes || null,
      created_by: actor.id,
    });
    await recordAudit(trx, { studyId, actorId: actor.id, action: 'setup.create', targetTable: 'setups', targetId: id, details: { name: input.name } });
    return id as number;
  });
  return getSetup(actor, studyId, setupId);
}

/** Changes a setup; the result must still be solvable. */
export async function updateSetup(actor: SessionUser, studyId: number, setupId: number, input: SetupUpdate): Promise<Setup> {
  const begun = await db.transaction(async (trx) => {
    await requireStudyAccess(actor, studyId, 'study.edit', trx);
    const row: SetupRow | undefined = await trx('setups').where({ id: setupId, study_id: studyId }).forUpdate().first();
    if (!row) throw notFound('No such setup in this study.');
    const current = toSetup(row);
    if (input.name !== undefined && input.name !== current.name) await refuseDuplicateName(trx, studyId, input.name, setupId);
    const geometryChanges = [input.transmitterCoilId, input.receiverCoilId, input.placement, input.circuit].some((v) => v !== undefined);
    if (geometryChanges) {
      await checkSolvable(trx, studyId, {
        transmitterCoilId: input.transmitterCoilId ?? current.transmitterCoilId,
        receiverCoilId: input.receiverCoilId ?? current.receiverCoilId,
        placement: input.placement ?? current.placement,
        circuit: input.circuit ?? current.circuit,
      });
    }
    const changes: Record<string, unknown> = { updated_at: trx.fn.now() };
    if (input.name !== undefined) changes.name = input.name;
    if (input.transmitterCoilId !== undefined) changes.transmitter_coil_id = input.transmitterCoilId;
    if (input.receiverCoilId !== undefined) changes.receiver_coil_id = input.receiverCoilId;
    if (input.placement !== undefined) changes.placement = toJsonColumn(input.placement);
    if (input.circuit !== undefined) changes.circuit = toJsonColumn(input.circuit);
    if (input.operatorPoint !== undefined) changes.operator_point = toJsonColumn(input.operatorPoint);
    if (input.view !== undefined) changes.view = toJsonColumn(input.view);
    if (input.notes !== undefined) changes.notes = input.notes || null;
    await trx('setups').where({ id: setupId }).update(changes);
    const fields = Object.keys(input).filter((key) => input[key as keyof SetupUpdate] !== undefined);
    await recordAudit(trx, { studyId, actorId: actor.id, action: 'setup.update', targetTable: 'setups', targetId: setupId, details: { name: input.name ?? current.name, fields } });
    // Plans keep their poses (the placement is the plan's record), but coils, circuit and operator point
    // feed their predictions: compute them again.
    const predictionInputs = [input.transmitterCoilId, input.receiverCoilId, input.circuit, input.operatorPoint].some((v) => v !== undefined);
    return predictionInputs ? beginRunsForSetups(trx, [setupId]) : [];
  });
  launchPredictionRuns(begun);
  return getSetup(actor, studyId, setupId);
}

/** Removes a saved setup (its coils stay in the library). */
export async function deleteSetup(actor: SessionUser, studyId: number, setupId: number): Promise<void> {
  await db.transaction(async (trx) => {
    await requireStudyAccess(actor, studyId, 'study.edit', trx);
    const row = await trx('setups').where({ id: setupId, study_id: studyId }).forUpdate().first('id', 'name');
    if (!row) throw notFound('No such setup in this study.');
    const uses = await findSetupUses(trx, setupId);
    if (uses.length > 0) {
      throw conflict(`“${row.name}” is used by ${describeCoilUses(uses)}. Delete or change ${uses.length === 1 ? 'it' : 'them'} first.`);
    }
    await trx('setups').where({ id: setupId }).del();
    await recordAudit(trx, { studyId, actorId: actor.id, action: 'setup.delete', targetTable: 'setups', targetId: setupId, details: { name: row.name } });
  });
}
