import type { Metadata } from 'next';
import { notFound, redirect } from 'next/navigation';
import { AccountCreateForm } from '@/components/admin/account-create-form';
import { AccountsTable } from '@/components/admin/accounts-table';
import { PageHeader } from '@/components/ui/page-header';
import { canManageAccounts } from '@/lib/auth/permissions';
import { getSessionUser } from '@/lib/auth/session';

export const metadata: Metadata = { title: 'Accounts' };

/** Site accounts, for site admins. Anyone else gets the ordinary 404: the page is not advertised. */
export default async function AccountsPage() {
  const user = await getSessionUser();
  if (!user) redirect('/signin');
  if (!canManageAccounts(user.siteRole)) notFound();

  return (
    <div className="space-y-6">
      <PageHeader title="Accounts" description="Who can sign in to Couplet, and with which site role. Disabling an account ends its sessions." />
      <AccountsTable viewerId={user.id} />
      <AccountCreateForm />
    </div>
  );
}
