'use client';

import { useState } from 'react';
import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { applyServerErrors } from './apply-server-errors';

/**
 * The submit half every API form shares: clears the previous outcome, runs the request, and on
 * failure puts field issues beside their fields (applyServerErrors) and keeps the top-of-form message.
 * `action` may return a confirmation to show (e.g. "Invitation saved; the e-mail to ... is on its way."), or nothing.
 */
export function useApiSubmit<T extends FieldValues>(setError: UseFormSetError<T>, fieldFor: (path: string) => Path<T> | undefined) {
  const [formError, setFormError] = useState<string | null>(null);
  const [notice, setNotice] = useState<string | null>(null);

  async function run(action: () => Promise<string | void>): Promise<void> {
    setFormError(null);
    setNotice(null);
    try {
      const confirmation = await action();
      if (confirmation) setNotice(confirmation);
    } catch (error) {
      setFormError(applyServerErrors(error, setError, fieldFor));
    }
  }

  return { formError, notice, run };
}
