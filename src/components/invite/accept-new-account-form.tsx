'use client';

import { useActionState } from 'react';
import type { NewAccountState } from '@/app/invite/[token]/actions';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';

type Action = (state: NewAccountState, formData: FormData) => Promise<NewAccountState>;

/** Name and password for a new account made from an invitation. `action` is the server action with the token bound. */
export function AcceptNewAccountForm({ action, email }: { action: Action; email: string }) {
  const [state, formAction, pending] = useActionState(action, {});
  const errors = state.fieldErrors ?? {};

  return (
    <form action={formAction} noValidate className="space-y-4">
      {state.message && <Alert tone="error">{state.message}</Alert>}
      <p className="text-sm text-ink-600">
        Your account will use <span className="font-medium text-ink-900">{email}</span>.
      </p>
      <TextField label="Name" name="name" autoComplete="name" defaultValue={state.name} error={errors.name} required />
      <TextField
        label="Password"
        name="password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters."
        error={errors.password}
        required
      />
      <TextField label="Repeat password" name="confirmPassword" type="password" autoComplete="new-password" error={errors.confirmPassword} required />
      <Button type="submit" variant="primary" className="w-full" disabled={pending}>
        Create account and join
      </Button>
    </form>
  );
}
