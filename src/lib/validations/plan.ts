import { z } from 'zod';
import { AXIS_QUANTITIES, axisIssues, type PlanAxis } from '../plans/axes';
import { ORDER_MODES } from '../plans/order';
import { MAX_AXES, oversizeMessage } from '../plans/points';
import { PLAN_STATES } from '../plans/states';

/**
 * A sweep plan's design. Axis values are SI (metres, degrees, hertz, ohms); the form converts
 * what was typed and keeps the unit in `displayUnit`. Every problem carries its field path, and a plan
 * over 5,000 points is refused at `axes`.
 */

const num = (label: string) => z.number({ error: `Enter the ${label}.` }).finite(`Enter the ${label} as a number.`);

const axisBase = {
  quantity: z.enum(AXIS_QUANTITIES, { error: 'Choose distance, lateral offset, tilt, frequency or load resistance.' }),
  displayUnit: z.string({ error: 'Give the unit the values were typed in.' }).trim().min(1, 'Give the unit the values were typed in.').max(16, 'Use at most 16 characters.'),
};

const axisSchema = z
  .discriminatedUnion('mode', [
    z.object({ ...axisBase, mode: z.literal('range'), start: num('start'), stop: num('stop'), step: num('step') }),
    z.object({
      ...axisBase, mode: z.literal('count'), start: num('start'), stop: num('stop'),
      count: z.number({ error: 'Enter the number of values.' }).int('The count must be a whole number.').min(1, 'The count must be at least 1.'),
      spacing: z.enum(['linear', 'log'], { error: 'Choose linear or logarithmic spacing.' }),
    }),
    z.object({ ...axisBase, mode: z.literal('list'), values: z.array(num('value'), { error: 'List the values.' }).min(1, 'List at least one value.') }),
  ], { error: 'Choose how the axis is given: range, count or list.' })
  .superRefine((axis, ctx) => {
    for (const issue of axisIssues(axis as PlanAxis)) ctx.addIssue({ code: 'custom', path: issue.path.split('.').map((p) => (/^\d+$/.test(p) ? Number(p) : p)), message: issue.message });
  });

export const planNameSchema = z.string({ error: 'Enter a name for the plan.' }).trim().min(1, 'Enter a name for the plan.').max(120, 'Use at most 120 characters.');

const planFields = {
  name: planNameSchema,
  setupId: z.number({ error: 'Choose a setup.' }).int('Choose a setup.').positive('Choose a setup.'),
  axes: z
    .array(axisSchema, { error: 'Add at least one axis.' })
    .min(1, 'Add at least one axis.')
    .max(MAX_AXES, `A plan has at most ${MAX_AXES} axes.`)
    .superRefine((axes, ctx) => {
      const seen = new Set<string>();
      axes.forEach((axis, i) => {
        if (seen.has(axis.quantity)) ctx.addIssue({ code: 'custom', path: [i, 'quantity'], message: 'Each quantity can be on one axis only.' });
        seen.add(axis.quantity);
      });
    }),
  repeats: z.number({ error: 'Enter the repeats per point.' }).int('Repeats are a whole number.').min(1, 'At least 1 repeat.').max(20, 'At most 20 repeats.'),
  referenceEvery: z
    .number({ error: 'Enter how often the reference point is measured, or leave it off.' })
    .int('Enter a whole number of points.')
    .min(2, 'Re-measure the reference every 2 to 1,000 points.')
    .max(1000, 'Re-measure the reference every 2 to 1,000 points.')
    .nullable(),
  orderMode: z.enum(ORDER_MODES, { error: 'Choose as listed, serpentine or shuffled.' }),
  shuffleSeed: z.number({ error: 'The seed is a whole number.' }).int('The seed is a whole number.').min(0, 'The seed is 0 to 2147483647.').max(2147483647, 'The seed is 0 to 2147483647.').nullable(),
  minutesPerPoint: z.number({ error: 'Enter the minutes per point.' }).positive('Minutes per point must be greater than zero.').max(240, 'At most 240 minutes per point.'),
  notes: z.string({ error: 'Notes are text.' }).trim().max(4000, 'Use at most 4,000 characters.'),
};

type PlanShape = { axes: PlanAxis[]; repeats: number; referenceEvery: number | null; orderMode: string; shuffleSeed: number | null };

/** Too many points (at `axes`) and a shuffled order without a seed (at `shuffleSeed`). */
function refinePlan(plan: PlanShape, ctx: z.RefinementCtx): void {
  const oversize = oversizeMessage(plan);
  if (oversize) ctx.addIssue({ code: 'custom', path: ['axes'], message: oversize });
  if (plan.orderMode === 'shuffled' && plan.shuffleSeed === null) ctx.addIssue({ code: 'custom', path: ['shuffleSeed'], message: 'A shuffled order needs a seed.' });
}

/** Creating a draft plan. */
export const planCreateSchema = z
  .object({
    ...planFields,
    repeats: planFields.repeats.default(1),
    referenceEvery: planFields.referenceEvery.optional().default(null),
    orderMode: planFields.orderMode.default('as_listed'),
    shuffleSeed: planFields.shuffleSeed.optional().default(null),
    notes: planFields.notes.optional().default(''),
  })
  .superRefine((plan, ctx) => refinePlan(plan as PlanShape, ctx));
export type PlanCreateInput = z.input<typeof planCreateSchema>;
export type PlanCreate = z.output<typeof planCreateSchema>;

/**
 * Changing a draft: any subset of the fields (the form may send the whole design). The server merges
 * it with the stored plan and checks the result with planCreateSchema, so the point count and the
 * shuffle seed are always checked against the rest of the plan.
 */
export const planUpdateSchema = z
  .object({
    name: planFields.name.optional(),
    setupId: planFields.setupId.optional(),
    axes: planFields.axes.optional(),
    repeats: planFields.repeats.optional(),
    referenceEvery: planFields.referenceEvery.optional(),
    orderMode: planFields.orderMode.optional(),
    shuffleSeed: planFields.shuffleSeed.optional(),
    minutesPerPoint: planFields.minutesPerPoint.optional(),
    notes: planFields.notes.optional(),
  })
  .refine((value) => Object.values(value).some((field) => field !== undefined), { message: 'Nothing to change.' });
export type PlanUpdateInput = z.input<typeof planUpdateSchema>;
export type PlanUpdate = z.output<typeof planUpdateSchema>;

/** Moving a plan to another state; a reason is kept in the audit trail (e.g. why it was returned). */
export const planTransitionSchema = z.object({
  to: z.enum(PLAN_STATES, { error: 'Choose the state to move the plan to.' }),
  reason: z.string({ error: 'The reason is text.' }).trim().max(2000, 'Use at most 2,000 characters.').optional(),
});
export type PlanTransitionInput = z.infer<typeof planTransitionSchema>;
