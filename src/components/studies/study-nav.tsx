'use client';

import Link from 'next/link';
import { usePathname } from 'next/navigation';
import { cn } from '@/components/ui/cn';
import { isCurrentPath } from '@/components/shell/is-current-path';

/** The pages of one study, in the order work goes: what it is, its coils, the 3D bench, its sweep plans; then its history. */
const SECTIONS = [
  { label: 'Overview', path: '' },
  { label: 'Coils', path: '/coils' },
  { label: 'Bench', path: '/bench' },
  { label: 'Plans', path: '/plans' },
  { label: 'History', path: '/history' },
] as const;

/** Tabs between a study's pages; the current one is marked for people and for screen readers. */
export function StudyNav({ studyId }: { studyId: number }) {
  const pathname = usePathname();
  const base = `/studies/${studyId}`;
  return (
    <nav aria-label="Study" className="border-b border-ink-200">
      <ul className="-mb-px flex gap-6">
        {SECTIONS.map(({ label, path }) => {
          const href = `${base}${path}`;
          const current = path === '' ? pathname === base : isCurrentPath(pathname, href);
          return (
            <li key={label}>
              <Link
                href={href}
                aria-current={current ? 'page' : undefined}
                className={cn(
                  'inline-block border-b-2 px-0.5 pb-2.5 text-sm font-medium transition-colors',
                  current ? 'border-copper-500 text-ink-900' : 'border-transparent text-ink-500 hover:border-ink-300 hover:text-ink-800',
                )}
              >
                {label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
