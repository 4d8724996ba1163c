/**
 * Plan states (PRODUCT.md): draft -> on the bench -> in review -> accepted, or back to on the bench when
 * returned. Who may take each step is a study action of src/lib/auth/permissions.ts, so the role table
 * stays in one place. Pure, for the server and the UI's buttons alike.
 */
import { canOnStudy, type Actor, type StudyAction } from '../auth/permissions';

export const PLAN_STATES = ['draft', 'on_bench', 'in_review', 'accepted'] as const;
export type PlanState = (typeof PLAN_STATES)[number];

export const PLAN_STATE_LABELS: Record<PlanState, string> = {
  draft: 'draft',
  on_bench: 'on the bench',
  in_review: 'in review',
  accepted: 'accepted',
};

export interface PlanTransition {
  from: PlanState;
  to: PlanState;
  /** the study action the actor needs (researcher/admin edit; student/researcher log; supervisor decides) */
  action: StudyAction;
  label: string;
}

/**
 * Every allowed step. Back from the bench to draft is not offered: it would be allowed only while no
 * readings exist, and once readings exist the plan's axes must stay frozen.
 */
export const PLAN_TRANSITIONS: readonly PlanTransition[] = [
  { from: 'draft', to: 'on_bench', action: 'study.edit', label: 'Open for the bench' },
  { from: 'on_bench', to: 'in_review', action: 'readings.log', label: 'Send for review' },
  { from: 'in_review', to: 'accepted', action: 'plan.decide', label: 'Accept' },
  { from: 'in_review', to: 'on_bench', action: 'plan.decide', label: 'Return to the bench' },
];

export function findTransition(from: PlanState, to: PlanState): PlanTransition | null {
  return PLAN_TRANSITIONS.find((t) => t.from === from && t.to === to) ?? null;
}

/** The steps this actor may take from `state`, for the UI to show the right buttons. */
export function allowedTransitions(actor: Actor, state: PlanState): PlanTransition[] {
  return PLAN_TRANSITIONS.filter((t) => t.from === state && canOnStudy(actor, t.action));
}
