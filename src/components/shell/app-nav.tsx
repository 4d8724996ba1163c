import Link from 'next/link';
import type { SessionUser } from '@/lib/auth/session-user';
import { canManageAccounts } from '@/lib/auth/permissions';
import { CoupletMark } from './couplet-mark';
import { NavLink } from './nav-link';
import { SignOutButton } from './sign-out-button';

/**
 * The top bar of every signed-in page. Rendered on the server; only the links and sign-out are client
 * leaves. The name links to the person's own account page.
 */
export function AppNav({ user }: { user: SessionUser }) {
  return (
    <header className="border-b border-ink-200 bg-white">
      <div className="mx-auto flex h-14 max-w-6xl items-center gap-8 px-6">
        <Link href="/dashboard" className="flex items-center gap-2 text-base font-semibold tracking-tight text-ink-900">
          <CoupletMark />
          Couplet
        </Link>
        <nav aria-label="Main">
          <ul className="flex items-center gap-1">
            <li>
              <NavLink href="/dashboard" sections={['/dashboard', '/studies']}>
                Studies
              </NavLink>
            </li>
            {canManageAccounts(user.siteRole) && (
              <li>
                <NavLink href="/admin/accounts">Accounts</NavLink>
              </li>
            )}
          </ul>
        </nav>
        <div className="ml-auto flex items-center gap-4">
          <Link href="/account" className="-mx-2 rounded-md px-2 py-1 text-right leading-tight transition-colors hover:bg-ink-50">
            <span className="sr-only">Your account: </span>
            <span className="block text-sm font-medium text-ink-900">{user.name}</span>
            <span className="block text-xs text-ink-500" title="Site role">
              {user.siteRole}
            </span>
          </Link>
          <SignOutButton />
        </div>
      </div>
    </header>
  );
}
