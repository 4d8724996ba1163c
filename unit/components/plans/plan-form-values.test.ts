import { planFormSchema } from '@/components/plans/plan-form-schema';
import { emptyPlanForm, NEW_AXIS, planToFormValues, readPlanForm, type PlanFormValues } from '@/components/plans/plan-form-values';
import type { Plan } from '@/components/plans/plan-types';

const twoAxes = (): PlanFormValues => ({
  ...emptyPlanForm('3'),
  name: 'Tilt x distance',
  axes: [
    { ...NEW_AXIS.tiltDeg, start: '0 deg', stop: '90 deg', step: '30 deg' },
    { ...NEW_AXIS.distance, start: '5 cm', stop: '15 cm', step: '5 cm' },
  ],
});

describe('the plan designer form', () => {
  test('typed values become the SI request body with the units they were typed in', () => {
    const { input, issues, pointCount } = readPlanForm(twoAxes());
    expect(issues).toEqual([]);
    expect(pointCount).toBe(12); // 4 tilts x 3 distances
    expect(input?.axes).toEqual([
      { quantity: 'tiltDeg', displayUnit: 'deg', mode: 'range', start: 0, stop: 90, step: 30 },
      { quantity: 'distance', displayUnit: 'cm', mode: 'range', start: 0.05, stop: 0.15, step: 0.05 },
    ]);
    expect(input).toMatchObject({ name: 'Tilt x distance', setupId: 3, repeats: 1, referenceEvery: null, orderMode: 'as_listed', shuffleSeed: null, minutesPerPoint: 2 });
  });

  test('repeats and reference points count as the server counts them', () => {
    // 12 poses x 2 repeats = 24 measurements; a reference after every 5th, never last: 4 more.
    expect(readPlanForm({ ...twoAxes(), repeats: '2', referenceEvery: '5' }).pointCount).toBe(28);
  });

  test('a list and a log-spaced count', () => {
    const form = { ...twoAxes(), axes: [{ ...NEW_AXIS.frequencyHz, mode: 'list' as const, values: '6.78 MHz, 13.56 MHz' }, { ...NEW_AXIS.loadResistance }] };
    const { input, pointCount } = readPlanForm(form);
    expect(input?.axes[0]).toEqual({ quantity: 'frequencyHz', displayUnit: 'MHz', mode: 'list', values: [6.78e6, 13.56e6] });
    expect(input?.axes[1]).toEqual({ quantity: 'loadResistance', displayUnit: 'ohm', mode: 'count', start: 1, stop: 1000, count: 7, spacing: 'log' });
    expect(pointCount).toBe(14);
  });

  test('more than 5,000 points is refused at axes before anything is sent', () => {
    const form = { ...twoAxes(), axes: [{ ...NEW_AXIS.distance, start: '0 mm', stop: '100 mm', step: '1 mm' }, { ...NEW_AXIS.tiltDeg, start: '0 deg', stop: '90 deg', step: '1 deg' }] };
    const { input, issues, pointCount } = readPlanForm(form);
    expect(pointCount).toBe(101 * 91);
    expect(input).toBeNull();
    expect(issues.find((i) => i.path === 'axes')?.message).toMatch(/at most 5,000/);
  });

  test('problems are put on the field they concern', () => {
    const form = { ...twoAxes(), name: ' ', setupId: '', repeats: '0' };
    form.axes[1] = { ...form.axes[1], step: '5 kg' };
    const paths = readPlanForm(form).issues.map((i) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['name', 'setupId', 'repeats', 'axes.1.step']));
  });

  test('a stored plan reads back into the form in its display units', () => {
    const { input } = readPlanForm({ ...twoAxes(), orderMode: 'shuffled', shuffleSeed: '424242' });
    const plan = { ...input!, id: 1, studyId: 1, state: 'draft', pointCount: 12, estimatedMinutes: 24 } as unknown as Plan;
    const form = planToFormValues(plan);
    expect(form.axes[1]).toMatchObject({ start: '5 cm', stop: '15 cm', step: '5 cm' });
    expect(form.shuffleSeed).toBe('424242');
    expect(readPlanForm(form).input).toEqual(input);
  });
});

describe('the designer schema', () => {
  test('a good form parses to the body the server takes', () => {
    const parsed = planFormSchema.safeParse(twoAxes());
    expect(parsed.success && parsed.data.axes).toHaveLength(2);
  });

  test("the server's own limits come back on the field they name", () => {
    const parsed = planFormSchema.safeParse({ ...twoAxes(), repeats: '25' });
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues.map((i) => i.path.join('.'))).toContain('repeats');
  });
});
