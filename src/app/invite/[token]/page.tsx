import type { Metadata } from 'next';
import Link from 'next/link';
import { AcceptNewAccountForm } from '@/components/invite/accept-new-account-form';
import { InvitationDetails } from '@/components/invite/invitation-details';
import { JoinStudyForm } from '@/components/invite/join-study-form';
import { SignOutButton } from '@/components/shell/sign-out-button';
import { StandalonePage } from '@/components/shell/standalone-page';
import { Alert } from '@/components/ui/alert';
import { buttonClasses } from '@/components/ui/button';
import { getSessionUser } from '@/lib/auth/session';
import { viewInvitation, type InvitationView } from '@/lib/data/invitations';
import { HttpError } from '@/lib/http/errors';
import { acceptWithNewAccount, joinAsSignedInUser } from './actions';

export const metadata: Metadata = { title: 'Invitation', robots: { index: false } };

type Params = Promise<{ token: string }>;

const UNUSABLE: Record<Exclude<InvitationView['status'], 'valid'>, string> = {
  expired: 'This invitation has expired. Ask the person who invited you to send a new one.',
  used: 'This invitation has already been used. If you accepted it, the study is in your list of studies.',
  revoked: 'This invitation was withdrawn. Ask the person who invited you if you still need access.',
};

function InvalidLink() {
  return (
    <StandalonePage>
      <div className="space-y-4">
        <h1 className="text-xl font-semibold text-ink-900">This invitation link is not valid</h1>
        <p className="text-sm text-ink-600">Check that the whole link from the e-mail was opened, or ask for a new invitation.</p>
        <Link href="/signin" className="text-sm font-medium text-flux-700 hover:underline">
          Go to sign in
        </Link>
      </div>
    </StandalonePage>
  );
}

/** The page behind the link in an invitation e-mail. The token is the credential; no sign-in is needed to see it. */
export default async function InvitationPage({ params }: { params: Params }) {
  const { token } = await params;
  let invitation: InvitationView;
  try {
    invitation = await viewInvitation(token);
  } catch (error) {
    if (error instanceof HttpError && error.status === 404) return <InvalidLink />;
    throw error;
  }
  const user = await getSessionUser();
  const ownPath = `/invite/${token}`;
  const signInPath = `/signin?callbackUrl=${encodeURIComponent(ownPath)}&email=${encodeURIComponent(invitation.email)}`;

  return (
    <StandalonePage>
      <div className="space-y-6">
        <div className="space-y-1">
          <h1 className="text-xl font-semibold text-ink-900">Join {invitation.studyName}</h1>
          <p className="text-sm text-ink-600">
            {invitation.inviterName} invited {invitation.email} to this study as {invitation.role}.
          </p>
        </div>
        <InvitationDetails invitation={invitation} />

        {invitation.status !== 'valid' ? (
          <div className="space-y-3">
            <Alert tone="caution">{UNUSABLE[invitation.status]}</Alert>
            <Link href={user ? '/dashboard' : '/signin'} className="text-sm font-medium text-flux-700 hover:underline">
              {user ? 'Go to your studies' : 'Go to sign in'}
            </Link>
          </div>
        ) : !invitation.accountExists ? (
          <AcceptNewAccountForm action={acceptWithNewAccount.bind(null, token)} email={invitation.email} />
        ) : !user ? (
          <div className="space-y-3">
            <p className="text-sm text-ink-600">You already have a Couplet account with this address.</p>
            <Link href={signInPath} className={`${buttonClasses('primary')} w-full`}>
              Sign in to join
            </Link>
          </div>
        ) : user.email.toLowerCase() === invitation.email.toLowerCase() ? (
          <JoinStudyForm action={joinAsSignedInUser.bind(null, token)} />
        ) : (
          <div className="space-y-3">
            <Alert tone="info">
              This invitation is for {invitation.email}, but you are signed in as {user.email}. Sign out and sign in
              with {invitation.email} to join.
            </Alert>
            <SignOutButton variant="secondary" label="Sign out" callbackUrl={signInPath} />
          </div>
        )}
      </div>
    </StandalonePage>
  );
}
