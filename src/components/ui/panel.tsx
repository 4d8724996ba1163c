import { useId, type ReactNode } from 'react';
import { cn } from './cn';

interface PanelProps {
  title?: string;
  description?: ReactNode;
  /** Controls shown at the right of the title row. */
  actions?: ReactNode;
  className?: string;
  /** Tables run edge to edge; forms and text get the usual padding. */
  flush?: boolean;
  children: ReactNode;
}

/** A white card on the ink-50 page. With a title it is a labelled region, so it can be found by name. */
export function Panel({ title, description, actions, className, flush = false, children }: PanelProps) {
  const titleId = useId();
  return (
    <section
      aria-labelledby={title ? titleId : undefined}
      className={cn('rounded-lg border border-ink-200 bg-white shadow-panel', className)}
    >
      {(title || actions) && (
        <header className="flex items-start justify-between gap-4 border-b border-ink-100 px-5 py-4">
          <div className="space-y-1">
            {title && (
              <h2 id={titleId} className="text-base font-semibold text-ink-900">
                {title}
              </h2>
            )}
            {description && <p className="text-sm text-ink-600">{description}</p>}
          </div>
          {actions && <div className="flex shrink-0 items-center gap-2">{actions}</div>}
        </header>
      )}
      <div className={flush ? undefined : 'px-5 py-4'}>{children}</div>
    </section>
  );
}
