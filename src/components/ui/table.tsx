import type { ComponentProps, ReactNode } from 'react';
import { cn } from './cn';

/** A data table that scrolls sideways instead of squeezing when the window is narrow. */
export function Table({ caption, children }: { caption?: string; children: ReactNode }) {
  return (
    <div className="overflow-x-auto">
      <table className="min-w-full text-left text-sm">
        {caption && <caption className="sr-only">{caption}</caption>}
        {children}
      </table>
    </div>
  );
}

export function Th({ className, ...props }: ComponentProps<'th'>) {
  return (
    <th
      scope="col"
      className={cn('border-b border-ink-200 bg-ink-50 px-5 py-2.5 text-xs font-semibold uppercase tracking-wide text-ink-500', className)}
      {...props}
    />
  );
}

export function Td({ className, ...props }: ComponentProps<'td'>) {
  return <td className={cn('border-b border-ink-100 px-5 py-3 align-middle text-ink-800', className)} {...props} />;
}
