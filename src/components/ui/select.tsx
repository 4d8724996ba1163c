import type { ComponentProps, ReactNode } from 'react';
import { cn } from './cn';
import { controlClasses, FieldShell } from './field';

export interface SelectOption {
  value: string;
  label: string;
}

interface SelectProps extends Omit<ComponentProps<'select'>, 'children'> {
  options: readonly SelectOption[];
  invalid?: boolean;
}

/** A bare native select, for places where the label is supplied otherwise (table cells, aria-label). */
export function Select({ options, invalid = false, className, ...select }: SelectProps) {
  return (
    <select {...select} className={cn(controlClasses(invalid), 'h-9 pr-8', className)}>
      {options.map((option) => (
        <option key={option.value} value={option.value}>
          {option.label}
        </option>
      ))}
    </select>
  );
}

interface SelectFieldProps extends SelectProps {
  label: string;
  hint?: ReactNode;
  error?: string;
}

/** A labelled select with hint and error text, like TextField. */
export function SelectField({ label, hint, error, id, className, ...select }: SelectFieldProps) {
  return (
    <FieldShell label={label} hint={hint} error={error} id={id} className={className}>
      {(control) => <Select {...control} {...select} invalid={Boolean(error)} />}
    </FieldShell>
  );
}

/** Options built from a list of plain values, shown as they are (role names are lower-case words). */
export const optionsFrom = (values: readonly string[]): SelectOption[] => values.map((value) => ({ value, label: value }));
