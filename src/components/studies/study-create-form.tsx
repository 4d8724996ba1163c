'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useForm } from 'react-hook-form';
import { useSWRConfig } from 'swr';
import { Alert } from '@/components/ui/alert';
import { FormActions } from '@/components/ui/form-actions';
import { TextAreaField, TextField } from '@/components/ui/field';
import { Panel } from '@/components/ui/panel';
import { STUDIES_KEY } from '@/hooks/use-studies';
import { useApiSubmit } from '@/components/forms/use-api-submit';
import { fetchJson } from '@/lib/client/fetch-json';
import type { StudySummary } from '@/lib/data/studies';
import type { StudyCreateInput } from '@/lib/validations/study';
import { formFieldFor, studyFormSchema, type StudyFormInput, type StudyFormOutput } from './study-form-schema';

/** Starts a study. The creator becomes its researcher and lands on the new study's page. */
export function StudyCreateForm({ onCancel }: { onCancel: () => void }) {
  const router = useRouter();
  const { mutate } = useSWRConfig();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<StudyFormInput, unknown, StudyFormOutput>({
    resolver: zodResolver(studyFormSchema),
    defaultValues: { name: '', summary: '', frequency: '' },
  });

  const { formError, run } = useApiSubmit(setError, formFieldFor);

  async function onSubmit({ name, summary, frequency }: StudyFormOutput) {
    const body: StudyCreateInput = { name, summary, frequencyHz: frequency };
    await run(async () => {
      const { study } = await fetchJson<{ study: StudySummary }>('/api/studies', { method: 'POST', body });
      await mutate(STUDIES_KEY);
      router.push(`/studies/${study.id}`);
    });
  }

  return (
    <Panel title="New study" description="You become the study's researcher and can invite the others.">
      <form onSubmit={handleSubmit(onSubmit)} noValidate className="space-y-4">
        {formError && <Alert tone="error">{formError}</Alert>}
        <div className="grid gap-4 lg:grid-cols-3">
          <TextField label="Study name" autoFocus className="lg:col-span-2" error={errors.name?.message} {...register('name')} />
          <TextField
            label="Operating frequency"
            placeholder="6.78 MHz"
            hint="With a unit, e.g. 6.78 MHz or 85 kHz; a bare number is hertz. Optional."
            error={errors.frequency?.message}
            {...register('frequency')}
          />
        </div>
        <TextAreaField label="Summary" hint="What the study sets out to measure. Optional." error={errors.summary?.message} {...register('summary')} />
        <FormActions submitLabel="Create study" busy={isSubmitting} onCancel={onCancel} />
      </form>
    </Panel>
  );
}
