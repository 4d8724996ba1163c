'use client';

import { useState } from 'react';
import { Alert } from '@/components/ui/alert';
import { Panel } from '@/components/ui/panel';
import { Skeleton } from '@/components/ui/skeleton';
import { Table, Th } from '@/components/ui/table';
import { useAccounts } from '@/hooks/use-accounts';
import type { Account } from '@/lib/data/accounts';
import { AccountRow } from './account-row';

/** Every account on the site. Changes are saved as they are made; the server refuses self-demotion. */
export function AccountsTable({ viewerId }: { viewerId: number }) {
  const { accounts, error, isLoading, mutate } = useAccounts();
  const [rowError, setRowError] = useState<string | null>(null);

  function saved(account: Account) {
    setRowError(null);
    void mutate((current) => current && { accounts: current.accounts.map((row) => (row.id === account.id ? account : row)) }, { revalidate: false });
  }

  return (
    <Panel title="All accounts" flush>
      {rowError && (
        <div className="px-5 py-4">
          <Alert tone="error">{rowError}</Alert>
        </div>
      )}
      {isLoading && <Skeleton label="Loading accounts…" className="px-5 py-5" />}
      {error && (
        <div className="px-5 py-4">
          <Alert tone="error">The accounts could not be loaded. {error.message}</Alert>
        </div>
      )}
      {accounts && (
        <Table caption="Accounts">
          <thead>
            <tr>
              <Th>Name</Th>
              <Th>E-mail</Th>
              <Th>Site role</Th>
              <Th>Studies</Th>
              <Th>Status</Th>
            </tr>
          </thead>
          <tbody>
            {accounts.map((account) => (
              <AccountRow
                key={account.id}
                account={account}
                isSelf={account.id === viewerId}
                onSaved={saved}
                onError={(message) => setRowError(message)}
              />
            ))}
          </tbody>
        </Table>
      )}
    </Panel>
  );
}
