'use client';

import Link from 'next/link';
import { usePathname } from 'next/navigation';
import type { ReactNode } from 'react';
import { cn } from '@/components/ui/cn';
import { isCurrentPath } from './is-current-path';

/**
 * A top-navigation link that marks itself current. `sections` lists the path prefixes that belong to
 * it, so a study page still highlights "Studies".
 */
export function NavLink({ href, sections = [href], children }: { href: string; sections?: string[]; children: ReactNode }) {
  const pathname = usePathname();
  const current = sections.some((prefix) => isCurrentPath(pathname, prefix));
  return (
    <Link
      href={href}
      aria-current={current ? 'page' : undefined}
      className={cn(
        'rounded-md px-3 py-1.5 text-sm font-medium transition-colors',
        current ? 'bg-ink-100 text-ink-900' : 'text-ink-600 hover:bg-ink-50 hover:text-ink-900',
      )}
    >
      {children}
    </Link>
  );
}
