/** Two coupled coils seen edge-on: the product's mark. Decorative, so hidden from screen readers. */
export function CoupletMark({ className = 'h-6 w-6' }: { className?: string }) {
  return (
    <svg viewBox="0 0 24 24" aria-hidden="true" className={className} fill="none" strokeWidth="2">
      <circle cx="9" cy="12" r="6" className="stroke-ink-800" />
      <circle cx="15" cy="12" r="6" className="stroke-copper-500" />
    </svg>
  );
}
