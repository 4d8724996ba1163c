import 'server-only';
import type { Knex } from 'knex';
import { db } from '../db';
import { requireStudyAccess } from '../auth/access';
import { canOnStudy } from '../auth/permissions';
import type { SessionUser } from '../auth/session-user';
import {
  actionsOfCategory, DESCRIBED_ACTIONS, describeEvent, REVIEW_TRANSITION_STATES, TRANSITION_ACTION,
  type HistoryCategory,
} from '../audit/describe-event';
import { historyQuerySchema, type HistoryQueryInput } from '../validations/history';
import { fromJsonColumn } from './json-column';

export interface HistoryPerson {
  id: number;
  name: string;
}

/** One row of the study's audit trail, in words. */
export interface HistoryEvent {
  id: number;
  /** ISO 8601, UTC */
  at: string;
  /** null when the account is gone */
  actor: HistoryPerson | null;
  action: string;
  category: HistoryCategory;
  /** what happened, without the person: "created the plan “Probe tilt x depth”" */
  sentence: string;
  targetTable: string | null;
  targetId: string | null;
  /** the plan the event concerns, when it concerns one */
  planId: number | null;
  /** that plan's current name; null when there is no plan or it has been deleted (so no link to it) */
  planName: string | null;
  details: Record<string, unknown> | null;
}

export interface HistoryPage {
  /** newest first */
  events: HistoryEvent[];
  /** pass as `before` for the next, older page; null when this page reaches the first event */
  nextBefore: number | null;
  /** everyone who has done something on the study, by name, for the person filter */
  actors: HistoryPerson[];
}

interface AuditRow {
  id: number | string;
  created_at: Date;
  actor_id: number | null;
  actor_name: string | null;
  action: string;
  target_table: string | null;
  target_id: string | null;
  details: unknown;
  /** the reading's plan, for rows about a reading (they carry the plan's name only) */
  reading_plan_id: number | null;
}

/** Invitees' addresses are for those who manage members, as on the members page. */
const PRIVATE_DETAILS: Record<string, readonly string[]> = { 'invitation.create': ['email'] };

/**
 * A page of the study's history, newest first, for anyone who can see the study (404 otherwise).
 * Keyset pagination on the event id; filters by plan, person and category. An event concerns a plan
 * when it targets the plan itself, names it in details.planId, or targets one of its readings.
 */
export async function listStudyHistory(viewer: SessionUser, studyId: number, query: HistoryQueryInput = {}): Promise<HistoryPage> {
  const access = await requireStudyAccess(viewer, studyId, 'study.view');
  const { before, limit, planId, actorId, category } = historyQuerySchema.parse(query);

  const rows: AuditRow[] = await db('audit_events as a')
    .leftJoin('users as u', 'u.id', 'a.actor_id')
    .leftJoin('readings as r', function joinReading() {
      this.on('a.target_table', '=', db.raw('?', ['readings'])).andOn('r.id', '=', 'a.target_id');
    })
    .where('a.study_id', studyId)
    .modify((q) => {
      if (before !== undefined) q.where('a.id', '<', before);
      if (actorId !== undefined) q.where('a.actor_id', actorId);
      if (planId !== undefined) wherePlan(q, planId);
      if (category !== undefined) whereCategory(q, category);
    })
    .orderBy('a.id', 'desc')
    .limit(limit + 1)
    .select(
      'a.id', 'a.created_at', 'a.actor_id', 'u.name as actor_name', 'a.action', 'a.target_table', 'a.target_id', 'a.details',
      'r.plan_id as reading_plan_id',
    );

  const page = rows.slice(0, limit);
  const showPrivate = canOnStudy({ siteRole: viewer.siteRole, studyRole: access.studyRole }, 'members.manage');
  const facts = page.map((row) => {
    const details = visibleDetails(row, showPrivate);
    return { row, details, planId: planOf(row, details) };
  });
  const targetsIn = (table: string) => page.map((row) => (row.target_table === table ? idIn(row.target_id) : null));
  const [planNames, personNames, coilNames, setupNames, studyNames, actors] = await Promise.all([
    namesOf(db('sweep_plans').where('study_id', studyId), facts.map((f) => f.planId)),
    namesOf(db('users'), facts.map((f) => idIn(f.details?.userId))),
    namesOf(db('coils').where('study_id', studyId), targetsIn('coils')),
    namesOf(db('setups').where('study_id', studyId), targetsIn('setups')),
    namesOf(db('studies').where('id', studyId), targetsIn('studies')),
    studyActors(studyId),
  ]);
  // Rows written without a name (the seed's) are told with the target's name now.
  const targetNames = new Map([['coils', coilNames], ['setups', setupNames], ['studies', studyNames]]);

  const events = facts.map(({ row, details, planId: eventPlanId }): HistoryEvent => {
    const planName = eventPlanId === null ? null : planNames.get(eventPlanId) ?? null;
    const personId = idIn(details?.userId);
    const targetId = idIn(row.target_id);
    const { sentence, category: eventCategory } = describeEvent({
      action: row.action, details, targetTable: row.target_table, targetId: row.target_id,
      planName,
      personName: personId === null ? null : personNames.get(personId) ?? null,
      targetName: row.target_table && targetId !== null ? targetNames.get(row.target_table)?.get(targetId) ?? null : null,
    });
    return {
      id: Number(row.id),
      at: new Date(row.created_at).toISOString(),
      actor: row.actor_id === null ? null : { id: row.actor_id, name: row.actor_name ?? 'A removed account' },
      action: row.action,
      category: eventCategory,
      sentence,
      targetTable: row.target_table,
      targetId: row.target_id,
      planId: eventPlanId,
      planName,
      details,
    };
  });
  return { events, nextBefore: rows.length > limit ? events[events.length - 1].id : null, actors };
}

/** The plan filter, the SQL twin of planOf. JSON_VALUE gives text, so the id is compared as text. */
function wherePlan(q: Knex.QueryBuilder, planId: number): void {
  q.where(function concernsPlan() {
    this.where({ 'a.target_table': 'sweep_plans', 'a.target_id': String(planId) })
      .orWhereRaw("JSON_VALUE(a.details, '$.planId') = ?", [String(planId)])
      .orWhere('r.plan_id', planId);
  });
}

/**
 * The category filter, the SQL twin of describeEvent's categories: fixed actions by name, a plan's
 * state change by its states, and 'other' for every action describe-event does not know.
 */
function whereCategory(q: Knex.QueryBuilder, category: HistoryCategory): void {
  if (category === 'other') {
    q.whereNotIn('a.action', DESCRIBED_ACTIONS);
    return;
  }
  const { to, from } = REVIEW_TRANSITION_STATES;
  const marks = (values: readonly string[]) => values.map(() => '?').join(', ');
  const reviewStates = `(COALESCE(JSON_VALUE(a.details, '$.to'), '') IN (${marks(to)}) OR COALESCE(JSON_VALUE(a.details, '$.from'), '') IN (${marks(from)}))`;
  const bindings = [...to, ...from];
  q.where(function inCategory() {
    this.whereIn('a.action', actionsOfCategory(category));
    if (category === 'review') this.orWhere((t) => t.where('a.action', TRANSITION_ACTION).whereRaw(reviewStates, bindings));
    if (category === 'plans') this.orWhere((t) => t.where('a.action', TRANSITION_ACTION).whereRaw(`NOT ${reviewStates}`, bindings));
  });
}

function visibleDetails(row: AuditRow, showPrivate: boolean): Record<string, unknown> | null {
  const details = row.details === null || row.details === undefined ? null : fromJsonColumn<unknown>(row.details);
  if (details === null || typeof details !== 'object' || Array.isArray(details)) return null;
  const hidden = showPrivate ? [] : PRIVATE_DETAILS[row.action] ?? [];
  return Object.fromEntries(Object.entries(details).filter(([key]) => !hidden.includes(key)));
}

/** The plan an event concerns: the rule wherePlan filters by. */
function planOf(row: AuditRow, details: Record<string, unknown> | null): number | null {
  if (row.target_table === 'sweep_plans') return idIn(row.target_id);
  return idIn(details?.planId) ?? (row.reading_plan_id === null ? null : Number(row.reading_plan_id));
}

/** A positive whole id from a column or a details value, or null. */
function idIn(value: unknown): number | null {
  const id = typeof value === 'string' && /^[1-9][0-9]{0,9}$/.test(value) ? Number(value) : value;
  return typeof id === 'number' && Number.isSafeInteger(id) && id > 0 ? id : null;
}

async function namesOf(table: Knex.QueryBuilder, ids: (number | null)[]): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((id): id is number => id !== null))];
  if (wanted.length === 0) return new Map();
  const rows: { id: number; name: string }[] = await table.whereIn('id', wanted).select('id', 'name');
  return new Map(rows.map((row) => [Number(row.id), row.name]));
}

async function studyActors(studyId: number): Promise<HistoryPerson[]> {
  const rows: { id: number; name: string }[] = await db('audit_events as a')
    .join('users as u', 'u.id', 'a.actor_id')
    .where('a.study_id', studyId)
    .distinct('u.id', 'u.name')
    .orderBy('u.name');
  return rows.map((row) => ({ id: Number(row.id), name: row.name }));
}
