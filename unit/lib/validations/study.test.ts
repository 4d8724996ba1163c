import { invitationCreateSchema, memberRoleUpdateSchema, studyCreateSchema } from '../../../src/lib/validations/study';

function pathsOf(result: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }): string[] {
  return result.success ? [] : (result.error?.issues ?? []).map((issue) => issue.path.join('.'));
}

describe('studyCreateSchema', () => {
  it('accepts a study and trims its name', () => {
    const parsed = studyCreateSchema.parse({ name: '  Pad to probe  ', frequencyHz: 6.78e6 });
    expect(parsed).toEqual({ name: 'Pad to probe', summary: '', frequencyHz: 6.78e6 });
  });
  it('frequency is optional', () => {
    expect(studyCreateSchema.parse({ name: 'Pad' }).frequencyHz).toBeNull();
  });
  it.each([
    [{}, ['name']],
    [{ name: 'ab' }, ['name']],
    [{ name: 'x'.repeat(161) }, ['name']],
    [{ name: 'Pad', frequencyHz: Number.NaN }, ['frequencyHz']],
    [{ name: 'Pad', frequencyHz: Number.POSITIVE_INFINITY }, ['frequencyHz']],
    [{ name: 'Pad', frequencyHz: 0 }, ['frequencyHz']],
    [{ name: 'Pad', frequencyHz: 1e12 }, ['frequencyHz']],
    [{ name: 'Pad', frequencyHz: '6.78 MHz' }, ['frequencyHz']],
    [{ name: 42 }, ['name']],
  ])('refuses %j naming the field', (input, expectedPaths) => {
    expect(pathsOf(studyCreateSchema.safeParse(input))).toEqual(expectedPaths);
  });
});

describe('invitationCreateSchema', () => {
  it('normalises the address to lower case', () => {
    expect(invitationCreateSchema.parse({ email: ' New.Student@Example.org ', role: 'student' })).toEqual({
      email: 'new.student@example.org',
      role: 'student',
    });
  });
  it.each([
    [{ email: 'not-an-address', role: 'student' }, ['email']],
    [{ email: 'a@b.org', role: 'admin' }, ['role']],
    [{ email: 'a@b.org' }, ['role']],
    [{ role: 'student' }, ['email']],
  ])('refuses %j naming the field', (input, expectedPaths) => {
    expect(pathsOf(invitationCreateSchema.safeParse(input))).toEqual(expectedPaths);
  });
});

describe('memberRoleUpdateSchema', () => {
  it('takes only study roles', () => {
    expect(memberRoleUpdateSchema.safeParse({ role: 'supervisor' }).success).toBe(true);
    expect(pathsOf(memberRoleUpdateSchema.safeParse({ role: 'owner' }))).toEqual(['role']);
  });
});
