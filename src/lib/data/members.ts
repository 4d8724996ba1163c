import 'server-only';
import type { Knex } from 'knex';
import { db } from '../db';
import { requireStudyAccess } from '../auth/access';
import type { StudyRole } from '../auth/permissions';
import type { SessionUser } from '../auth/session-user';
import { conflict, notFound } from '../http/errors';
import { recordAudit } from './audit';

export interface StudyMember {
  userId: number;
  name: string;
  email: string;
  role: StudyRole;
  joinedAt: string;
}

/** E-mail addresses of the study's members in `roles` whose accounts are enabled: who hears of a plan's progress. */
export async function activeMemberEmails(trx: Knex | Knex.Transaction, studyId: number, roles: readonly StudyRole[]): Promise<{ email: string }[]> {
  return trx('study_members')
    .join('users', 'users.id', 'study_members.user_id')
    .where('study_members.study_id', studyId)
    .whereIn('study_members.role', roles)
    .whereNull('users.disabled_at')
    .select('users.email');
}

/** The members of a study, researchers first. Any member (or an admin) may see them. */
export async function listMembers(viewer: SessionUser, studyId: number): Promise<StudyMember[]> {
  await requireStudyAccess(viewer, studyId, 'study.view');
  const rows = await db('study_members')
    .join('users', 'users.id', 'study_members.user_id')
    .where('study_members.study_id', studyId)
    .orderByRaw("field(study_members.role, 'researcher', 'supervisor', 'student')")
    .orderBy('users.name')
    .select('users.id', 'users.name', 'users.email', 'study_members.role', 'study_members.created_at');
  return rows.map((row) => ({
    userId: row.id,
    name: row.name,
    email: row.email,
    role: row.role,
    joinedAt: new Date(row.created_at).toISOString(),
  }));
}

/**
 * Changes a member's role. A study always keeps at least one researcher, so nobody can strand it
 * without someone allowed to edit it.
 */
export async function changeMemberRole(actor: SessionUser, studyId: number, userId: number, role: StudyRole): Promise<StudyMember[]> {
  await db.transaction(async (trx) => {
    await requireStudyAccess(actor, studyId, 'members.manage', trx);
    const member = await trx('study_members').where({ study_id: studyId, user_id: userId }).forUpdate().first('id', 'role');
    if (!member) throw notFound('That person is not a member of this study.');
    if (member.role === role) return;
    if (member.role === 'researcher') {
      const researchers = await trx('study_members').where({ study_id: studyId, role: 'researcher' }).forUpdate().count({ n: '*' }).first();
      if (Number(researchers?.n) <= 1) {
        throw conflict('A study needs at least one researcher. Make someone else researcher first.', [
          { path: 'role', message: 'This is the only researcher.' },
        ]);
      }
    }
    await trx('study_members').where({ id: member.id }).update({ role });
    await recordAudit(trx, {
      studyId,
      actorId: actor.id,
      action: 'member.role.change',
      targetTable: 'study_members',
      targetId: member.id,
      details: { userId, from: member.role, to: role },
    });
  });
  return listMembers(actor, studyId);
}
