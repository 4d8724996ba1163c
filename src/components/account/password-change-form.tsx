'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { useApiSubmit } from '@/components/forms/use-api-submit';
import { Alert } from '@/components/ui/alert';
import { TextField } from '@/components/ui/field';
import { FormActions } from '@/components/ui/form-actions';
import { Panel } from '@/components/ui/panel';
import { ApiError, fetchJson } from '@/lib/client/fetch-json';
import type { PasswordChangeInput } from '@/lib/validations/account';
import { passwordChangedNotice, passwordFieldFor, passwordFormSchema, type PasswordFormInput, type PasswordFormOutput } from './password-form-schema';

const EMPTY: PasswordFormInput = { currentPassword: '', newPassword: '', confirmNewPassword: '' };
/** Heads the server's pause message, which speaks of sign-ins: say why it applies here too. */
const PAUSED_TITLE = 'Wrong current passwords count as failed sign-ins';

/**
 * The signed-in person changes their own password (POST /api/account/password). The server ends the
 * account's other sessions and keeps this one, so the page stays usable after the change.
 */
export function PasswordChangeForm() {
  const {
    register,
    handleSubmit,
    reset,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<PasswordFormInput, unknown, PasswordFormOutput>({ resolver: zodResolver(passwordFormSchema), defaultValues: EMPTY });

  const { formError, notice, run } = useApiSubmit(setError, passwordFieldFor);

  const [paused, setPaused] = useState(false);

  async function onSubmit({ currentPassword, newPassword }: PasswordFormOutput) {
    const body: PasswordChangeInput = { currentPassword, newPassword };
    setPaused(false);
    await run(async () => {
      try {
        const { otherSessionsEnded } = await fetchJson<{ otherSessionsEnded: number }>('/api/account/password', { method: 'POST', body });
        reset(EMPTY);
        return passwordChangedNotice(otherSessionsEnded);
      } catch (error) {
        if (error instanceof ApiError && error.status === 429) setPaused(true);
        throw error;
      }
    });
  }

  return (
    <Panel title="Change password" description="Changing it signs you out everywhere else; this session stays signed in.">
      <form onSubmit={handleSubmit(onSubmit)} noValidate className="max-w-md space-y-4">
        {formError && (
          <Alert tone="error" title={paused ? PAUSED_TITLE : undefined}>
            {formError}
          </Alert>
        )}
        {notice && <Alert tone="success">{notice}</Alert>}
        <TextField
          label="Current password"
          type="password"
          autoComplete="current-password"
          error={errors.currentPassword?.message}
          {...register('currentPassword')}
        />
        <TextField
          label="New password"
          type="password"
          autoComplete="new-password"
          hint="At least 10 characters."
          error={errors.newPassword?.message}
          {...register('newPassword')}
        />
        <TextField
          label="Repeat new password"
          type="password"
          autoComplete="new-password"
          error={errors.confirmNewPassword?.message}
          {...register('confirmNewPassword')}
        />
        <FormActions submitLabel={isSubmitting ? 'Changing…' : 'Change password'} busy={isSubmitting} />
      </form>
    </Panel>
  );
}
