import type { ReactNode } from 'react';
import { cn } from './cn';

export type AlertTone = 'error' | 'success' | 'info' | 'caution';

const TONES: Record<AlertTone, string> = {
  error: 'border-danger-500/30 bg-danger-50 text-danger-700',
  success: 'border-flux-200 bg-flux-50 text-flux-800',
  info: 'border-ink-200 bg-ink-50 text-ink-700',
  caution: 'border-caution-500/40 bg-caution-50 text-caution-900',
};

/**
 * A message box. Errors are announced at once (role="alert"); confirmations politely (role="status");
 * a caution is standing text that is part of the page, so it gets no live role.
 */
export function Alert({ tone = 'info', title, className, children }: { tone?: AlertTone; title?: string; className?: string; children: ReactNode }) {
  const role = tone === 'error' ? 'alert' : tone === 'caution' ? undefined : 'status';
  return (
    <div role={role} className={cn('rounded-md border px-4 py-3 text-sm', TONES[tone], className)}>
      {title && <p className="mb-1 font-semibold">{title}</p>}
      <div>{children}</div>
    </div>
  );
}
