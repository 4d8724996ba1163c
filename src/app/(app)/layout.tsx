import { redirect } from 'next/navigation';
import type { ReactNode } from 'react';
import { AppNav } from '@/components/shell/app-nav';
import { getSessionUser } from '@/lib/auth/session';

/**
 * The signed-in part of Couplet. This check is for the page shell only; every page and data
 * function checks access again on its own, since layouts do not re-run on client navigation.
 */
export default async function AppLayout({ children }: { children: ReactNode }) {
  const user = await getSessionUser();
  if (!user) redirect('/signin');

  return (
    <div className="min-h-screen">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:left-4 focus:top-3 focus:z-10 focus:rounded-md focus:bg-white focus:px-3 focus:py-2 focus:text-sm focus:shadow-panel"
      >
        Skip to content
      </a>
      <AppNav user={user} />
      <main id="main" className="mx-auto max-w-6xl px-6 py-8">
        {children}
      </main>
    </div>
  );
}
