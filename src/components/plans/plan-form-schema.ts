import { z } from 'zod';
import { planCreateSchema } from '@/lib/validations/plan';
import { AXIS_QUANTITIES, ORDER_MODES, type PlanInput } from './plan-types';
import { readPlanForm, type PlanFormValues } from './plan-form-values';

/**
 * The designer's zod schema: text fields in, the request body out (SI values, display units kept).
 * The server parses the body again with its own schema; its issues come back to the same paths.
 */
const text = z.string();

export const planFormSchema = z
  .object({
    name: text,
    setupId: text,
    axes: z.array(
      z.object({
        quantity: z.enum(AXIS_QUANTITIES),
        mode: z.enum(['range', 'count', 'list']),
        start: text,
        stop: text,
        step: text,
        count: text,
        spacing: z.enum(['linear', 'log']),
        values: text,
      }),
    ),
    repeats: text,
    referenceEvery: text,
    orderMode: z.enum(ORDER_MODES),
    shuffleSeed: text,
    minutesPerPoint: text,
    notes: text,
  })
  .transform((form, context): PlanInput => {
    const { input, issues } = readPlanForm(form satisfies PlanFormValues);
    const fail = (path: string, message: string) =>
      context.addIssue({ code: 'custom', path: path.split('.').map((p) => (/^\d+$/.test(p) ? Number(p) : p)), message });
    for (const issue of issues) fail(issue.path, issue.message);
    if (!input) return z.NEVER;
    // The server's own rules (limits, repeats, reference spacing), with their messages beside the field.
    const checked = planCreateSchema.safeParse(input);
    if (!checked.success) {
      for (const issue of checked.error.issues) {
        const path = issue.path.join('.').replace(/^(axes\.\d+\.values)\.\d+$/, '$1');
        fail(planFormFieldFor(path) ?? (path.startsWith('axes') ? 'axes' : 'name'), issue.message);
      }
      return z.NEVER;
    }
    return input;
  });

const FORM_PATH = /^(name|setupId|repeats|referenceEvery|orderMode|shuffleSeed|minutesPerPoint|notes|axes\.\d+\.(quantity|mode|start|stop|step|count|spacing|values))$/;

/** The form field an API issue path belongs to; 'axes' itself (the size refusal) is shown above the axes. */
export function planFormFieldFor(path: string) {
  return FORM_PATH.test(path) ? (path as `axes.${number}.start` | 'name') : undefined;
}
