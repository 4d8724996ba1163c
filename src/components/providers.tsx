'use client';

import { SessionProvider } from 'next-auth/react';
import type { ReactNode } from 'react';
import { SWRConfig } from 'swr';
import { fetchJson } from '@/lib/client/fetch-json';

/** Client-side context: the next-auth session and one SWR configuration for every hook. */
export function Providers({ children }: { children: ReactNode }) {
  return (
    <SessionProvider refetchOnWindowFocus={false}>
      <SWRConfig value={{ fetcher: fetchJson, revalidateOnFocus: false, shouldRetryOnError: false }}>{children}</SWRConfig>
    </SessionProvider>
  );
}
