import 'server-only';
import type { Knex } from 'knex';
import { db } from '../db';
import { forbidden, notFound } from '../http/errors';
import { canOnStudy, canSeeStudy, type StudyAction, type StudyRole } from './permissions';
import type { SessionUser } from './session-user';

export interface StudyAccess {
  studyId: number;
  /** The actor's role on this study; null for an admin who is not a member. */
  studyRole: StudyRole | null;
}

/**
 * The one gate for study data: every protected data function calls it first.
 * 404 when the study does not exist or the actor cannot see it (its existence is not disclosed),
 * 403 when the actor sees it but their role does not allow `action`.
 */
export async function requireStudyAccess(
  actor: SessionUser,
  studyId: number,
  action: StudyAction,
  trx: Knex | Knex.Transaction = db,
): Promise<StudyAccess> {
  const row = await trx('studies')
    .leftJoin('study_members', function joinMembership() {
      this.on('study_members.study_id', '=', 'studies.id').andOn('study_members.user_id', '=', trx.raw('?', [actor.id]));
    })
    .where('studies.id', studyId)
    .first('studies.id as studyId', 'study_members.role as role');

  const actorOnStudy = { siteRole: actor.siteRole, studyRole: (row?.role ?? null) as StudyRole | null };
  if (!row || !canSeeStudy(actorOnStudy)) throw notFound('No such study.');
  if (!canOnStudy(actorOnStudy, action)) throw forbidden();
  return { studyId, studyRole: actorOnStudy.studyRole };
}
