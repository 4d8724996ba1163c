import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { safeCallbackUrl } from '@/components/auth/safe-callback-url';
import { SignInForm } from '@/components/auth/sign-in-form';
import { StandalonePage } from '@/components/shell/standalone-page';
import { Alert } from '@/components/ui/alert';
import { getSessionUser } from '@/lib/auth/session';

export const metadata: Metadata = { title: 'Sign in' };

type SearchParams = Promise<Record<string, string | string[] | undefined>>;

const first = (value: string | string[] | undefined) => (Array.isArray(value) ? value[0] : value);

export default async function SignInPage({ searchParams }: { searchParams: SearchParams }) {
  const params = await searchParams;
  const callbackUrl = safeCallbackUrl(params.callbackUrl);
  const joined = first(params.joined) === '1';

  // Someone who just created an account from an invitation may still hold another session in this
  // browser; they must be able to sign in as the new account, so they are not sent away.
  const user = await getSessionUser();
  if (user && !joined) redirect(callbackUrl ?? '/dashboard');

  return (
    <StandalonePage
      footer={
        <>
          Couplet&apos;s predictions support bench work; they do not replace your institution&apos;s safety rules or
          its qualified staff.
        </>
      }
    >
      <div className="space-y-6">
        <div className="space-y-1">
          <h1 className="text-xl font-semibold text-ink-900">Sign in</h1>
          <p className="text-sm text-ink-600">Plan, predict, log and review coil-to-coil wireless power experiments.</p>
        </div>
        {joined && <Alert tone="success">Your account is ready. Sign in to open the study.</Alert>}
        <SignInForm callbackUrl={callbackUrl} defaultEmail={first(params.email) ?? ''} />
      </div>
    </StandalonePage>
  );
}
