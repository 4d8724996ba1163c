'use client';

import { useState } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Panel } from '@/components/ui/panel';
import { Skeleton } from '@/components/ui/skeleton';
import { studyHistoryKey, useStudyHistory, type HistoryFilters } from '@/hooks/use-study-history';
import { HistoryEntry } from './history-entry';
import { HistoryFilterBar, type NamedRef } from './history-filters';

interface HistoryViewProps {
  studyId: number;
  /** the study's plans, for the plan filter */
  plans: NamedRef[];
  /** filters from the page's address, so a filtered history can be linked to */
  initialFilters: HistoryFilters;
}

/** The study's audit trail with its filters, newest first, older pages on request. */
export function HistoryView({ studyId, plans, initialFilters }: HistoryViewProps) {
  const [filters, setFilters] = useState<HistoryFilters>(initialFilters);
  const history = useStudyHistory(studyId, filters);
  const filtered = filters.actorId !== undefined || filters.category !== undefined || filters.planId !== undefined;

  function changeFilters(next: HistoryFilters) {
    setFilters(next);
    // Keep the address in step without a server round trip, so the view can be bookmarked or shared.
    const search = studyHistoryKey(studyId, next).split('?')[1];
    window.history.replaceState(null, '', `${window.location.pathname}${search ? `?${search}` : ''}`);
  }

  return (
    <div className="space-y-6">
      <HistoryFilterBar filters={filters} people={history.actors} plans={plans} onChange={changeFilters} />
      {history.error && <Alert tone="error">The history could not be loaded. {history.error.message}</Alert>}
      {history.isLoading && <Skeleton label="Loading the history" rows={5} />}
      {history.events && history.events.length === 0 && (
        <Panel>
          <p className="text-sm text-ink-600">
            {filtered ? 'Nothing recorded matches these filters.' : 'Nothing has been recorded on this study yet.'}
          </p>
        </Panel>
      )}
      {history.events && history.events.length > 0 && (
        <Panel flush>
          <ol aria-label="History of this study">
            {history.events.map((event) => (
              <HistoryEntry key={event.id} studyId={studyId} event={event} />
            ))}
          </ol>
        </Panel>
      )}
      {history.hasOlder && (
        <div className="flex justify-center">
          <Button onClick={() => void history.showOlder()} disabled={history.loadingOlder}>
            {history.loadingOlder ? 'Loading older entries…' : 'Show older'}
          </Button>
        </div>
      )}
    </div>
  );
}
