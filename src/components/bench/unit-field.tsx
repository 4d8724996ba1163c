'use client';

import { useEffect, useState } from 'react';
import { TextField } from '@/components/ui/field';
import { formatQuantity, parseQuantity, type QuantityKind } from '@/lib/units';

interface UnitFieldProps {
  label: string;
  kind: QuantityKind;
  /** SI value; null means "not set" (allowed only when `optional`) */
  value: number | null;
  onCommit: (value: number | null) => void;
  /** unit of a bare number, e.g. "V" */
  defaultUnit?: string;
  optional?: boolean;
  /** further check of a parsed value; returns a message or null */
  check?: (value: number) => string | null;
  hint?: string;
  placeholder?: string;
}

/**
 * A quantity typed with its unit ("6.78 MHz", "0.5 ohm", "470 pF"), applied on Enter or when the field
 * is left, then shown back normalised. Parsing and formatting are src/lib/units, as in every form.
 */
export function UnitField({ label, kind, value, onCommit, defaultUnit, optional = false, check, hint, placeholder }: UnitFieldProps) {
  const shown = value === null ? '' : formatQuantity(value, kind);
  const [draft, setDraft] = useState(shown);
  const [error, setError] = useState<string | undefined>();
  useEffect(() => setDraft(shown), [shown]);

  const commit = () => {
    const parsed = parseQuantity(draft, kind, { field: label, defaultUnit, required: !optional });
    if (!parsed.ok) return setError(parsed.message);
    const problem = parsed.value === null ? null : check?.(parsed.value) ?? null;
    if (problem) return setError(`${label}: ${problem}`);
    setError(undefined);
    onCommit(parsed.value);
    setDraft(parsed.value === null ? '' : formatQuantity(parsed.value, kind));
  };

  return (
    <TextField
      label={label}
      value={draft}
      hint={hint}
      error={error}
      placeholder={placeholder}
      autoComplete="off"
      spellCheck={false}
      onChange={(e) => setDraft(e.target.value)}
      onBlur={commit}
      onKeyDown={(e) => {
        if (e.key === 'Enter') {
          e.preventDefault();
          commit();
        }
      }}
      className="[&_input]:font-mono [&_input]:tabular-nums"
    />
  );
}
