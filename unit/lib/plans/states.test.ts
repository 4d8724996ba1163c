import { allowedTransitions, findTransition, PLAN_TRANSITIONS } from '../../../src/lib/plans/states';
import type { Actor } from '../../../src/lib/auth/permissions';

const member = (studyRole: Actor['studyRole']): Actor => ({ siteRole: 'member', studyRole });
const admin: Actor = { siteRole: 'admin', studyRole: null };
const steps = (actor: Actor, state: Parameters<typeof allowedTransitions>[1]) => allowedTransitions(actor, state).map((t) => t.to);

describe('plan states (PRODUCT.md)', () => {
  it('allows only the four steps of the product', () => {
    expect(PLAN_TRANSITIONS.map((t) => `${t.from}->${t.to}`)).toEqual(['draft->on_bench', 'on_bench->in_review', 'in_review->accepted', 'in_review->on_bench']);
    expect(findTransition('draft', 'accepted')).toBeNull();
    expect(findTransition('accepted', 'on_bench')).toBeNull();
    expect(findTransition('on_bench', 'draft')).toBeNull();
  });

  it('researcher and admin open a draft for the bench; nobody else does', () => {
    expect(steps(member('researcher'), 'draft')).toEqual(['on_bench']);
    expect(steps(admin, 'draft')).toEqual(['on_bench']);
    expect(steps(member('student'), 'draft')).toEqual([]);
    expect(steps(member('supervisor'), 'draft')).toEqual([]);
  });

  it('student and researcher send for review; only the supervisor accepts or returns', () => {
    expect(steps(member('student'), 'on_bench')).toEqual(['in_review']);
    expect(steps(member('researcher'), 'on_bench')).toEqual(['in_review']);
    expect(steps(member('supervisor'), 'on_bench')).toEqual([]);
    expect(steps(member('supervisor'), 'in_review')).toEqual(['accepted', 'on_bench']);
    for (const actor of [member('researcher'), member('student'), admin]) expect(steps(actor, 'in_review')).toEqual([]);
    expect(steps(member('supervisor'), 'accepted')).toEqual([]);
  });
});
