import { z } from 'zod';
import { passwordChangeSchema } from '@/lib/validations/account';

/**
 * The change-password form: the server's passwordChangeSchema (its rules and messages, including
 * "different from the current one") plus the repeated new password, which only the browser checks:
 * a typo in a field nobody can see would otherwise lock the person out on their next sign-in.
 */
export const passwordFormSchema = passwordChangeSchema
  .safeExtend({ confirmNewPassword: z.string({ error: 'Repeat the new password.' }) })
  .refine((value) => value.newPassword === value.confirmNewPassword, {
    path: ['confirmNewPassword'],
    message: 'The new passwords do not match.',
  });

export type PasswordFormInput = z.input<typeof passwordFormSchema>;
export type PasswordFormOutput = z.output<typeof passwordFormSchema>;

/** The server names `currentPassword` and `newPassword`; the repeat never leaves the browser. */
export function passwordFieldFor(path: string): 'currentPassword' | 'newPassword' | undefined {
  return path === 'currentPassword' || path === 'newPassword' ? path : undefined;
}

/** The confirmation after a change: the server says how many other sessions it ended. */
export function passwordChangedNotice(otherSessionsEnded: number): string {
  if (otherSessionsEnded === 0) return 'Password changed. You were not signed in anywhere else; this session stays signed in.';
  const ended = otherSessionsEnded === 1 ? '1 other signed-in session was' : `${otherSessionsEnded} other signed-in sessions were`;
  return `Password changed. ${ended} signed out; this one stays signed in.`;
}
