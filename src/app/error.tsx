'use client';

import { ErrorNotice } from '@/components/shell/error-notice';

/** Errors anywhere below the root layout that no nearer boundary caught. */
export default function RootError({ error, retry }: { error: unknown; retry: () => void }) {
  return (
    <main className="px-6">
      <ErrorNotice error={error} retry={retry} />
    </main>
  );
}
