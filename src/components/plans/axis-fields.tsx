'use client';

import type { FieldErrors, UseFormRegister } from 'react-hook-form';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { SelectField } from '@/components/ui/select';
import { AXIS_INFO } from './axis-units';
import type { AxisFormValues, PlanFormValues } from './plan-form-values';
import { AXIS_QUANTITIES } from './plan-types';

const QUANTITY_OPTIONS = AXIS_QUANTITIES.map((q) => ({ value: q, label: AXIS_INFO[q].label }));
const MODE_OPTIONS = [
  { value: 'range', label: 'start, stop and step' },
  { value: 'count', label: 'start, stop and count' },
  { value: 'list', label: 'a list of values' },
];
const SPACING_OPTIONS = [
  { value: 'linear', label: 'linear' },
  { value: 'log', label: 'logarithmic' },
];

interface AxisFieldsProps {
  index: number;
  axis: AxisFormValues;
  register: UseFormRegister<PlanFormValues>;
  errors: FieldErrors<PlanFormValues>;
  onRemove?: () => void;
  /** a new quantity brings its own example values (tilt in degrees, not centimetres) */
  onQuantityChange: (quantity: AxisFormValues['quantity']) => void;
}

/** One axis of the sweep: what it moves, how its values are given, the values typed with their units. */
export function AxisFields({ index, axis, register, errors, onRemove, onQuantityChange }: AxisFieldsProps) {
  const e = errors.axes?.[index];
  const example = AXIS_INFO[axis.quantity].example;
  const name = (field: keyof AxisFormValues) => `axes.${index}.${field}` as const;
  return (
    <fieldset className="rounded-md border border-ink-200 p-4" aria-label={`Axis ${index + 1}`}>
      <legend className="px-1 text-sm font-semibold text-ink-900">Axis {index + 1}</legend>
      <div className="grid gap-4 sm:grid-cols-4">
        <SelectField
          label="Quantity"
          options={QUANTITY_OPTIONS}
          error={e?.quantity?.message}
          {...register(name('quantity'), { onChange: (event) => onQuantityChange(event.target.value) })}
        />
        <SelectField label="Values given as" options={MODE_OPTIONS} error={e?.mode?.message} {...register(name('mode'))} />
        {axis.mode === 'list' ? (
          <TextField
            label="Values"
            className="sm:col-span-2"
            hint={`Separated by commas, e.g. ${example}, …`}
            autoComplete="off"
            spellCheck={false}
            error={e?.values?.message}
            {...register(name('values'))}
          />
        ) : (
          <>
            <TextField label="Start" hint={`e.g. ${example}`} autoComplete="off" spellCheck={false} error={e?.start?.message} {...register(name('start'))} />
            <TextField label="Stop" autoComplete="off" spellCheck={false} error={e?.stop?.message} {...register(name('stop'))} />
            {axis.mode === 'range' ? (
              <TextField label="Step" autoComplete="off" spellCheck={false} error={e?.step?.message} {...register(name('step'))} />
            ) : (
              <>
                <TextField label="Count" inputMode="numeric" error={e?.count?.message} {...register(name('count'))} />
                <SelectField label="Spacing" options={SPACING_OPTIONS} error={e?.spacing?.message} {...register(name('spacing'))} />
              </>
            )}
          </>
        )}
      </div>
      {onRemove && (
        <div className="mt-3">
          <Button size="sm" variant="ghost" onClick={onRemove}>
            Remove axis {index + 1}
          </Button>
        </div>
      )}
    </fieldset>
  );
}
