'use client';

import { useEffect, useId, useRef, useState } from 'react';
import { cn } from '@/components/ui/cn';
import { controlClasses } from '@/components/ui/field';
import { formatInputNumber } from './format-quantity';

interface NumberSliderFieldProps {
  label: string;
  unit: string;
  /** current value in the field's unit (cm, degrees) */
  value: number;
  /** the slider's range; typed values may go past it within [hardMin, hardMax] */
  min: number;
  max: number;
  step: number;
  hardMin: number;
  hardMax: number;
  decimals: number;
  onChange: (value: number) => void;
  /** true while the slider's thumb is held */
  onSlideActive: (active: boolean) => void;
}

/**
 * A typed number and a slider for one placement quantity, always showing the same value. Typing
 * applies as soon as the text is a number in range; the text is left alone while it has focus.
 */
export function NumberSliderField({ label, unit, value, min, max, step, hardMin, hardMax, decimals, onChange, onSlideActive }: NumberSliderFieldProps) {
  const id = useId();
  const [draft, setDraft] = useState(formatInputNumber(value, decimals));
  const [error, setError] = useState<string | null>(null);
  const focused = useRef(false);
  const sliding = useRef(false);

  useEffect(() => {
    if (!focused.current) {
      setDraft(formatInputNumber(value, decimals));
      setError(null);
    }
  }, [value, decimals]);

  const typed = (text: string) => {
    setDraft(text);
    const v = text.trim() === '' ? NaN : Number(text);
    if (!Number.isFinite(v)) return setError(`Enter a number of ${unit}.`);
    if (v < hardMin || v > hardMax) return setError(`Use ${hardMin} to ${hardMax} ${unit}.`);
    setError(null);
    onChange(v);
  };

  const slide = (active: boolean) => {
    if (sliding.current === active) return;
    sliding.current = active;
    onSlideActive(active);
  };

  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block text-sm font-medium text-ink-800">
        {label} <span className="font-normal text-ink-500">({unit})</span>
      </label>
      <div className="flex items-center gap-3">
        <input
          type="range"
          aria-label={`${label} slider (${unit})`}
          min={min}
          max={max}
          step={step}
          value={Math.min(max, Math.max(min, value))}
          onPointerDown={() => slide(true)}
          onPointerUp={() => slide(false)}
          onPointerCancel={() => slide(false)}
          onBlur={() => slide(false)}
          onChange={(e) => onChange(Number(e.target.value))}
          className="block min-w-0 flex-1 accent-flux-600"
        />
        <div className="w-24 shrink-0">
        <input
          id={id}
          type="number"
          step="any"
          inputMode="decimal"
          value={draft}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${id}-error` : undefined}
          onFocus={() => (focused.current = true)}
          onBlur={() => {
            focused.current = false;
            setDraft(formatInputNumber(value, decimals));
            setError(null);
          }}
          onChange={(e) => typed(e.target.value)}
          className={cn(controlClasses(Boolean(error)), 'h-8 px-2 text-right font-mono tabular-nums')}
        />
        </div>
      </div>
      {error && (
        <p id={`${id}-error`} role="alert" className="text-xs font-medium text-danger-700">
          {error}
        </p>
      )}
    </div>
  );
}
