import { cn } from './cn';

/** Grey placeholder bars while data loads. The label is what a screen reader hears instead. */
export function Skeleton({ label, rows = 3, className }: { label: string; rows?: number; className?: string }) {
  return (
    <div role="status" className={cn('space-y-3', className)}>
      <span className="sr-only">{label}</span>
      {Array.from({ length: rows }, (_, index) => (
        <div key={index} aria-hidden="true" className="h-4 animate-pulse rounded bg-ink-100" style={{ width: `${90 - index * 15}%` }} />
      ))}
    </div>
  );
}
