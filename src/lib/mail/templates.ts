import type { StudyRole } from '../auth/permissions';

function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] as string);
}

const ROLE_DESCRIPTIONS: Record<StudyRole, string> = {
  researcher: 'describe the coils, predict the link and design sweep plans',
  student: 'log bench readings and upload files against the plans',
  supervisor: 'review predicted against measured results and accept or return plans',
};

export interface InvitationMailInput {
  studyName: string;
  inviterName: string;
  role: StudyRole;
  link: string;
  expiresAt: Date;
}

/** The invitation e-mail: who invites, to which study, as what, the single-use link and its expiry. */
export function invitationMail(input: InvitationMailInput): { subject: string; text: string; html: string } {
  const expires = input.expiresAt.toUTCString();
  const subject = `${input.inviterName} invited you to "${input.studyName}" on Couplet`;
  const text = [
    `${input.inviterName} invited you to join the study "${input.studyName}" on Couplet as ${input.role}.`,
    `As ${input.role} you ${ROLE_DESCRIPTIONS[input.role]}.`,
    '',
    `Open this link to accept (it works once and expires ${expires}):`,
    input.link,
    '',
    'If you did not expect this invitation, ignore this e-mail.',
  ].join('\n');
  const html = `<p>${escapeHtml(input.inviterName)} invited you to join the study <strong>${escapeHtml(input.studyName)}</strong> on Couplet as <strong>${input.role}</strong>.</p>
<p>As ${input.role} you ${ROLE_DESCRIPTIONS[input.role]}.</p>
<p><a href="${escapeHtml(input.link)}">Accept the invitation</a> (the link works once and expires ${escapeHtml(expires)}).</p>
<p>If you did not expect this invitation, ignore this e-mail.</p>`;
  return { subject, text, html };
}

export interface PlanSubmittedMailInput {
  studyName: string;
  planName: string;
  submitterName: string;
  /** the plan's page */
  link: string;
  /** points with at least one current reading, and all points */
  pointsLogged: number;
  pointCount: number;
}

/** To the study's supervisors when a plan comes off the bench for review. */
export function planSubmittedMail(input: PlanSubmittedMailInput): { subject: string; text: string; html: string } {
  const subject = `"${input.planName}" is ready for review (${input.studyName})`;
  const coverage = `${input.pointsLogged} of ${input.pointCount} points have readings.`;
  const text = [
    `${input.submitterName} sent the plan "${input.planName}" of the study "${input.studyName}" for review.`,
    coverage,
    '',
    'Open the plan to compare predicted and measured values:',
    input.link,
  ].join('\n');
  const html = `<p>${escapeHtml(input.submitterName)} sent the plan <strong>${escapeHtml(input.planName)}</strong> of the study <strong>${escapeHtml(input.studyName)}</strong> for review.</p>
<p>${escapeHtml(coverage)}</p>
<p><a href="${escapeHtml(input.link)}">Open the plan</a> to compare predicted and measured values.</p>`;
  return { subject, text, html };
}

export interface PlanDecisionMailInput {
  studyName: string;
  planName: string;
  reviewerName: string;
  decision: 'accepted' | 'returned';
  /** required when returned */
  reason: string;
  /** the plan's review page */
  link: string;
  /** e.g. "RMS relative error of k 3.21 % over 8 poses", or null when nothing was compared */
  agreement: string | null;
}

/** To the study's researchers and students when a supervisor accepts a plan or returns it to the bench. */
export function planDecisionMail(input: PlanDecisionMailInput): { subject: string; text: string; html: string } {
  const accepted = input.decision === 'accepted';
  const subject = accepted
    ? `"${input.planName}" was accepted (${input.studyName})`
    : `"${input.planName}" was returned to the bench (${input.studyName})`;
  const headline = accepted
    ? `${input.reviewerName} accepted the plan "${input.planName}" of the study "${input.studyName}".`
    : `${input.reviewerName} returned the plan "${input.planName}" of the study "${input.studyName}" to the bench.`;
  const reasonLabel = accepted ? 'Note' : 'Reason';
  const lines = [headline];
  if (input.reason) lines.push('', `${reasonLabel}: ${input.reason}`);
  if (input.agreement) lines.push('', input.agreement);
  lines.push('', accepted ? 'Open the review:' : 'Open the review, then correct or add readings in the logbook and send the plan again:', input.link);
  const html = `<p>${escapeHtml(headline)}</p>
${input.reason ? `<p><strong>${reasonLabel}:</strong> ${escapeHtml(input.reason)}</p>` : ''}
${input.agreement ? `<p>${escapeHtml(input.agreement)}</p>` : ''}
<p><a href="${escapeHtml(input.link)}">Open the review</a>${accepted ? '' : ', then correct or add readings in the logbook and send the plan again'}.</p>`;
  return { subject, text: lines.join('\n'), html };
}
