import { useId, type ComponentProps, type ReactNode } from 'react';
import { cn } from './cn';

export const controlClasses = (invalid: boolean) =>
  cn(
    'block w-full rounded-md border bg-white px-3 text-sm text-ink-900 shadow-xs placeholder:text-ink-400',
    'disabled:bg-ink-50 disabled:text-ink-500',
    invalid ? 'border-danger-500' : 'border-ink-300 hover:border-ink-400',
  );

interface FieldShellProps {
  label: string;
  hint?: ReactNode;
  error?: string;
  id?: string;
  className?: string;
  /** Renders the control with the ids it must carry so label, hint and error are linked to it. */
  children: (control: { id: string; 'aria-describedby'?: string; 'aria-invalid'?: true }) => ReactNode;
}

/**
 * Label above, control, then hint and error below. The hint and the error are tied to the control
 * with aria-describedby, so a screen reader reads them when the control gets focus.
 */
export function FieldShell({ label, hint, error, id, className, children }: FieldShellProps) {
  const generatedId = useId();
  const controlId = id ?? generatedId;
  const hintId = hint ? `${controlId}-hint` : undefined;
  const errorId = error ? `${controlId}-error` : undefined;
  const describedBy = [hintId, errorId].filter(Boolean).join(' ') || undefined;

  return (
    <div className={cn('space-y-1.5', className)}>
      <label htmlFor={controlId} className="block text-sm font-medium text-ink-800">
        {label}
      </label>
      {children({ id: controlId, 'aria-describedby': describedBy, 'aria-invalid': error ? true : undefined })}
      {hint && (
        <p id={hintId} className="text-xs text-ink-500">
          {hint}
        </p>
      )}
      {error && (
        <p id={errorId} role="alert" className="text-xs font-medium text-danger-700">
          {error}
        </p>
      )}
    </div>
  );
}

interface TextFieldProps extends Omit<ComponentProps<'input'>, 'children'> {
  label: string;
  hint?: ReactNode;
  error?: string;
}

export function TextField({ label, hint, error, id, className, ...input }: TextFieldProps) {
  return (
    <FieldShell label={label} hint={hint} error={error} id={id} className={className}>
      {(control) => <input {...control} {...input} className={cn(controlClasses(Boolean(error)), 'h-9')} />}
    </FieldShell>
  );
}

interface TextAreaFieldProps extends Omit<ComponentProps<'textarea'>, 'children'> {
  label: string;
  hint?: ReactNode;
  error?: string;
}

export function TextAreaField({ label, hint, error, id, className, rows = 3, ...textarea }: TextAreaFieldProps) {
  return (
    <FieldShell label={label} hint={hint} error={error} id={id} className={className}>
      {(control) => <textarea {...control} rows={rows} {...textarea} className={cn(controlClasses(Boolean(error)), 'py-2')} />}
    </FieldShell>
  );
}
