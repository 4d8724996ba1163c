/**
 * The change-password form's schema (src/components/account/password-form-schema.ts): the server's own
 * rules still apply in the browser, the repeated password is checked there and named as its field,
 * and the notice counts the sessions the change ended.
 */
import { passwordChangedNotice, passwordFieldFor, passwordFormSchema } from '../../../src/components/account/password-form-schema';

const NEW = 'a-long-new-passphrase-2026';

const issuesOf = (value: unknown) => {
  const parsed = passwordFormSchema.safeParse(value);
  return parsed.success ? [] : parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
};

describe('passwordFormSchema', () => {
  test('accepts a matching repeat of a new password that differs from the current one', () => {
    expect(issuesOf({ currentPassword: 'old-passphrase-2026', newPassword: NEW, confirmNewPassword: NEW })).toEqual([]);
  });

  test('a repeat that differs is an error on confirmNewPassword', () => {
    expect(issuesOf({ currentPassword: 'old-passphrase-2026', newPassword: NEW, confirmNewPassword: `${NEW}x` }))
      .toEqual([{ path: 'confirmNewPassword', message: 'The new passwords do not match.' }]);
  });

  test('keeps the server\'s rule that the new password differs from the current one', () => {
    expect(issuesOf({ currentPassword: NEW, newPassword: NEW, confirmNewPassword: NEW }).map((i) => i.path)).toContain('newPassword');
  });

  test('keeps the server\'s length rule for the new password', () => {
    expect(issuesOf({ currentPassword: 'old-passphrase-2026', newPassword: 'short', confirmNewPassword: 'short' }).map((i) => i.path)).toContain('newPassword');
  });
});

describe('passwordFieldFor', () => {
  test('maps the two fields the server names and nothing else', () => {
    expect(passwordFieldFor('currentPassword')).toBe('currentPassword');
    expect(passwordFieldFor('newPassword')).toBe('newPassword');
    expect(passwordFieldFor('confirmNewPassword')).toBeUndefined();
    expect(passwordFieldFor('(body)')).toBeUndefined();
  });
});

describe('passwordChangedNotice', () => {
  test.each([
    [0, /not signed in anywhere else/],
    [1, /1 other signed-in session was signed out/],
    [3, /3 other signed-in sessions were signed out/],
  ])('with %i other session(s) ended', (count, wording) => {
    expect(passwordChangedNotice(count)).toMatch(wording);
  });
});
