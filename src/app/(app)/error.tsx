'use client';

import { ErrorNotice } from '@/components/shell/error-notice';

/** Errors inside the signed-in pages: the navigation stays, so the person can go elsewhere. */
export default function AppError({ error, retry }: { error: unknown; retry: () => void }) {
  return <ErrorNotice error={error} retry={retry} />;
}
