'use client';

import Link from 'next/link';
import { useEffect } from 'react';
import { Button, buttonClasses } from '@/components/ui/button';

/**
 * What an error boundary shows. Only the opaque digest is shown, never the message: in production
 * server errors arrive without details, and client errors could carry internals.
 */
export function ErrorNotice({ error, retry }: { error: unknown; retry: () => void }) {
  const digest = error instanceof Error && 'digest' in error && typeof error.digest === 'string' ? error.digest : undefined;

  useEffect(() => {
    console.error(error);
  }, [error]);

  return (
    <div role="alert" className="mx-auto max-w-lg space-y-4 py-16 text-center">
      <h1 className="text-xl font-semibold text-ink-900">Something went wrong</h1>
      <p className="text-sm text-ink-600">
        Couplet could not finish showing this page. Try again; if it keeps happening, tell your site admin
        {digest ? ' and quote the reference below' : ''}.
      </p>
      {digest && <p className="font-mono text-xs text-ink-500">Reference: {digest}</p>}
      <div className="flex justify-center gap-3">
        <Button variant="primary" onClick={() => retry()}>
          Try again
        </Button>
        <Link href="/dashboard" className={buttonClasses('secondary')}>
          Back to studies
        </Link>
      </div>
    </div>
  );
}
