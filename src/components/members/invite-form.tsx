'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { useSWRConfig } from 'swr';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Panel } from '@/components/ui/panel';
import { optionsFrom, SelectField } from '@/components/ui/select';
import { studyInvitationsKey } from '@/hooks/use-study-invitations';
import { STUDY_ROLES } from '@/lib/auth/permissions';
import { sameNames } from '@/components/forms/apply-server-errors';
import { useApiSubmit } from '@/components/forms/use-api-submit';
import { fetchJson } from '@/lib/client/fetch-json';
import type { PendingInvitation } from '@/lib/data/invitations';
import { invitationCreateSchema, type InvitationCreateInput } from '@/lib/validations/study';

const ROLE_OPTIONS = optionsFrom(STUDY_ROLES);
type Output = { email: string; role: (typeof STUDY_ROLES)[number] };
const fieldFor = sameNames<InvitationCreateInput>(['email', 'role']);

/** Invites an e-mail address with a role; the person gets a single-use link by e-mail. */
export function InviteForm({ studyId }: { studyId: number }) {
  const { mutate } = useSWRConfig();
  const {
    register,
    handleSubmit,
    reset,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<InvitationCreateInput, unknown, Output>({
    resolver: zodResolver(invitationCreateSchema),
    defaultValues: { email: '', role: 'student' },
  });
  const { formError, notice, run } = useApiSubmit(setError, fieldFor);

  async function onSubmit(values: Output) {
    await run(async () => {
      await fetchJson<{ invitation: PendingInvitation }>(`/api/studies/${studyId}/invitations`, { method: 'POST', body: values });
      await mutate(studyInvitationsKey(studyId));
      reset({ email: '', role: values.role });
      return `Invitation saved; the e-mail to ${values.email} is on its way.`;
    });
  }

  return (
    <Panel title="Invite someone" description="They get an e-mail with a link that works once and expires.">
      <form onSubmit={handleSubmit(onSubmit)} noValidate className="space-y-4">
        {formError && <Alert tone="error">{formError}</Alert>}
        {notice && <Alert tone="success">{notice}</Alert>}
        <TextField label="E-mail" type="email" autoComplete="off" error={errors.email?.message} {...register('email')} />
        <SelectField
          label="Role"
          options={ROLE_OPTIONS}
          hint="Researchers design, students log readings, supervisors review."
          error={errors.role?.message}
          {...register('role')}
        />
        <Button type="submit" variant="primary" disabled={isSubmitting}>
          {isSubmitting ? 'Sending…' : 'Send invitation'}
        </Button>
      </form>
    </Panel>
  );
}
