import type { ReactNode } from 'react';
import { cn } from './cn';

export type BadgeTone = 'neutral' | 'flux' | 'copper' | 'dark' | 'danger';

const TONES: Record<BadgeTone, string> = {
  neutral: 'bg-ink-100 text-ink-700 ring-ink-200',
  flux: 'bg-flux-50 text-flux-800 ring-flux-200',
  copper: 'bg-copper-50 text-copper-800 ring-copper-200',
  dark: 'bg-ink-800 text-white ring-ink-800',
  danger: 'bg-danger-50 text-danger-700 ring-danger-100',
};

/** A short label. Its text is exactly what is passed in, so tests and screen readers read the same word. */
export function Badge({ tone = 'neutral', className, children }: { tone?: BadgeTone; className?: string; children: ReactNode }) {
  return (
    <span className={cn('inline-flex items-center rounded-full px-2 py-0.5 text-xs font-medium ring-1 ring-inset', TONES[tone], className)}>
      {children}
    </span>
  );
}
