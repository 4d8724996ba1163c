import useSWR from 'swr';
import type { ApiError } from '@/lib/client/fetch-json';
import type { Account } from '@/lib/data/accounts';

export const ACCOUNTS_KEY = '/api/admin/accounts';

/** Every account on the site, for site admins. */
export function useAccounts() {
  const { data, error, isLoading, mutate } = useSWR<{ accounts: Account[] }, ApiError>(ACCOUNTS_KEY);
  return { accounts: data?.accounts, error, isLoading, mutate };
}
