'use client';

import { useState } from 'react';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { optionsFrom, Select } from '@/components/ui/select';
import { Td } from '@/components/ui/table';
import { SITE_ROLES, type SiteRole } from '@/lib/auth/permissions';
import { ApiError, fetchJson } from '@/lib/client/fetch-json';
import type { Account } from '@/lib/data/accounts';

const SITE_ROLE_OPTIONS = optionsFrom(SITE_ROLES);

interface AccountRowProps {
  account: Account;
  isSelf: boolean;
  /** Puts the server's answer into the list, or reports why the change was refused. */
  onSaved: (account: Account) => void;
  onError: (message: string) => void;
}

/** One account: its site role and whether it may sign in, both changed in place. */
export function AccountRow({ account, isSelf, onSaved, onError }: AccountRowProps) {
  const [saving, setSaving] = useState(false);

  async function update(change: { siteRole?: SiteRole; disabled?: boolean }) {
    setSaving(true);
    try {
      const result = await fetchJson<{ account: Account }>(`/api/admin/accounts/${account.id}`, { method: 'PATCH', body: change });
      onSaved(result.account);
    } catch (error) {
      const message = error instanceof ApiError ? error.message : 'Couplet could not be reached. Try again.';
      onError(`${account.name}: ${message}`);
    } finally {
      setSaving(false);
    }
  }

  return (
    <tr>
      <Td className="font-medium text-ink-900">
        {account.name}
        {isSelf && <span className="ml-2 text-xs font-normal text-ink-500">(you)</span>}
      </Td>
      <Td className="text-ink-600">{account.email}</Td>
      <Td className="w-44">
        <Select
          aria-label={`Site role of ${account.name}`}
          options={SITE_ROLE_OPTIONS}
          value={account.siteRole}
          className="min-w-36"
          disabled={saving}
          onChange={(event) => void update({ siteRole: event.target.value as SiteRole })}
        />
      </Td>
      <Td className="tabular-nums">{account.studyCount}</Td>
      <Td>
        <div className="flex items-center justify-between gap-3">
          {account.disabled ? <Badge tone="danger">disabled</Badge> : <Badge tone="flux">active</Badge>}
          <Button size="sm" variant="secondary" disabled={saving} onClick={() => void update({ disabled: !account.disabled })}>
            {account.disabled ? 'Enable' : 'Disable'}
            <span className="sr-only"> {account.name}</span>
          </Button>
        </div>
      </Td>
    </tr>
  );
}
