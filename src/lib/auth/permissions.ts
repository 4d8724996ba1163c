/**
 * Who may do what, as one table (PRODUCT.md, "Roles"). Pure data and functions: no server imports,
 * so the UI can hide buttons with the same rules the server enforces.
 */

export const STUDY_ROLES = ['researcher', 'student', 'supervisor'] as const;
export type StudyRole = (typeof STUDY_ROLES)[number];

export const SITE_ROLES = ['admin', 'researcher', 'member'] as const;
export type SiteRole = (typeof SITE_ROLES)[number];

export const STUDY_ACTIONS = [
  'study.view',
  'study.edit',
  'members.manage',
  'readings.log',
  'comments.write',
  'plan.decide',
  'review.analyse',
] as const;
export type StudyAction = (typeof STUDY_ACTIONS)[number];

/** The role x action matrix. `admin` is the site administrator acting on any study. */
export const STUDY_PERMISSIONS: Record<StudyAction, { roles: readonly StudyRole[]; admin: boolean; label: string }> = {
  'study.view': { roles: ['researcher', 'student', 'supervisor'], admin: true, label: 'See the study' },
  'study.edit': { roles: ['researcher'], admin: true, label: 'Edit the study, coils, placements and plans' },
  'members.manage': { roles: ['researcher', 'supervisor'], admin: true, label: 'Invite members and change their roles' },
  'readings.log': { roles: ['researcher', 'student'], admin: false, label: 'Log readings and upload files' },
  'comments.write': { roles: ['researcher', 'student', 'supervisor'], admin: false, label: 'Comment on points' },
  'plan.decide': { roles: ['supervisor'], admin: false, label: 'Accept or return a plan' },
  'review.analyse': { roles: ['researcher', 'supervisor'], admin: false, label: 'Set outliers aside, fit effective parameters, set the review tolerance' },
};

export interface Actor {
  siteRole: SiteRole;
  /** The actor's role on the study in question, or null when not a member. */
  studyRole: StudyRole | null;
}

/** Whether the actor may see the study at all. Non-members who are not admins must get 404. */
export function canSeeStudy(actor: Actor): boolean {
  return actor.studyRole !== null || actor.siteRole === 'admin';
}

/** Whether the actor may perform `action` on a study. */
export function canOnStudy(actor: Actor, action: StudyAction): boolean {
  const rule = STUDY_PERMISSIONS[action];
  if (actor.studyRole !== null && rule.roles.includes(actor.studyRole)) return true;
  return actor.siteRole === 'admin' && rule.admin;
}

/** Starting a study is a site-level right: admins and researcher accounts. */
export function canCreateStudy(siteRole: SiteRole): boolean {
  return siteRole === 'admin' || siteRole === 'researcher';
}

/** Managing accounts is for site admins only. */
export function canManageAccounts(siteRole: SiteRole): boolean {
  return siteRole === 'admin';
}

/** Every action the actor may take on a study, for the UI to show the right controls. */
export function allowedStudyActions(actor: Actor): StudyAction[] {
  return STUDY_ACTIONS.filter((action) => canOnStudy(actor, action));
}
