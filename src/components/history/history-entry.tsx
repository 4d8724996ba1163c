import Link from 'next/link';
import { Badge, type BadgeTone } from '@/components/ui/badge';
import { formatDateTime } from '@/components/ui/format-date';
import { HISTORY_CATEGORY_LABELS, type HistoryCategory } from '@/lib/audit/describe-event';
import type { HistoryEvent } from '@/lib/data/audit-trail';

/** Decisions and analysis stand out in copper, bench work in flux; the rest stays quiet. */
const CATEGORY_TONES: Record<HistoryCategory, BadgeTone> = {
  study: 'neutral',
  members: 'neutral',
  coils: 'neutral',
  setups: 'neutral',
  plans: 'neutral',
  readings: 'flux',
  files: 'flux',
  review: 'copper',
  other: 'neutral',
};

/** One line of the history: when (local time; the exact UTC instant on hover), who, what, which plan. */
export function HistoryEntry({ studyId, event }: { studyId: number; event: HistoryEvent }) {
  return (
    <li className="flex flex-col gap-1 border-b border-ink-100 px-5 py-3 last:border-b-0 sm:flex-row sm:items-baseline sm:gap-4">
      <time dateTime={event.at} title={event.at} className="w-40 shrink-0 text-xs tabular-nums text-ink-500">
        {formatDateTime(event.at)}
      </time>
      <p className="min-w-0 flex-1 text-sm text-ink-800">
        <span className="font-medium text-ink-900">{event.actor?.name ?? 'Someone no longer on Couplet'}</span> {event.sentence}
      </p>
      <div className="flex shrink-0 items-center gap-3">
        {event.planId !== null && event.planName !== null && (
          <Link href={`/studies/${studyId}/plans/${event.planId}`} className="max-w-48 truncate text-sm font-medium text-flux-700 hover:underline">
            <span className="sr-only">Open the plan </span>
            {event.planName}
          </Link>
        )}
        <Badge tone={CATEGORY_TONES[event.category]}>{HISTORY_CATEGORY_LABELS[event.category]}</Badge>
      </div>
    </li>
  );
}
