'use client';

import { useEffect, useRef, useState, type FormEvent } from 'react';
import { Alert } from '@/components/ui/alert';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { SelectField } from '@/components/ui/select';
import { TextAreaField } from '@/components/ui/field';
import { Skeleton } from '@/components/ui/skeleton';
import { formatDateTime } from '@/components/ui/format-date';
import { usePlanComments } from '@/hooks/use-plan-comments';
import { fetchJson } from '@/lib/client/fetch-json';
import type { PlanComment } from '@/lib/review/types';
import { failureMessage } from './failure';

/** Longest comment the API accepts. */
export const COMMENT_MAX = 4000;

export interface CommentTarget {
  pointId: number;
  /** changes on every request, so asking twice for the same point still brings the form into view */
  requestedAt: number;
}

interface CommentsPanelProps {
  studyId: number;
  planId: number;
  /** every point of the plan, for the "about" selector */
  points: { id: number; label: string }[];
  canWrite: boolean;
  target: CommentTarget | null;
}

function CommentItem({ comment }: { comment: PlanComment }) {
  return (
    <li className="space-y-1 border-b border-ink-100 px-5 py-3 last:border-b-0">
      <p className="flex flex-wrap items-center gap-2 text-xs text-ink-600">
        <span className="font-semibold text-ink-900">{comment.author.name}</span>
        <Badge>{comment.author.role}</Badge>
        <time dateTime={comment.createdAt}>{formatDateTime(comment.createdAt)}</time>
        <span>· {comment.pointId === null ? 'on the plan' : `on point ${comment.seq}`}</span>
      </p>
      <p className="whitespace-pre-wrap text-sm text-ink-800">{comment.body}</p>
    </li>
  );
}

/** Comments on the plan and its points, oldest first; members who may comment get the form. */
export function CommentsPanel({ studyId, planId, points, canWrite, target }: CommentsPanelProps) {
  const { comments, error, mutate } = usePlanComments(studyId, planId);
  const [about, setAbout] = useState('plan');
  const [body, setBody] = useState('');
  const [busy, setBusy] = useState(false);
  const [formError, setFormError] = useState<string | null>(null);
  const form = useRef<HTMLFormElement>(null);

  useEffect(() => {
    if (!target) return;
    setAbout(String(target.pointId));
    form.current?.scrollIntoView({ behavior: 'smooth', block: 'center' });
    form.current?.querySelector('textarea')?.focus({ preventScroll: true });
  }, [target]);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    const text = body.trim();
    if (text.length === 0) {
      setFormError('Write the comment first.');
      return;
    }
    setBusy(true);
    setFormError(null);
    try {
      const pointId = about === 'plan' ? null : Number(about);
      const created = await fetchJson<PlanComment>(`/api/studies/${studyId}/plans/${planId}/comments`, { method: 'POST', body: { pointId, body: text } });
      setBody('');
      await mutate((list) => [...(list ?? []), created], { revalidate: true });
    } catch (failure) {
      setFormError(failureMessage(failure));
    } finally {
      setBusy(false);
    }
  };

  return (
    <div>
      {error && <Alert tone="error" className="m-4">{error.message}</Alert>}
      {!comments && !error && <Skeleton label="Loading the comments" className="p-5" />}
      {comments && comments.length === 0 && <p className="px-5 py-4 text-sm text-ink-600">No comments yet.</p>}
      {comments && comments.length > 0 && (
        <ol aria-label="Comments, oldest first">
          {comments.map((c) => (
            <CommentItem key={c.id} comment={c} />
          ))}
        </ol>
      )}
      {canWrite && (
        <form ref={form} onSubmit={submit} aria-label="Write a comment" className="space-y-3 border-t border-ink-100 px-5 py-4">
          <SelectField
            label="About"
            value={about}
            onChange={(e) => setAbout(e.target.value)}
            options={[{ value: 'plan', label: 'the plan as a whole' }, ...points.map((p) => ({ value: String(p.id), label: p.label }))]}
            className="max-w-md"
          />
          <TextAreaField label="Comment" value={body} maxLength={COMMENT_MAX} onChange={(e) => setBody(e.target.value)} rows={3} error={formError ?? undefined} />
          <Button type="submit" variant="primary" disabled={busy}>
            {busy ? 'Posting…' : 'Post comment'}
          </Button>
        </form>
      )}
    </div>
  );
}
