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

/** Cells of wide tables (many numeric columns) use `dense`: less padding between columns. */
type CellProps<T extends 'th' | 'td'> = ComponentProps<T> & { dense?: boolean };

export function Th({ className, dense = false, ...props }: CellProps<'th'>) {
  return (
    <th
      scope="col"
      className={cn(
        'border-b border-ink-200 bg-ink-50 py-2.5 text-xs font-semibold uppercase tracking-wide text-ink-500',
        dense ? 'px-3 first:pl-5 last:pr-5' : 'px-5',
        className,
      )}
      {...props}
    />
  );
}

export function Td({ className, dense = false, ...props }: CellProps<'td'>) {
  return (
    <td
      className={cn('border-b border-ink-100 py-3 align-middle text-ink-800', dense ? 'px-3 first:pl-5 last:pr-5' : 'px-5', className)}
      {...props}
    />
  );
}
