import { z } from 'zod';
import { SITE_ROLES } from '../auth/permissions';
import { emailSchema, newPasswordSchema, personNameSchema } from './common';

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string({ error: 'Enter your password.' }).min(1, 'Enter your password.').max(200, 'That password is too long.'),
});

export const siteRoleSchema = z.enum(SITE_ROLES, { error: 'Choose admin, researcher or member.' });

/** An admin creating an account. */
export const accountCreateSchema = z.object({
  email: emailSchema,
  name: personNameSchema,
  siteRole: siteRoleSchema,
  password: newPasswordSchema,
});
export type AccountCreateInput = z.input<typeof accountCreateSchema>;

/** An admin changing an account: any subset of these. */
export const accountUpdateSchema = z
  .object({
    name: personNameSchema.optional(),
    siteRole: siteRoleSchema.optional(),
    disabled: z.boolean({ error: 'Expected true or false.' }).optional(),
  })
  .refine((value) => Object.keys(value).length > 0, { message: 'Nothing to change.' });

/** Accepting an invitation as a new account: choose a name and a password. */
export const invitationAcceptNewSchema = z
  .object({
    name: personNameSchema,
    password: newPasswordSchema,
    confirmPassword: z.string({ error: 'Repeat the password.' }),
  })
  .refine((value) => value.password === value.confirmPassword, {
    path: ['confirmPassword'],
    message: 'The passwords do not match.',
  });
export type InvitationAcceptNewInput = z.input<typeof invitationAcceptNewSchema>;

/** The signed-in person changing their own password. */
export const passwordChangeSchema = z
  .object({
    currentPassword: z.string({ error: 'Enter your current password.' }).min(1, 'Enter your current password.').max(200, 'That password is too long.'),
    newPassword: newPasswordSchema,
  })
  .refine((value) => value.newPassword !== value.currentPassword, {
    path: ['newPassword'],
    message: 'Choose a password different from the current one.',
  });
export type PasswordChangeInput = z.input<typeof passwordChangeSchema>;
