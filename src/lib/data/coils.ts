import 'server-only';
import type { Knex } from 'knex';
import type { CoilSpec } from '../../physics/types';
import { db } from '../db';
import { requireStudyAccess } from '../auth/access';
import type { SessionUser } from '../auth/session-user';
import { conflict, notFound, unprocessable } from '../http/errors';
import { wireLabelMismatch, type CoilCreate, type CoilMeasured, type CoilUpdate } from '../validations/coil';
import { recordAudit } from './audit';
import { describeCoilUses, findCoilUses } from './coil-usage';
import { beginRunsForSetups, launchPredictionRuns } from './plan-predictions';
import { predictCoil, type CoilPrediction } from './coil-predictions';
import { fromJsonColumn, toJsonColumn } from './json-column';

export type { CoilPrediction } from './coil-predictions';

export interface Coil {
  id: number;
  studyId: number;
  name: string;
  spec: CoilSpec;
  wireLabel: string | null;
  measured: CoilMeasured;
  notes: string;
  /** null when the study has no operating frequency */
  predicted: CoilPrediction | null;
  createdAt: string;
  updatedAt: string;
}

interface CoilRow {
  id: number;
  study_id: number;
  name: string;
  spec: unknown;
  wire_label: string | null;
  measured_inductance_h: number | null;
  measured_resistance_ohm: number | null;
  measured_q: number | null;
  measured_at_hz: number | null;
  notes: string | null;
  created_at: Date;
  updated_at: Date;
  frequency_hz: number | null;
}

function toCoil(row: CoilRow): Coil {
  const spec = fromJsonColumn<CoilSpec>(row.spec);
  return {
    id: row.id,
    studyId: row.study_id,
    name: row.name,
    spec,
    wireLabel: row.wire_label,
    measured: {
      inductance: row.measured_inductance_h,
      resistance: row.measured_resistance_ohm,
      qualityFactor: row.measured_q,
      frequencyHz: row.measured_at_hz,
    },
    notes: row.notes ?? '',
    predicted: predictCoil(spec, row.frequency_hz),
    createdAt: new Date(row.created_at).toISOString(),
    updatedAt: new Date(row.updated_at).toISOString(),
  };
}

const coilsWithFrequency = (trx: Knex | Knex.Transaction = db) =>
  trx('coils').join('studies', 'studies.id', 'coils.study_id').select('coils.*', 'studies.frequency_hz');

/** The study's coil library by name, each with its predicted values at the study frequency. */
export async function listCoils(viewer: SessionUser, studyId: number): Promise<Coil[]> {
  await requireStudyAccess(viewer, studyId, 'study.view');
  const rows: CoilRow[] = await coilsWithFrequency().where('coils.study_id', studyId).orderBy('coils.name').orderBy('coils.id');
  return rows.map(toCoil);
}

/** One coil of the study; 404 when it is not in this study. */
export async function getCoil(viewer: SessionUser, studyId: number, coilId: number): Promise<Coil> {
  await requireStudyAccess(viewer, studyId, 'study.view');
  const row: CoilRow | undefined = await coilsWithFrequency().where({ 'coils.id': coilId, 'coils.study_id': studyId }).first();
  if (!row) throw notFound('No such coil in this study.');
  return toCoil(row);
}

async function refuseDuplicateName(trx: Knex.Transaction, studyId: number, name: string, exceptId?: number): Promise<void> {
  const query = trx('coils').where({ study_id: studyId, name });
  if (exceptId !== undefined) query.whereNot('id', exceptId);
  if (await query.first('id')) {
    throw conflict(`This study already has a coil named “${name}”.`, [{ path: 'name', message: 'Choose another name.' }]);
  }
}

const measuredColumns = (m: CoilMeasured) => ({
  measured_inductance_h: m.inductance,
  measured_resistance_ohm: m.resistance,
  measured_q: m.qualityFactor,
  measured_at_hz: m.frequencyHz,
});

/** Adds a coil to the study's library (researchers and admins). */
export async function createCoil(actor: SessionUser, studyId: number, input: CoilCreate): Promise<Coil> {
  const coilId = await db.transaction(async (trx) => {
    await requireStudyAccess(actor, studyId, 'study.edit', trx);
    await refuseDuplicateName(trx, studyId, input.name);
    const [id] = await trx('coils').insert({
      study_id: studyId,
      name: input.name,
      kind: input.spec.kind,
      spec: toJsonColumn(input.spec),
      wire_label: input.wireLabel,
      ...measuredColumns(input.measured),
      notes: input.notes || null,
      created_by: actor.id,
    });
    await recordAudit(trx, { studyId, actorId: actor.id, action: 'coil.create', targetTable: 'coils', targetId: id, details: { name: input.name, kind: input.spec.kind } });
    return id as number;
  });
  return getCoil(actor, studyId, coilId);
}

/** Changes a coil; `spec` and `measured` are replaced whole. A gauge label must keep matching the diameter. */
export async function updateCoil(actor: SessionUser, studyId: number, coilId: number, input: CoilUpdate): Promise<Coil> {
  const begun = await db.transaction(async (trx) => {
    await requireStudyAccess(actor, studyId, 'study.edit', trx);
    const row = await trx('coils').where({ id: coilId, study_id: studyId }).forUpdate().first('id', 'name', 'spec', 'wire_label');
    if (!row) throw notFound('No such coil in this study.');
    if (input.name !== undefined && input.name !== row.name) await refuseDuplicateName(trx, studyId, input.name, coilId);
    const label = input.wireLabel !== undefined ? input.wireLabel : row.wire_label;
    const spec = input.spec ?? fromJsonColumn<CoilSpec>(row.spec);
    const mismatch = wireLabelMismatch(label, spec.wireDiameter);
    if (mismatch) throw unprocessable('Some fields need attention.', [{ path: 'wireLabel', message: `${mismatch} Send a wire label that matches, or none.` }]);

    const changes: Record<string, unknown> = { updated_at: trx.fn.now() };
    if (input.name !== undefined) changes.name = input.name;
    if (input.spec !== undefined) Object.assign(changes, { kind: input.spec.kind, spec: toJsonColumn(input.spec) });
    if (input.wireLabel !== undefined) changes.wire_label = input.wireLabel;
    if (input.measured !== undefined) Object.assign(changes, measuredColumns(input.measured));
    if (input.notes !== undefined) changes.notes = input.notes || null;
    await trx('coils').where({ id: coilId }).update(changes);
    const fields = Object.keys(input).filter((key) => input[key as keyof CoilUpdate] !== undefined);
    await recordAudit(trx, { studyId, actorId: actor.id, action: 'coil.update', targetTable: 'coils', targetId: coilId, details: { name: input.name ?? row.name, fields } });
    // the plans on setups of this coil predict from its old spec: compute them again
    if (input.spec === undefined) return [];
    const setupIds: number[] = await trx('setups').where('transmitter_coil_id', coilId).orWhere('receiver_coil_id', coilId).pluck('id');
    return beginRunsForSetups(trx, setupIds);
  });
  launchPredictionRuns(begun);
  return getCoil(actor, studyId, coilId);
}

/** Removes a coil from the library; refused (409) while anything uses it, naming each user. */
export async function deleteCoil(actor: SessionUser, studyId: number, coilId: number): Promise<void> {
  await db.transaction(async (trx) => {
    await requireStudyAccess(actor, studyId, 'study.edit', trx);
    const row = await trx('coils').where({ id: coilId, study_id: studyId }).forUpdate().first('id', 'name');
    if (!row) throw notFound('No such coil in this study.');
    const uses = await findCoilUses(trx, coilId);
    if (uses.length > 0) {
      throw conflict(`“${row.name}” is used by ${describeCoilUses(uses)}. Delete or change ${uses.length === 1 ? 'it' : 'them'} first.`);
    }
    await trx('coils').where({ id: coilId }).del();
    await recordAudit(trx, { studyId, actorId: actor.id, action: 'coil.delete', targetTable: 'coils', targetId: coilId, details: { name: row.name } });
  });
}
