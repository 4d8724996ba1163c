import 'server-only';
import type { Knex } from 'knex';
import type { SessionUser } from '../auth/session-user';
import { serverEnv } from '../env';
import { unprocessable } from '../http/errors';
import { enqueueMail } from '../mail/outbox';
import { planDecisionMail } from '../mail/templates';
import { formatPercentValue } from '../../components/review/format-review';
import type { AgreementSummary, ReviewDecision } from '../review/types';
import type { PlanTransitionInput } from '../validations/plan';
import { toJsonColumn } from './json-column';
import { activeMemberEmails } from './members';
import { lockablePlanHead, reviewWithin } from './review';

/**
 * A supervisor's decision on a plan in review, inside the transition's transaction: the decision row
 * (who, when, why, and the agreement they decided on) and the e-mail to the study's researchers and
 * students, queued in the mail outbox. Both commit together, so nobody misses a decision, and a mail
 * relay that is down only delays the e-mail; the caller kicks the outbox after the commit.
 */

/** The review page's address, which every e-mail about a plan's review links to. */
export const planReviewUrl = (studyId: number, planId: number) => `${serverEnv().APP_URL}/studies/${studyId}/plans/${planId}/review`;

/** One line for the e-mail: the figure a reader looks for first. */
function agreementLine(summary: AgreementSummary | null): string | null {
  if (!summary || summary.rmsRelative === null) return null;
  return `RMS relative error of the coupling coefficient k: ${formatPercentValue(summary.rmsRelative)} over ${summary.compared} pose${summary.compared === 1 ? '' : 's'}`
    + ` (${summary.outsideTolerance} outside ±${formatPercentValue(summary.tolerance, 0)}).`;
}

export async function recordDecision(
  trx: Knex.Transaction,
  actor: SessionUser,
  studyId: number,
  planId: number,
  planName: string,
  input: PlanTransitionInput,
): Promise<void> {
  const decision: ReviewDecision = input.to === 'accepted' ? 'accepted' : 'returned';
  const reason = input.reason?.trim() ?? '';
  if (decision === 'returned' && !reason) {
    throw unprocessable('Some fields need attention.', [{ path: 'reason', message: 'Say what the bench should fix before the plan comes back.' }]);
  }
  const review = await reviewWithin(trx, await lockablePlanHead(trx, studyId, planId), 'coupling');
  const summary = review.summary.compared > 0 ? review.summary : null;
  await trx('plan_reviews').insert({ plan_id: planId, decision, reason: reason || null, reviewer_id: actor.id, summary: toJsonColumn(summary) });

  const recipients = await activeMemberEmails(trx, studyId, ['researcher', 'student']);
  const study = await trx('studies').where({ id: studyId }).first('name');
  const mail = planDecisionMail({
    studyName: study.name, planName, reviewerName: actor.name, decision, reason,
    link: planReviewUrl(studyId, planId), agreement: agreementLine(summary),
  });
  for (const recipient of recipients) await enqueueMail(trx, { to: recipient.email, ...mail }, { kind: 'plan.decision', studyId });
}
