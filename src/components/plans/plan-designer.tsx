'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useFieldArray, useForm } from 'react-hook-form';
import { useSWRConfig } from 'swr';
import { useApiSubmit } from '@/components/forms/use-api-submit';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { FormActions } from '@/components/ui/form-actions';
import { TextAreaField, TextField } from '@/components/ui/field';
import { Panel } from '@/components/ui/panel';
import { SelectField } from '@/components/ui/select';
import { plansKey } from '@/hooks/use-plans';
import { useStudySetups } from '@/hooks/use-study-setups';
import { ApiError, fetchJson } from '@/lib/client/fetch-json';
import type { Setup } from '@/lib/data/setups';
import { AxisFields } from './axis-fields';
import { formatBenchTime } from './plan-count';
import { planFormFieldFor, planFormSchema } from './plan-form-schema';
import { emptyPlanForm, NEW_AXIS, newSeed, planToFormValues, readPlanForm, type PlanFormValues } from './plan-form-values';
import { AXIS_QUANTITIES, MAX_PLAN_POINTS, ORDER_LABEL, ORDER_MODES, type Plan, type PlanInput } from './plan-types';

const ORDER_OPTIONS = ORDER_MODES.map((mode) => ({ value: mode, label: ORDER_LABEL[mode] }));
/** Up to three axes: more would make a plan no bench can work through. */
const MAX_AXES = 3;

interface PlanDesignerProps {
  studyId: number;
  initialSetups: Setup[];
  /** the draft being edited; a new plan when absent */
  plan?: Plan;
  onSaved?: (plan: Plan) => void;
  onCancel?: () => void;
}

/** Creates or edits a draft plan, with the point count and bench time shown live before saving. */
export function PlanDesigner({ studyId, initialSetups, plan, onSaved, onCancel }: PlanDesignerProps) {
  const router = useRouter();
  const { mutate } = useSWRConfig();
  const { setups } = useStudySetups(studyId, initialSetups);
  const {
    register,
    control,
    handleSubmit,
    setError,
    setValue,
    watch,
    formState: { errors, isSubmitting },
  } = useForm<PlanFormValues, unknown, PlanInput>({
    resolver: zodResolver(planFormSchema),
    defaultValues: plan ? planToFormValues(plan) : emptyPlanForm(initialSetups[0] ? String(initialSetups[0].id) : ''),
  });
  const { fields, append, remove } = useFieldArray({ control, name: 'axes' });
  const { formError, run } = useApiSubmit(setError, planFormFieldFor);
  const [sizeRefusal, setSizeRefusal] = useState<string | null>(null);
  const values = watch();
  const live = readPlanForm(values);
  const minutes = Number(values.minutesPerPoint);
  const tooMany = live.pointCount > MAX_PLAN_POINTS;
  const setupOptions = [{ value: '', label: 'Choose a setup' }, ...(setups ?? []).map((s) => ({ value: String(s.id), label: s.name }))];
  const unusedQuantity = AXIS_QUANTITIES.find((q) => !values.axes.some((a) => a.quantity === q));

  async function onSubmit(body: PlanInput) {
    setSizeRefusal(null);
    const url = plan ? `/api/studies/${studyId}/plans/${plan.id}` : `/api/studies/${studyId}/plans`;
    await run(async () => {
      try {
        const { plan: saved } = await fetchJson<{ plan: Plan }>(url, { method: plan ? 'PATCH' : 'POST', body });
        await mutate(plansKey(studyId));
        if (onSaved) onSaved(saved);
        else router.push(`/studies/${studyId}/plans/${saved.id}`);
      } catch (error) {
        // The server's refusal of an oversized plan names 'axes' as a whole, not one field.
        if (error instanceof ApiError) setSizeRefusal(error.issues.find((issue) => issue.path === 'axes')?.message ?? null);
        throw error;
      }
    });
  }

  return (
    <Panel title={plan ? `Edit “${plan.name}”` : 'New plan'} description="Type values with their units: 5 cm, 90 deg, 6.78 MHz, 50 ohm.">
      <form onSubmit={handleSubmit(onSubmit)} noValidate className="space-y-5" aria-label={plan ? 'Edit plan' : 'New plan'}>
        {formError && <Alert tone="error">{formError}</Alert>}
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField label="Name" autoFocus error={errors.name?.message} {...register('name')} />
          <SelectField label="Setup" options={setupOptions} error={errors.setupId?.message} {...register('setupId')} />
        </div>

        <div className="space-y-3">
          {fields.map((field, index) => (
            <AxisFields
              key={field.id}
              index={index}
              axis={values.axes[index] ?? field}
              register={register}
              errors={errors}
              onRemove={fields.length > 1 ? () => remove(index) : undefined}
              onQuantityChange={(quantity) => setValue(`axes.${index}`, { ...NEW_AXIS[quantity] })}
            />
          ))}
          {fields.length < MAX_AXES && unusedQuantity && (
            <Button size="sm" onClick={() => append({ ...NEW_AXIS[unusedQuantity] })}>
              Add axis
            </Button>
          )}
        </div>

        <fieldset className="grid gap-4 sm:grid-cols-4">
          <legend className="mb-2 text-sm font-semibold text-ink-900">Order and repeats</legend>
          <TextField label="Repeats" inputMode="numeric" hint="Times each point is measured" error={errors.repeats?.message} {...register('repeats')} />
          <TextField label="Reference every" inputMode="numeric" hint="Points between drift checks; empty for none" error={errors.referenceEvery?.message} {...register('referenceEvery')} />
          <SelectField label="Order" options={ORDER_OPTIONS} error={errors.orderMode?.message} {...register('orderMode')} />
          <TextField label="Minutes per point" inputMode="decimal" error={errors.minutesPerPoint?.message} {...register('minutesPerPoint')} />
          {values.orderMode === 'shuffled' && (
            <div className="flex items-end gap-2 sm:col-span-2">
              <TextField label="Seed" inputMode="numeric" className="grow" hint="The same seed gives the same order" error={errors.shuffleSeed?.message} {...register('shuffleSeed')} />
              <Button size="md" className="mb-5" onClick={() => setValue('shuffleSeed', String(newSeed()))}>
                New seed
              </Button>
            </div>
          )}
        </fieldset>

        <TextAreaField label="Notes" hint="Fixture, who measures, anything the bench should know. Optional." error={errors.notes?.message} {...register('notes')} />

        <div role="status" aria-live="polite" className="rounded-md border border-ink-200 bg-ink-50 px-4 py-3 text-sm text-ink-800" data-testid="live-count">
          {Number.isFinite(live.pointCount) ? (
            <>
              <span className="font-semibold tabular-nums">{live.pointCount.toLocaleString('en')} points</span>
              {Number.isFinite(minutes) && minutes >= 0 && <> · about {formatBenchTime(live.pointCount * minutes)} on the bench</>}
            </>
          ) : (
            'The point count shows once every axis reads.'
          )}
        </div>
        {(tooMany || sizeRefusal) && (
          <Alert tone="error">
            {sizeRefusal ?? live.issues.find((issue) => issue.path === 'axes')?.message}
          </Alert>
        )}

        <FormActions
          submitLabel={isSubmitting ? 'Saving…' : plan ? 'Save changes' : 'Save plan'}
          busy={isSubmitting}
          submitDisabled={tooMany}
          onCancel={onCancel}
        />
      </form>
    </Panel>
  );
}
