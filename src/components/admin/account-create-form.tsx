'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Panel } from '@/components/ui/panel';
import { optionsFrom, SelectField } from '@/components/ui/select';
import { useAccounts } from '@/hooks/use-accounts';
import { SITE_ROLES, type SiteRole } from '@/lib/auth/permissions';
import { sameNames } from '@/components/forms/apply-server-errors';
import { useApiSubmit } from '@/components/forms/use-api-submit';
import { fetchJson } from '@/lib/client/fetch-json';
import type { Account } from '@/lib/data/accounts';
import { accountCreateSchema, type AccountCreateInput } from '@/lib/validations/account';

const SITE_ROLE_OPTIONS = optionsFrom(SITE_ROLES);
type Output = { name: string; email: string; siteRole: SiteRole; password: string };
const fieldFor = sameNames<AccountCreateInput>(['name', 'email', 'siteRole', 'password']);

/** An admin opens an account directly and passes the initial password on by other means. */
export function AccountCreateForm() {
  const { mutate } = useAccounts();
  const {
    register,
    handleSubmit,
    reset,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<AccountCreateInput, unknown, Output>({
    resolver: zodResolver(accountCreateSchema),
    defaultValues: { name: '', email: '', siteRole: 'member', password: '' },
  });

  const { formError, notice, run } = useApiSubmit(setError, fieldFor);

  async function onSubmit(values: Output) {
    await run(async () => {
      const { account } = await fetchJson<{ account: Account }>('/api/admin/accounts', { method: 'POST', body: values });
      await mutate();
      reset();
      return `Account created for ${account.email}.`;
    });
  }

  return (
    <Panel title="Create an account" description="People invited to a study get their account through the invitation instead.">
      <form onSubmit={handleSubmit(onSubmit)} noValidate className="space-y-4">
        {formError && <Alert tone="error">{formError}</Alert>}
        {notice && <Alert tone="success">{notice}</Alert>}
        <div className="grid gap-4 lg:grid-cols-2">
          <TextField label="Name" autoComplete="off" error={errors.name?.message} {...register('name')} />
          <TextField label="E-mail" type="email" autoComplete="off" error={errors.email?.message} {...register('email')} />
          <SelectField
            label="Site role"
            options={SITE_ROLE_OPTIONS}
            hint="Researcher accounts can start studies; members join by invitation."
            error={errors.siteRole?.message}
            {...register('siteRole')}
          />
          <TextField
            label="Initial password"
            type="password"
            autoComplete="new-password"
            hint="At least 10 characters."
            error={errors.password?.message}
            {...register('password')}
          />
        </div>
        <Button type="submit" variant="primary" disabled={isSubmitting}>
          Create account
        </Button>
      </form>
    </Panel>
  );
}
