import 'server-only';
import type { Knex } from 'knex';
import { db } from '../db';
import { requireStudyAccess } from '../auth/access';
import type { SessionUser } from '../auth/session-user';
import { conflict, notFound, unprocessable } from '../http/errors';
import type { OutlierMark } from '../review/types';
import type { OutlierMarkInput } from '../validations/review';
import { recordAudit } from './audit';
import { lockablePlanHead, outlierMarks } from './review';

/**
 * The reviewer's judgements that shape the numbers: points set aside as outliers and the tolerance the
 * summary counts against. Researchers and supervisors make them; once a plan is accepted they are
 * frozen with it, so the accepted figures cannot drift afterwards.
 */

async function openForAnalysis(trx: Knex.Transaction, actor: SessionUser, studyId: number, planId: number) {
  await requireStudyAccess(actor, studyId, 'review.analyse', trx);
  const plan = await lockablePlanHead(trx, studyId, planId, 'update');
  if (plan.state === 'accepted') throw conflict('This plan is accepted: its review is closed.');
  if (plan.state === 'draft') throw conflict('This plan is a draft: nothing has been measured to review.');
  return plan;
}

export async function setReviewTolerance(actor: SessionUser, studyId: number, planId: number, tolerance: number): Promise<{ tolerance: number }> {
  await db.transaction(async (trx) => {
    const plan = await openForAnalysis(trx, actor, studyId, planId);
    await trx('sweep_plans').where({ id: planId }).update({ review_tolerance: tolerance });
    await recordAudit(trx, {
      studyId, actorId: actor.id, action: 'review.tolerance', targetTable: 'sweep_plans', targetId: planId,
      details: { planId, planName: plan.name, tolerance, previous: plan.review_tolerance },
    });
  });
  return { tolerance };
}

/** Sets a point aside: its readings leave the means, the summary and the fits, and stay in the logbook. */
export async function markOutlier(actor: SessionUser, studyId: number, planId: number, input: OutlierMarkInput): Promise<OutlierMark> {
  await db.transaction(async (trx) => {
    const plan = await openForAnalysis(trx, actor, studyId, planId);
    const point = await trx('sweep_points').where({ id: input.pointId, plan_id: planId }).first('seq');
    if (!point) throw unprocessable('Some fields need attention.', [{ path: 'pointId', message: 'Choose a point of this plan.' }]);
    if (await trx('outlier_marks').where({ point_id: input.pointId }).first('id')) {
      throw conflict(`Point ${point.seq} is already set aside.`, [{ path: 'pointId', message: 'Restore it first to give another reason.' }]);
    }
    await trx('outlier_marks').insert({ plan_id: planId, point_id: input.pointId, reason: input.reason, marked_by: actor.id });
    await recordAudit(trx, {
      studyId, actorId: actor.id, action: 'outlier.mark', targetTable: 'sweep_points', targetId: input.pointId,
      details: { planId, planName: plan.name, pointSeq: point.seq, reason: input.reason },
    });
  });
  const marks = await outlierMarks(db, planId);
  return marks.find((m) => m.pointId === input.pointId)!;
}

/** Brings a set-aside point back into the numbers. */
export async function unmarkOutlier(actor: SessionUser, studyId: number, planId: number, pointId: number): Promise<void> {
  await db.transaction(async (trx) => {
    const plan = await openForAnalysis(trx, actor, studyId, planId);
    const mark = await trx('outlier_marks')
      .join('sweep_points', 'sweep_points.id', 'outlier_marks.point_id')
      .where({ 'outlier_marks.plan_id': planId, 'outlier_marks.point_id': pointId })
      .first('outlier_marks.id', 'outlier_marks.reason', 'sweep_points.seq');
    if (!mark) throw notFound('That point is not set aside.');
    await trx('outlier_marks').where({ id: mark.id }).del();
    await recordAudit(trx, {
      studyId, actorId: actor.id, action: 'outlier.unmark', targetTable: 'sweep_points', targetId: pointId,
      details: { planId, planName: plan.name, pointSeq: mark.seq, reason: mark.reason },
    });
  });
}
