'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useForm, type UseFormRegisterReturn } from 'react-hook-form';
import { useApiSubmit } from '@/components/forms/use-api-submit';
import { Alert } from '@/components/ui/alert';
import { FormActions } from '@/components/ui/form-actions';
import { TextAreaField, TextField } from '@/components/ui/field';
import { Panel } from '@/components/ui/panel';
import { optionsFrom, SelectField } from '@/components/ui/select';
import { fetchJson } from '@/lib/client/fetch-json';
import type { Coil } from '@/lib/data/coils';
import { formatAwg, formatLength, formatQuantity, parseQuantity, parseWire, type QuantityKind } from '@/lib/units';
import { COIL_KINDS, MATERIALS, type CoilCreateInput } from '@/lib/validations/coil';
import { coilFormFieldFor, coilFormSchema, coilToFormValues, EMPTY_COIL_FORM, type CoilFormValues } from './coil-form-schema';

const KIND_OPTIONS = optionsFrom(COIL_KINDS);
const MATERIAL_OPTIONS = optionsFrom(MATERIALS);

/** How a typed quantity reads, normalised ("0.12 m" reads as "12 cm"), or the example when empty or unreadable. */
function readsAs(text: string, kind: QuantityKind, example: string): string {
  const parsed = parseQuantity(text, kind, { field: '' });
  return parsed.ok && parsed.value !== null ? `Reads as ${formatQuantity(parsed.value, kind)}` : example;
}

function wireReadsAs(text: string, example: string): string {
  const parsed = parseWire(text, { field: '' });
  if (!parsed.ok || parsed.value === null) return example;
  const { diameter, gauge } = parsed.value;
  return gauge === null ? `Reads as ${formatLength(diameter)}` : `${formatAwg(gauge)} is ${formatLength(diameter, 5)} (ASTM B258)`;
}

interface UnitFieldProps {
  label: string;
  hint: string;
  error?: string;
  registration: UseFormRegisterReturn;
}

const UnitField = ({ label, hint, error, registration }: UnitFieldProps) => (
  <TextField label={label} hint={hint} error={error} autoComplete="off" spellCheck={false} {...registration} />
);

interface CoilFormProps {
  studyId: number;
  /** The coil being edited; a new coil when absent. */
  coil?: Coil;
  onSaved: (coil: Coil) => void;
  onCancel: () => void;
}

/** Creates or edits a coil. Every size is typed with its unit and read back normalised under the field. */
export function CoilForm({ studyId, coil, onSaved, onCancel }: CoilFormProps) {
  const {
    register,
    handleSubmit,
    setError,
    watch,
    formState: { errors, isSubmitting },
  } = useForm<CoilFormValues, unknown, CoilCreateInput>({
    resolver: zodResolver(coilFormSchema),
    defaultValues: coil ? coilToFormValues(coil) : EMPTY_COIL_FORM,
  });
  const { formError, run } = useApiSubmit(setError, coilFormFieldFor);
  const values = watch();
  const kind = values.kind;

  async function onSubmit(body: CoilCreateInput) {
    const url = coil ? `/api/studies/${studyId}/coils/${coil.id}` : `/api/studies/${studyId}/coils`;
    await run(async () => {
      const result = await fetchJson<{ coil: Coil }>(url, { method: coil ? 'PATCH' : 'POST', body });
      onSaved(result.coil);
    });
  }

  const unit = (field: keyof CoilFormValues, label: string, quantity: QuantityKind, example: string) => (
    <UnitField label={label} hint={readsAs(values[field], quantity, example)} error={errors[field]?.message} registration={register(field)} />
  );

  return (
    <Panel title={coil ? `Edit “${coil.name}”` : 'New coil'} description="Type sizes with their units: 12 cm, 0.8 mm, 1.5 in. A bare number is metres.">
      <form onSubmit={handleSubmit(onSubmit)} noValidate className="space-y-5" aria-label={coil ? 'Edit coil' : 'New coil'}>
        {formError && <Alert tone="error">{formError}</Alert>}
        <div className="grid gap-4 sm:grid-cols-3">
          <TextField label="Name" className="sm:col-span-2" autoFocus error={errors.name?.message} {...register('name')} />
          <SelectField label="Kind" options={KIND_OPTIONS} error={errors.kind?.message} {...register('kind')} />
        </div>

        <fieldset className="grid gap-4 sm:grid-cols-3">
          <legend className="mb-2 text-sm font-semibold text-ink-900">Geometry</legend>
          {kind !== 'spiral' && unit('radius', 'Radius', 'length', 'e.g. 5 cm')}
          {kind === 'helix' && unit('length', 'Length', 'length', 'Axial length, e.g. 4 cm')}
          {kind === 'spiral' && unit('innerRadius', 'Inner radius', 'length', 'e.g. 2.5 cm')}
          {kind === 'spiral' && unit('outerRadius', 'Outer radius', 'length', 'e.g. 14 cm')}
          {kind !== 'loop' && <TextField label="Turns" inputMode="decimal" hint="e.g. 12" error={errors.turns?.message} {...register('turns')} />}
        </fieldset>

        <fieldset className="grid gap-4 sm:grid-cols-3">
          <legend className="mb-2 text-sm font-semibold text-ink-900">Conductor</legend>
          <UnitField label="Wire" hint={wireReadsAs(values.wire, 'A gauge or a diameter: AWG 18 or 0.8 mm')} error={errors.wire?.message} registration={register('wire')} />
          <SelectField label="Material" options={MATERIAL_OPTIONS} error={errors.material?.message} {...register('material')} />
          <TextField label="Temperature" hint="°C; 20 °C when empty" inputMode="decimal" error={errors.temperature?.message} {...register('temperature')} />
          <TextField label="Strands" hint="Stranded or litz wire; solid when empty" inputMode="numeric" error={errors.strands?.message} {...register('strands')} />
          <UnitField label="Strand diameter" hint={wireReadsAs(values.strandDiameter, 'e.g. AWG 38 or 0.1 mm')} error={errors.strandDiameter?.message} registration={register('strandDiameter')} />
        </fieldset>

        <fieldset className="grid gap-4 sm:grid-cols-4">
          <legend className="mb-2 text-sm font-semibold text-ink-900">
            Measured <span className="font-normal text-ink-500">(optional, with the frequency they were measured at)</span>
          </legend>
          {unit('measuredInductance', 'Measured inductance', 'inductance', 'e.g. 10 uH')}
          {unit('measuredResistance', 'Measured resistance', 'resistance', 'e.g. 500 mohm')}
          <TextField label="Measured Q" inputMode="decimal" hint="e.g. 250" error={errors.measuredQ?.message} {...register('measuredQ')} />
          {unit('measuredFrequency', 'Measured at', 'frequency', 'e.g. 6.78 MHz')}
        </fieldset>

        <TextAreaField label="Notes" hint="Former, winding, where it is kept. Optional." error={errors.notes?.message} {...register('notes')} />
        <FormActions submitLabel={isSubmitting ? 'Saving…' : coil ? 'Save changes' : 'Add coil'} busy={isSubmitting} onCancel={onCancel} />
      </form>
    </Panel>
  );
}
