'use server';

import { redirect } from 'next/navigation';
import { requireUser } from '@/lib/auth/session';
import { acceptInvitationAsUser, acceptInvitationWithNewAccount } from '@/lib/data/invitations';
import { HttpError } from '@/lib/http/errors';
import { invitationAcceptNewSchema } from '@/lib/validations/account';

export interface NewAccountState {
  message?: string;
  fieldErrors?: Partial<Record<'name' | 'password' | 'confirmPassword', string>>;
  /** The name as typed, so it survives a failed attempt (passwords are never sent back). */
  name?: string;
}

export interface JoinState {
  message?: string;
}

const SOMETHING_WENT_WRONG = 'Something went wrong on our side. Try again in a moment.';

/**
 * Most of a typed name sent back into the form after a failed attempt [characters]. A name has at
 * most 120; text far longer was pasted or scripted, and sending all of it back would answer a
 * request of any size with a state as large.
 */
const NAME_ECHO_LIMIT = 1000;
const echoName = (name: string) => name.slice(0, NAME_ECHO_LIMIT);

// A server action takes its arguments as the client sent them, so the form may be anything: what is
// not a FormData counts as an empty form, and a file where text belongs as an empty field.
const text = (formData: unknown, key: string) => {
  const value = formData instanceof FormData ? formData.get(key) : null;
  return typeof value === 'string' ? value : '';
};

/** Why a write failed, for the form: domain errors carry a message for the user, anything else does not. */
function failureMessage(error: unknown): string {
  if (error instanceof HttpError) return error.message;
  console.error('Accepting an invitation failed', error);
  return SOMETHING_WENT_WRONG;
}

/**
 * Accepts an invitation as a new person: the token is the credential, so no sign-in is needed.
 * Creates the account and the membership together, then sends the person to sign in.
 */
export async function acceptWithNewAccount(token: string, _previous: NewAccountState, formData: FormData): Promise<NewAccountState> {
  const raw = { name: text(formData, 'name'), password: text(formData, 'password'), confirmPassword: text(formData, 'confirmPassword') };
  const parsed = invitationAcceptNewSchema.safeParse(raw);
  if (!parsed.success) {
    const fieldErrors: NewAccountState['fieldErrors'] = {};
    for (const issue of parsed.error.issues) {
      const field = issue.path[0];
      if ((field === 'name' || field === 'password' || field === 'confirmPassword') && !fieldErrors[field]) fieldErrors[field] = issue.message;
    }
    return { fieldErrors, name: echoName(raw.name) };
  }

  let joined: { studyId: number; email: string };
  try {
    joined = await acceptInvitationWithNewAccount(token, { name: parsed.data.name, password: parsed.data.password });
  } catch (error) {
    return { message: failureMessage(error), name: echoName(raw.name) };
  }
  redirect(`/signin?joined=1&email=${encodeURIComponent(joined.email)}&callbackUrl=${encodeURIComponent(`/studies/${joined.studyId}`)}`);
}

/** Accepts an invitation as the signed-in owner of the invited address, then opens the study. */
export async function joinAsSignedInUser(token: string, _previous: JoinState, _formData: FormData): Promise<JoinState> {
  let studyId: number;
  try {
    const user = await requireUser();
    ({ studyId } = await acceptInvitationAsUser(user, token));
  } catch (error) {
    return { message: failureMessage(error) };
  }
  redirect(`/studies/${studyId}`);
}
