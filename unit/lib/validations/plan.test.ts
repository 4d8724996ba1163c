import { planCreateSchema, planTransitionSchema, planUpdateSchema } from '../../../src/lib/validations/plan';

const axis = { quantity: 'tiltDeg', displayUnit: 'deg', mode: 'range', start: 0, stop: 90, step: 15 };
const plan = { name: 'Tilt sweep', setupId: 1, axes: [axis], minutesPerPoint: 2 };
const paths = (input: unknown, schema = planCreateSchema) => {
  const result = schema.safeParse(input);
  return result.success ? [] : result.error.issues.map((i) => i.path.join('.'));
};

describe('plan schema', () => {
  it('accepts a minimal draft and fills the defaults', () => {
    expect(planCreateSchema.parse(plan)).toMatchObject({ repeats: 1, referenceEvery: null, orderMode: 'as_listed', shuffleSeed: null, notes: '' });
  });

  it('gives a field path for every problem', () => {
    expect(paths({ ...plan, name: ' ', repeats: 0, minutesPerPoint: 0, referenceEvery: 1 })).toEqual(['name', 'repeats', 'referenceEvery', 'minutesPerPoint']);
    expect(paths({ ...plan, axes: [{ ...axis, step: 0 }] })).toEqual(['axes.0.step']);
    expect(paths({ ...plan, axes: [axis, { ...axis, step: 30 }] })).toEqual(['axes.1.quantity']);
    expect(paths({ ...plan, axes: [] })).toEqual(['axes']);
    expect(paths({ ...plan, orderMode: 'shuffled' })).toEqual(['shuffleSeed']);
    expect(paths({ ...plan, minutesPerPoint: 241 })).toEqual(['minutesPerPoint']);
  });

  it('refuses more than 5,000 points at axes', () => {
    const many = { quantity: 'distance', displayUnit: 'cm', mode: 'count', start: 0.05, stop: 0.5, count: 1000, spacing: 'linear' };
    const result = planCreateSchema.safeParse({ ...plan, axes: [axis, many] });
    expect(result.success).toBe(false);
    expect(result.error!.issues.map((i) => [i.path.join('.'), i.message])).toEqual([
      ['axes', 'This plan has 7,000 points (7 tilt values x 1,000 distance values); at most 5,000 are allowed. Use fewer values or repeats.'],
    ]);
  });

  it('an update needs something to change; a transition names a state', () => {
    expect(paths({}, planUpdateSchema as never)).toEqual(['']);
    expect(paths({ name: 'New' }, planUpdateSchema as never)).toEqual([]);
    expect(planTransitionSchema.safeParse({ to: 'on_bench' }).success).toBe(true);
    expect(planTransitionSchema.safeParse({ to: 'finished' }).success).toBe(false);
  });
});
