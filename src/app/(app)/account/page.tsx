import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { AccountDetails } from '@/components/account/account-details';
import { PasswordChangeForm } from '@/components/account/password-change-form';
import { PageHeader } from '@/components/ui/page-header';
import { getSessionUser } from '@/lib/auth/session';

export const metadata: Metadata = { title: 'Your account' };

/** The signed-in person's own account: who they are on this site, and their password. */
export default async function AccountPage() {
  const user = await getSessionUser();
  if (!user) redirect('/signin');

  return (
    <div className="space-y-6">
      <PageHeader title="Your account" />
      <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
        <AccountDetails user={user} />
        <PasswordChangeForm />
      </div>
    </div>
  );
}
