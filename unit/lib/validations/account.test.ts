import { accountCreateSchema, accountUpdateSchema, invitationAcceptNewSchema, signInSchema } from '../../../src/lib/validations/account';

function pathsOf(result: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }): string[] {
  return result.success ? [] : (result.error?.issues ?? []).map((issue) => issue.path.join('.'));
}

describe('signInSchema', () => {
  it('accepts an address and password', () => {
    expect(signInSchema.parse({ email: 'Ines@Lab.test', password: 'x' })).toEqual({ email: 'ines@lab.test', password: 'x' });
  });
  it('refuses empty fields by name', () => {
    expect(pathsOf(signInSchema.safeParse({ email: '', password: '' })).sort()).toEqual(['email', 'password']);
  });
});

describe('new passwords', () => {
  const base = { email: 'new@lab.test', name: 'New Person', siteRole: 'member' };
  it('need at least 10 characters', () => {
    expect(pathsOf(accountCreateSchema.safeParse({ ...base, password: 'short' }))).toEqual(['password']);
    expect(accountCreateSchema.safeParse({ ...base, password: 'long enough' }).success).toBe(true);
  });
  it('refuse more than 72 bytes, which bcrypt would silently cut (bcrypt algorithm limit, common practice)', () => {
    expect(pathsOf(accountCreateSchema.safeParse({ ...base, password: 'é'.repeat(37) }))).toEqual(['password']);
    expect(accountCreateSchema.safeParse({ ...base, password: 'é'.repeat(36) }).success).toBe(true);
  });
  it('must match their confirmation when accepting an invitation', () => {
    expect(
      pathsOf(invitationAcceptNewSchema.safeParse({ name: 'A', password: 'abcdefghijk', confirmPassword: 'abcdefghijx' })),
    ).toEqual(['confirmPassword']);
  });
});

describe('accountUpdateSchema', () => {
  it('refuses an empty change and unknown roles', () => {
    expect(accountUpdateSchema.safeParse({}).success).toBe(false);
    expect(pathsOf(accountUpdateSchema.safeParse({ siteRole: 'root' }))).toEqual(['siteRole']);
  });
  it('accepts disabling', () => {
    expect(accountUpdateSchema.parse({ disabled: true })).toEqual({ disabled: true });
  });
});
