import 'server-only';
import { db } from '../db';
import { requireStudyAccess } from '../auth/access';
import { allowedStudyActions, canCreateStudy, type StudyAction, type StudyRole } from '../auth/permissions';
import type { SessionUser } from '../auth/session-user';
import { conflict, forbidden } from '../http/errors';
import type { StudyCreate } from '../validations/study';
import { recordAudit } from './audit';

export interface StudySummary {
  id: number;
  name: string;
  summary: string;
  frequencyHz: number | null;
  /** The viewer's role; null for an admin looking at a study they are not on. */
  myRole: StudyRole | null;
  memberCount: number;
  createdAt: string;
}

export interface StudyDetail extends StudySummary {
  createdBy: { id: number; name: string };
  allowedActions: StudyAction[];
}

interface StudyRow {
  id: number;
  name: string;
  summary: string | null;
  frequency_hz: number | null;
  created_at: Date;
  my_role: StudyRole | null;
  member_count: number | string;
}

function toSummary(row: StudyRow): StudySummary {
  return {
    id: row.id,
    name: row.name,
    summary: row.summary ?? '',
    frequencyHz: row.frequency_hz,
    myRole: row.my_role,
    memberCount: Number(row.member_count),
    createdAt: new Date(row.created_at).toISOString(),
  };
}

function studiesWithViewerRole(viewerId: number) {
  return db('studies')
    .leftJoin('study_members as mine', function joinMine() {
      this.on('mine.study_id', '=', 'studies.id').andOn('mine.user_id', '=', db.raw('?', [viewerId]));
    })
    .select(
      'studies.id',
      'studies.name',
      'studies.summary',
      'studies.frequency_hz',
      'studies.created_at',
      'mine.role as my_role',
      db.raw('(select count(*) from study_members sm where sm.study_id = studies.id) as member_count'),
    );
}

/** The studies the viewer is on (all studies for a site admin), newest first. */
export async function listStudiesFor(viewer: SessionUser): Promise<StudySummary[]> {
  const query = studiesWithViewerRole(viewer.id).orderBy('studies.created_at', 'desc').orderBy('studies.id', 'desc');
  if (viewer.siteRole !== 'admin') query.whereNotNull('mine.role');
  const rows: StudyRow[] = await query;
  return rows.map(toSummary);
}

/** One study with the viewer's role and what that role allows. 404 when the viewer cannot see it. */
export async function getStudy(viewer: SessionUser, studyId: number): Promise<StudyDetail> {
  const access = await requireStudyAccess(viewer, studyId, 'study.view');
  const row = await studiesWithViewerRole(viewer.id)
    .join('users as creator', 'creator.id', 'studies.created_by')
    .select('creator.id as creator_id', 'creator.name as creator_name')
    .where('studies.id', studyId)
    .first();
  return {
    ...toSummary(row),
    createdBy: { id: row.creator_id, name: row.creator_name },
    allowedActions: allowedStudyActions({ siteRole: viewer.siteRole, studyRole: access.studyRole }),
  };
}

/** Starts a study; its creator becomes its researcher. Name must be unique among the creator's studies. */
export async function createStudy(actor: SessionUser, input: StudyCreate): Promise<StudySummary> {
  if (!canCreateStudy(actor.siteRole)) throw forbidden('Only researcher accounts and admins can start a study.');
  const studyId = await db.transaction(async (trx) => {
    const existing = await trx('studies').where({ name: input.name, created_by: actor.id }).first('id');
    if (existing) throw conflict('You already have a study with that name.', [{ path: 'name', message: 'Choose another name.' }]);
    const [id] = await trx('studies').insert({
      name: input.name,
      summary: input.summary || null,
      frequency_hz: input.frequencyHz,
      created_by: actor.id,
    });
    await trx('study_members').insert({ study_id: id, user_id: actor.id, role: 'researcher' });
    await recordAudit(trx, { studyId: id, actorId: actor.id, action: 'study.create', targetTable: 'studies', targetId: id, details: { name: input.name } });
    return id as number;
  });
  const created = await getStudy(actor, studyId);
  return created;
}
