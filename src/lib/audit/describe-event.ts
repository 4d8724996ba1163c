/**
 * The audit trail in words: one plain-English sentence and one category for each recorded action,
 * for the study's History page. The sentence leaves out who did it (the page shows the person beside
 * it), so it starts with a verb: "created the plan “Probe tilt x depth”". Pure: no server imports, so
 * the server and the browser say the same thing. An action not described here gets a generic sentence
 * and the category 'other' instead of an error, so a new action never breaks the page.
 */
import { METHOD_SPECS, type MeasurementMethod } from '../../physics/measurement/methods';
import { PLAN_STATE_LABELS, type PlanState } from '../plans/states';
import { FIT_MODEL_INFO, REVIEW_QUANTITY_LABELS, type FitModel, type ReviewQuantity } from '../review/types';

export const HISTORY_CATEGORIES = ['study', 'members', 'coils', 'setups', 'plans', 'readings', 'files', 'review', 'other'] as const;
export type HistoryCategory = (typeof HISTORY_CATEGORIES)[number];

export const HISTORY_CATEGORY_LABELS: Record<HistoryCategory, string> = {
  study: 'Study',
  members: 'People',
  coils: 'Coils',
  setups: 'Setups',
  plans: 'Plans',
  readings: 'Readings',
  files: 'Files',
  review: 'Review',
  other: 'Other',
};

/** What the trail holds about one event, plus names the server looked up for it. */
export interface AuditEventFacts {
  action: string;
  details: Record<string, unknown> | null;
  targetTable?: string | null;
  targetId?: string | number | null;
  /** The plan's current name, for rows that do not carry it in their details. */
  planName?: string | null;
  /** The name of the person the event is about (details.userId), when known. */
  personName?: string | null;
  /** The target row's current name (a coil, a setup, the study), for rows that do not carry one. */
  targetName?: string | null;
}

export interface EventDescription {
  sentence: string;
  category: HistoryCategory;
}

/**
 * A plan's state change belongs to the review when it enters or leaves review or is accepted; opening
 * a draft for the bench is plan work. The server filters by category in SQL with the same states.
 */
export const TRANSITION_ACTION = 'plan.transition';
export const REVIEW_TRANSITION_STATES = { to: ['in_review', 'accepted'], from: ['in_review'] } as const;

export function isReviewTransition(from: unknown, to: unknown): boolean {
  return (REVIEW_TRANSITION_STATES.to as readonly unknown[]).includes(to) || (REVIEW_TRANSITION_STATES.from as readonly unknown[]).includes(from);
}

// ---------------------------------------------------------------------------------------------
// Reading details: rows were written by many versions of the code, so every field may be missing.

type Facts = AuditEventFacts;

function text(facts: Facts, key: string): string | null {
  const value = facts.details?.[key];
  return typeof value === 'string' && value.trim() !== '' ? value.trim() : null;
}

function number(facts: Facts, key: string): number | null {
  const value = facts.details?.[key];
  if (typeof value === 'number' && Number.isFinite(value)) return value;
  if (typeof value === 'string' && value.trim() !== '' && Number.isFinite(Number(value))) return Number(value);
  return null;
}

const quoted = (name: string) => `\u201c${name}\u201d`;
const withArticle = (noun: string) => `${/^[aeiou]/i.test(noun) ? 'an' : 'a'} ${noun}`;
const reasonSuffix = (facts: Facts) => (text(facts, 'reason') ? `: ${text(facts, 'reason')}` : '');

/** "the coil “X”", or "a coil" when the row does not name it. */
function named(noun: string, name: string | null): string {
  return name ? `the ${noun} ${quoted(name)}` : withArticle(noun);
}

/** The thing an event is about by its name as written then, else its name now. */
const nameOf = (facts: Facts) => text(facts, 'name') ?? facts.targetName ?? null;

/** The plan an event is about: its name as written then, else its name now. */
function planOf(facts: Facts, key: 'name' | 'planName' | 'plan'): string {
  return named('plan', text(facts, key) ?? facts.planName ?? null);
}

function pointOf(facts: Facts, key: 'pointSeq' | 'point', planKey: 'planName' | 'plan'): string {
  const seq = number(facts, key);
  return seq === null ? planOf(facts, planKey) : `point ${seq} of ${planOf(facts, planKey)}`;
}

/** Names of changed fields as words: "geometry, wire label". */
const FIELD_WORDS: Record<string, string> = {
  spec: 'geometry',
  measured: 'measured values',
  transmitterCoilId: 'transmitter coil',
  receiverCoilId: 'receiver coil',
  setupId: 'setup',
  referenceEvery: 'reference interval',
  orderMode: 'point order',
  siteRole: 'site role',
};

function changedFields(fields: unknown): string {
  if (!Array.isArray(fields)) return '';
  const words = fields
    .filter((field): field is string => typeof field === 'string')
    .map((field) => FIELD_WORDS[field] ?? field.replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase());
  return words.length > 0 ? ` (${words.join(', ')})` : '';
}

const person = (facts: Facts, fallback: string) => facts.personName ?? fallback;

// ---------------------------------------------------------------------------------------------
// Numbers in sentences

const significant = (value: number, digits: number) => String(Number(value.toPrecision(digits)));

/** A fit's estimate with its unit; lengths in millimetres, as they are measured on the bench. */
function fitValue(model: FitModel, value: number, uncertainty: number | null): string {
  const unit = FIT_MODEL_INFO[model].unit;
  const scale = unit === 'm' ? 1000 : 1;
  const shown = unit === 'm' ? ' mm' : unit === '\u00b0' ? '\u00b0' : ` ${unit}`;
  const spread = uncertainty === null ? '' : ` \u00b1 ${significant(uncertainty * scale, 2)}`;
  return `${significant(value * scale, 3)}${spread}${shown}`;
}

function describeFit(facts: Facts): string {
  const model = text(facts, 'model');
  const quantity = text(facts, 'quantity');
  const value = number(facts, 'value');
  const plan = planOf(facts, 'planName');
  if (!model || !(model in FIT_MODEL_INFO)) return `ran a fit on ${plan}`;
  const label = FIT_MODEL_INFO[model as FitModel].label.toLowerCase();
  const of = quantity && quantity in REVIEW_QUANTITY_LABELS ? ` from the ${REVIEW_QUANTITY_LABELS[quantity as ReviewQuantity].label.toLowerCase()}` : '';
  const result = value === null ? '' : `: ${fitValue(model as FitModel, value, number(facts, 'uncertainty'))}`;
  return `estimated the ${label}${of} of ${plan}${result}`;
}

function describeTransition(facts: Facts): string {
  const from = text(facts, 'from');
  const to = text(facts, 'to');
  const plan = planOf(facts, 'name');
  if (to === 'accepted') return `accepted ${plan}${reasonSuffix(facts)}`;
  if (from === 'in_review' && to === 'on_bench') return `returned ${plan} to the bench${reasonSuffix(facts)}`;
  if (to === 'in_review') return `sent ${plan} for review`;
  if (from === 'draft' && to === 'on_bench') return `opened ${plan} for the bench`;
  const label = (state: string | null) => (state && state in PLAN_STATE_LABELS ? PLAN_STATE_LABELS[state as PlanState] : state ?? 'another state');
  return `moved ${plan} from ${label(from)} to ${label(to)}${reasonSuffix(facts)}`;
}

function describeReading(facts: Facts): string {
  const method = text(facts, 'method');
  const label = method && method in METHOD_SPECS ? `${METHOD_SPECS[method as MeasurementMethod].label.toLowerCase()} reading` : 'reading';
  return `logged ${withArticle(label)} at ${pointOf(facts, 'point', 'plan')}`;
}

function describeImport(facts: Facts): string {
  const count = number(facts, 'count');
  const readings = count === null ? 'readings' : `${count} reading${count === 1 ? '' : 's'}`;
  const file = text(facts, 'fileName');
  return `imported ${readings} into ${planOf(facts, 'plan')}${file ? ` from ${quoted(file)}` : ''}`;
}

const ATTACHMENT_WORDS: Record<string, string> = { photo: 'a photo', instrument: 'an instrument file' };

function describeAttachment(facts: Facts): string {
  const kind = ATTACHMENT_WORDS[text(facts, 'kind') ?? ''] ?? 'a file';
  const file = text(facts, 'fileName');
  return `attached ${kind}${file ? ` ${quoted(file)}` : ''} to ${planOf(facts, 'planName')}`;
}

function describeRoleChange(facts: Facts): string {
  const who = person(facts, 'a member');
  const from = text(facts, 'from');
  const to = text(facts, 'to');
  if (!to) return `changed the study role of ${who}`;
  return `changed the study role of ${who}${from ? ` from ${from}` : ''} to ${to}`;
}

function describeTolerance(facts: Facts): string {
  const tolerance = number(facts, 'tolerance');
  const plan = planOf(facts, 'planName');
  return tolerance === null ? `changed the review tolerance of ${plan}` : `set the review tolerance of ${plan} to ${significant(tolerance * 100, 3)} %`;
}

// ---------------------------------------------------------------------------------------------
// Every action the app records

interface ActionWords {
  category: HistoryCategory;
  describe: (facts: Facts) => string;
}

const ACTIONS: Record<string, ActionWords> = {
  'study.create': { category: 'study', describe: (f) => `created ${named('study', nameOf(f))}` },

  'invitation.create': {
    category: 'members',
    describe: (f) => {
      const role = text(f, 'role');
      const email = text(f, 'email');
      return `invited ${email ?? 'someone'} to join${role ? ` as ${withArticle(role)}` : ''}`;
    },
  },
  'invitation.revoke': { category: 'members', describe: () => 'withdrew an invitation' },
  'invitation.accept': { category: 'members', describe: (f) => `joined the study${text(f, 'role') ? ` as ${withArticle(text(f, 'role')!)}` : ''}` },
  'member.role.change': { category: 'members', describe: describeRoleChange },
  'account.create': {
    category: 'members',
    describe: (f) => `created the account of ${person(f, 'a new person')}${text(f, 'siteRole') ? ` (site role ${text(f, 'siteRole')})` : ''}`,
  },
  'account.create.invited': { category: 'members', describe: () => 'created their account from an invitation' },
  'account.update': {
    category: 'members',
    describe: (f) => `changed the account of ${person(f, 'a person')}${changedFields(f.details ? Object.keys(f.details) : [])}`,
  },

  'coil.create': { category: 'coils', describe: (f) => `added ${named('coil', nameOf(f))}${text(f, 'kind') ? ` (${text(f, 'kind')})` : ''}` },
  'coil.update': { category: 'coils', describe: (f) => `changed ${named('coil', nameOf(f))}${changedFields(f.details?.fields)}` },
  'coil.delete': { category: 'coils', describe: (f) => `deleted ${named('coil', nameOf(f))}` },

  'setup.create': { category: 'setups', describe: (f) => `saved ${named('setup', nameOf(f))}` },
  'setup.update': { category: 'setups', describe: (f) => `changed ${named('setup', nameOf(f))}${changedFields(f.details?.fields)}` },
  'setup.delete': { category: 'setups', describe: (f) => `deleted ${named('setup', nameOf(f))}` },

  'plan.create': { category: 'plans', describe: (f) => `created ${planOf(f, 'name')}` },
  'plan.update': { category: 'plans', describe: (f) => `changed ${planOf(f, 'name')}${changedFields(f.details?.fields)}` },
  'plan.delete': { category: 'plans', describe: (f) => `deleted ${planOf(f, 'name')}` },
  // Its category depends on the states: see describeEvent.
  [TRANSITION_ACTION]: { category: 'plans', describe: describeTransition },

  'cautions.acknowledge': { category: 'readings', describe: (f) => `acknowledged the bench cautions for ${planOf(f, 'planName')}` },
  'reading.create': { category: 'readings', describe: describeReading },
  'reading.correct': {
    category: 'readings',
    describe: (f) => {
      const version = number(f, 'version');
      return `corrected the reading at ${pointOf(f, 'point', 'plan')}${version === null ? '' : ` (version ${version})`}${reasonSuffix(f)}`;
    },
  },
  'readings.import': { category: 'readings', describe: describeImport },

  'attachment.create': { category: 'files', describe: describeAttachment },

  'comment.create': { category: 'review', describe: (f) => `commented on ${pointOf(f, 'pointSeq', 'planName')}` },
  'outlier.mark': { category: 'review', describe: (f) => `set ${pointOf(f, 'pointSeq', 'planName')} aside as an outlier${reasonSuffix(f)}` },
  'outlier.unmark': { category: 'review', describe: (f) => `took ${pointOf(f, 'pointSeq', 'planName')} back into the review` },
  'fit.run': { category: 'review', describe: describeFit },
  'review.tolerance': { category: 'review', describe: describeTolerance },
};

/** Every action with its own sentence. */
export const DESCRIBED_ACTIONS: readonly string[] = Object.keys(ACTIONS);

/** The actions whose category is always `category` (plan.transition, which depends on its states, aside). */
export function actionsOfCategory(category: HistoryCategory): string[] {
  return DESCRIBED_ACTIONS.filter((action) => action !== TRANSITION_ACTION && ACTIONS[action].category === category);
}

/** What is said of an action nobody taught this file. */
export function genericSentence(action: string): string {
  return `recorded ${quoted(action)}`;
}

export function describeEvent(facts: AuditEventFacts): EventDescription {
  const words = Object.hasOwn(ACTIONS, facts.action) ? ACTIONS[facts.action] : undefined;
  if (!words) return { sentence: genericSentence(facts.action), category: 'other' };
  const category = facts.action === TRANSITION_ACTION && isReviewTransition(facts.details?.from, facts.details?.to) ? 'review' : words.category;
  try {
    return { sentence: words.describe(facts), category };
  } catch {
    // Details of an unexpected shape (a hand-edited row): say what happened without them.
    return { sentence: genericSentence(facts.action), category };
  }
}
