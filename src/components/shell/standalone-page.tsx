import Link from 'next/link';
import type { ReactNode } from 'react';
import { CoupletMark } from './couplet-mark';

/** Pages outside the app shell (sign-in, invitations, unknown URLs): the mark and one centred card. */
export function StandalonePage({ children, footer }: { children: ReactNode; footer?: ReactNode }) {
  return (
    <main className="flex min-h-screen flex-col items-center justify-center px-6 py-12">
      <div className="w-full max-w-md space-y-6">
        <Link href="/" className="flex items-center justify-center gap-2 text-lg font-semibold tracking-tight text-ink-900">
          <CoupletMark className="h-7 w-7" />
          Couplet
        </Link>
        <div className="rounded-lg border border-ink-200 bg-white px-8 py-8 shadow-panel">{children}</div>
        {footer && <div className="text-center text-xs leading-relaxed text-ink-500">{footer}</div>}
      </div>
    </main>
  );
}
