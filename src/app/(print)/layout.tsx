import { redirect } from 'next/navigation';
import type { ReactNode } from 'react';
import { getSessionUser } from '@/lib/auth/session';

/** Printable pages: signed in, but no navigation; black on white on screen and on paper. */
export default async function PrintLayout({ children }: { children: ReactNode }) {
  if (!(await getSessionUser())) redirect('/signin');
  return (
    <main className="min-h-screen bg-white p-6 text-black print:p-0">
      <style>{'@page { size: A4 landscape; margin: 12mm; } @media print { body { background: #fff; } }'}</style>
      {children}
    </main>
  );
}
