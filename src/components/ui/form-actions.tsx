import type { ReactNode } from 'react';
import { Button } from './button';

interface FormActionsProps {
  /** The submit button's text (already switched to "Saving…" by the caller if it wants that). */
  submitLabel: ReactNode;
  /** True while the form is submitting: both buttons wait. */
  busy: boolean;
  /** Extra reason to hold the submit back (e.g. a plan over the point limit). */
  submitDisabled?: boolean;
  /** Shows a Cancel button when given. */
  onCancel?: () => void;
}

/** The row under a form: the primary submit button and, where the form can be closed, Cancel. */
export function FormActions({ submitLabel, busy, submitDisabled = false, onCancel }: FormActionsProps) {
  return (
    <div className="flex gap-3">
      <Button type="submit" variant="primary" disabled={busy || submitDisabled}>
        {submitLabel}
      </Button>
      {onCancel && (
        <Button onClick={onCancel} disabled={busy}>
          Cancel
        </Button>
      )}
    </div>
  );
}
