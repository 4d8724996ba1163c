import 'server-only';
import type { Knex } from 'knex';
import { db } from '../db';
import { requireStudyAccess } from '../auth/access';
import type { SessionUser } from '../auth/session-user';
import type { StudyRole } from '../auth/permissions';
import { unprocessable } from '../http/errors';
import type { PlanComment } from '../review/types';
import type { CommentCreate } from '../validations/review';
import { recordAudit } from './audit';
import { lockablePlanHead } from './review';

/**
 * Comments on a plan or one of its points. Every member sees them; researchers, students and
 * supervisors write them (an admin who is not a member reads only). Comments are never edited, so a
 * discussion reads as it happened.
 */

interface CommentRow {
  id: number | string;
  point_id: number | string | null;
  seq: number | null;
  body: string;
  author_id: number;
  name: string;
  role: StudyRole | null;
  created_at: Date;
}

function commentQuery(trx: Knex | Knex.Transaction, studyId: number, planId: number) {
  return trx('plan_comments')
    .join('users', 'users.id', 'plan_comments.author_id')
    .leftJoin('sweep_points', 'sweep_points.id', 'plan_comments.point_id')
    .leftJoin('study_members', function onMembership() {
      this.on('study_members.user_id', '=', 'plan_comments.author_id').andOn('study_members.study_id', '=', trx.raw('?', [studyId]));
    })
    .where('plan_comments.plan_id', planId)
    .select('plan_comments.*', 'sweep_points.seq', 'users.name', 'study_members.role');
}

function toComment(row: CommentRow): PlanComment {
  return {
    id: Number(row.id),
    pointId: row.point_id === null ? null : Number(row.point_id),
    seq: row.seq,
    body: row.body,
    author: { id: row.author_id, name: row.name, role: row.role ?? 'admin' },
    createdAt: new Date(row.created_at).toISOString(),
  };
}

/** The plan's comments, oldest first. */
export async function listPlanComments(viewer: SessionUser, studyId: number, planId: number): Promise<PlanComment[]> {
  await requireStudyAccess(viewer, studyId, 'study.view');
  await lockablePlanHead(db, studyId, planId);
  const rows: CommentRow[] = await commentQuery(db, studyId, planId).orderBy('plan_comments.created_at').orderBy('plan_comments.id');
  return rows.map(toComment);
}

export async function createPlanComment(actor: SessionUser, studyId: number, planId: number, input: CommentCreate): Promise<PlanComment> {
  const id = await db.transaction(async (trx) => {
    await requireStudyAccess(actor, studyId, 'comments.write', trx);
    const plan = await lockablePlanHead(trx, studyId, planId, 'share');
    let seq: number | null = null;
    if (input.pointId !== null) {
      const point = await trx('sweep_points').where({ id: input.pointId, plan_id: planId }).first('seq');
      if (!point) throw unprocessable('Some fields need attention.', [{ path: 'pointId', message: 'Choose a point of this plan.' }]);
      seq = point.seq;
    }
    const [inserted] = await trx('plan_comments').insert({ plan_id: planId, point_id: input.pointId, author_id: actor.id, body: input.body });
    await recordAudit(trx, {
      studyId, actorId: actor.id, action: 'comment.create', targetTable: 'plan_comments', targetId: inserted,
      details: { planId, planName: plan.name, pointSeq: seq },
    });
    return inserted as number;
  });
  const row: CommentRow = await commentQuery(db, studyId, planId).where('plan_comments.id', id).first();
  return toComment(row);
}
