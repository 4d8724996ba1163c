'use client';

import Link from 'next/link';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Panel } from '@/components/ui/panel';
import { Skeleton } from '@/components/ui/skeleton';
import { useStudies } from '@/hooks/use-studies';
import type { StudySummary } from '@/lib/data/studies';
import { formatFrequency } from '@/lib/units/format';
import { RoleBadge } from './role-badge';

function StudyItem({ study }: { study: StudySummary }) {
  return (
    <li className="flex items-start justify-between gap-6 px-5 py-4">
      <div className="min-w-0 space-y-1">
        <Link href={`/studies/${study.id}`} className="text-base font-medium text-flux-700 hover:text-flux-800 hover:underline">
          {study.name}
        </Link>
        {study.summary && <p className="line-clamp-2 max-w-3xl text-sm text-ink-600">{study.summary}</p>}
        <dl className="flex flex-wrap gap-x-5 gap-y-1 pt-1 text-xs text-ink-500">
          <div className="flex gap-1">
            <dt>Operating frequency</dt>
            <dd className="font-medium tabular-nums text-ink-700">{study.frequencyHz === null ? 'not set' : formatFrequency(study.frequencyHz)}</dd>
          </div>
          <div className="flex gap-1">
            <dt>Members</dt>
            <dd className="font-medium tabular-nums text-ink-700">{study.memberCount}</dd>
          </div>
        </dl>
      </div>
      <dl className="shrink-0">
        <dt className="sr-only">Your role</dt>
        <dd>
          <RoleBadge role={study.myRole} />
        </dd>
      </dl>
    </li>
  );
}

/** The dashboard's list of studies, fetched in the browser so a new study shows up without a reload. */
export function StudyList({ canCreate }: { canCreate: boolean }) {
  const { studies, error, isLoading, mutate } = useStudies();

  return (
    <Panel title="Studies" flush>
      {isLoading && <Skeleton label="Loading studies…" className="px-5 py-5" />}
      {error && (
        <div className="space-y-3 px-5 py-4">
          <Alert tone="error">Your studies could not be loaded. {error.message}</Alert>
          <Button size="sm" onClick={() => void mutate()}>
            Try again
          </Button>
        </div>
      )}
      {studies && studies.length === 0 && (
        <div className="px-5 py-10 text-center">
          <p className="text-sm font-medium text-ink-800">You are not on any study yet.</p>
          <p className="mt-1 text-sm text-ink-500">
            {canCreate ? 'Start one with “New study”.' : 'When someone invites you to a study, it appears here.'}
          </p>
        </div>
      )}
      {studies && studies.length > 0 && (
        <ul role="list" aria-label="My studies" className="divide-y divide-ink-100">
          {studies.map((study) => (
            <StudyItem key={study.id} study={study} />
          ))}
        </ul>
      )}
    </Panel>
  );
}
