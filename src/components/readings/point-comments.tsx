'use client';

import Link from 'next/link';
import { formatDateTime } from '@/components/ui/format-date';
import { usePlanComments } from '@/hooks/use-plan-comments';

/**
 * What reviewers and colleagues said about this point, where the student can act on it: at the bench,
 * next to the readings they may need to correct. Writing comments stays on the review page.
 */
export function PointComments({ studyId, planId, pointId }: { studyId: number; planId: number; pointId: number }) {
  const { comments } = usePlanComments(studyId, planId);
  const here = (comments ?? []).filter((c) => c.pointId === pointId);
  if (here.length === 0) return null;
  return (
    <section aria-label="Comments on this point" className="rounded-md border border-ink-200 bg-ink-50 p-3">
      <h3 className="text-sm font-semibold text-ink-800">Comments on this point</h3>
      <ul className="mt-2 space-y-2">
        {here.map((c) => (
          <li key={c.id} className="text-sm">
            <p className="text-xs text-ink-500">
              <span className="font-medium text-ink-700">{c.author.name}</span> ({c.author.role}), {formatDateTime(c.createdAt)}
            </p>
            <p className="whitespace-pre-wrap text-ink-800">{c.body}</p>
          </li>
        ))}
      </ul>
      <Link href={`/studies/${studyId}/plans/${planId}/review`} className="mt-2 inline-block text-xs font-medium text-copper-700 hover:underline">
        Reply on the review page
      </Link>
    </section>
  );
}
