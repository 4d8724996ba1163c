'use client';

import Link from 'next/link';
import { useCallback, useMemo, useState } from 'react';
import { useSWRConfig } from 'swr';
import { PlanStateBadge } from '@/components/plans/plan-badges';
import type { Plan } from '@/components/plans/plan-types';
import { poseLabel } from '@/components/readings/pose-label';
import { Alert } from '@/components/ui/alert';
import { buttonClasses } from '@/components/ui/button';
import { cn } from '@/components/ui/cn';
import { formatDateTime } from '@/components/ui/format-date';
import { PageHeader } from '@/components/ui/page-header';
import { Panel } from '@/components/ui/panel';
import { Skeleton } from '@/components/ui/skeleton';
import { usePlan } from '@/hooks/use-plan';
import { plansKey } from '@/hooks/use-plans';
import { planReviewBase, usePlanReview, useRefreshPlanReview } from '@/hooks/use-plan-review';
import { REVIEW_QUANTITIES, REVIEW_QUANTITY_LABELS, type PlanReview as Review, type ReviewQuantity } from '@/lib/review/types';
import { CommentsPanel, type CommentTarget } from './comments-panel';
import { DecisionForm, DecisionHistory } from './decision-panel';
import { standingReturn } from './decisions';
import { FitPanel } from './fit-panel';
import { PointTable } from './point-table';
import { ReviewCharts } from './review-charts';
import { SummaryFigures } from './summary-panel';

interface PlanReviewProps {
  studyId: number;
  planId: number;
  /** the viewer's allowed actions on the study (permissions.ts) */
  allowedActions: readonly string[];
  /** the plan as the server page read it, shown at once while SWR revalidates */
  initialPlan?: Plan;
}

function QuantitySwitch({ value, onChange }: { value: ReviewQuantity; onChange: (q: ReviewQuantity) => void }) {
  return (
    <div role="group" aria-label="Quantity compared" className="inline-flex rounded-md border border-ink-200 bg-white p-0.5">
      {REVIEW_QUANTITIES.map((q) => (
        <button
          key={q}
          type="button"
          aria-pressed={value === q}
          onClick={() => onChange(q)}
          className={cn('rounded px-3 py-1.5 text-sm font-medium', value === q ? 'bg-ink-800 text-white' : 'text-ink-700 hover:bg-ink-100')}
        >
          <span className="font-serif italic">{REVIEW_QUANTITY_LABELS[q].symbol}</span> {REVIEW_QUANTITY_LABELS[q].label.toLowerCase()}
        </button>
      ))}
    </div>
  );
}

const slugOf = (name: string) => name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'plan';

/** Every point of the plan as "#7 · 10 cm · tilt 0°", in measurement order, for the comment form. */
function pointOptions(review: Review | undefined) {
  if (!review) return [];
  return review.poses
    .flatMap((pose) => pose.pointIds.map((id, i) => ({ id, seq: pose.seqs[i], label: `#${pose.seqs[i]} · ${poseLabel(pose.pose)}` })))
    .sort((a, b) => a.seq - b.seq);
}

/**
 * A plan's review: predicted against measured for k, M or η, the readings behind it, what reviewers
 * set aside and fitted, comments, and the supervisor's decision with its history.
 */
export function PlanReview({ studyId, planId, allowedActions, initialPlan }: PlanReviewProps) {
  const canAnalyse = allowedActions.includes('review.analyse');
  const canComment = allowedActions.includes('comments.write');
  const canDecide = allowedActions.includes('plan.decide');
  const canLog = allowedActions.includes('readings.log');
  const [quantity, setQuantity] = useState<ReviewQuantity>('coupling');
  const [commentTarget, setCommentTarget] = useState<CommentTarget | null>(null);
  const { plan, error: planError, mutate: mutatePlan } = usePlan(studyId, planId, initialPlan);
  const { review, error } = usePlanReview(studyId, planId, quantity);
  const refreshReview = useRefreshPlanReview(studyId, planId);
  const { mutate } = useSWRConfig();
  const points = useMemo(() => pointOptions(review), [review]);

  const afterDecision = useCallback(() => {
    void mutatePlan();
    void refreshReview();
    void mutate(plansKey(studyId));
  }, [mutatePlan, refreshReview, mutate, studyId]);

  if (planError) return <Alert tone="error">{planError.status === 404 ? 'This plan does not exist on this study.' : planError.message}</Alert>;
  if (!plan) return <Skeleton label="Loading the review" rows={6} />;

  const base = `/api/studies/${studyId}/plans/${planId}`;
  const reviewBase = planReviewBase(studyId, planId);
  const accepted = plan.state === 'accepted';
  const info = REVIEW_QUANTITY_LABELS[quantity];
  const decisions = review?.decisions ?? [];
  const returned = standingReturn(plan.state, decisions);

  return (
    <div className="space-y-6">
      <PageHeader
        title={`Review: ${plan.name}`}
        description={
          <span className="flex flex-wrap items-center gap-2">
            <PlanStateBadge state={plan.state} />
            <span>{plan.pointCount.toLocaleString('en')} points</span>
            <Link href={`/studies/${studyId}/plans/${planId}`} className="font-medium text-copper-700 hover:underline">
              Plan and predictions
            </Link>
            <Link href={`/studies/${studyId}/plans/${planId}/logbook`} className="font-medium text-copper-700 hover:underline">
              Logbook
            </Link>
          </span>
        }
        actions={
          <>
            <a href={`${base}/report.pdf`} download className={buttonClasses('secondary', 'sm')}>
              PDF report
            </a>
            <a href={`${base}/report.zip`} download className={buttonClasses('secondary', 'sm')}>
              CSV bundle (.zip)
            </a>
          </>
        }
      />

      {returned && (
        <div role="note" aria-label="Why the plan came back">
          <Alert tone="caution" title={`Returned to the bench by ${returned.reviewer.name}, ${formatDateTime(returned.createdAt)}`}>
            <p className="whitespace-pre-wrap">“{returned.reason}”</p>
            {canLog && (
              <p className="mt-2">
                <Link href={`/studies/${studyId}/plans/${planId}/logbook`} className="font-medium text-copper-700 underline">
                  Open the logbook
                </Link>{' '}
                to correct or add readings, then submit the plan for review again.
              </p>
            )}
          </Alert>
        </div>
      )}
      {plan.state === 'draft' && <Alert tone="info">This plan is a draft: nothing is measured before it is put on the bench.</Alert>}

      <Panel title="Agreement" description="Each distinct pose counts once, with the mean of its readings; points set aside are left out." actions={<QuantitySwitch value={quantity} onChange={setQuantity} />}>
        {error && <Alert tone="error">{error.message}</Alert>}
        {!review && !error && <Skeleton label={`Loading the review of ${info.label.toLowerCase()}`} rows={3} />}
        {review && review.quantity === quantity && (
          <SummaryFigures summary={review.summary} symbol={info.symbol} base={reviewBase} canSetTolerance={canAnalyse && !accepted} onChanged={refreshReview} />
        )}
      </Panel>

      {review && review.quantity === quantity && review.observations.length === 0 && (
        <Alert tone="info">Nothing measured yet for {info.symbol}: no current reading yields {info.label.toLowerCase()}.</Alert>
      )}

      {review && review.quantity === quantity && review.observations.length > 0 && (
        <>
          <Panel title="Charts" description="Measured against predicted; export any chart as PNG or SVG.">
            <ReviewCharts review={review} slug={slugOf(plan.name)} />
          </Panel>
          <Panel title="Points" description="One row per measured pose; open a row's readings to see each one." flush>
            <PointTable
              review={review}
              base={reviewBase}
              canMark={canAnalyse && !accepted}
              canComment={canComment}
              onComment={(pointId) => setCommentTarget({ pointId, requestedAt: Date.now() })}
              onChanged={refreshReview}
            />
          </Panel>
          {(canAnalyse || review.fit) && (
            <Panel title="Fit an effective parameter" description={`What one systematic error would explain the difference in ${info.symbol}?`}>
              <FitPanel review={review} base={reviewBase} canFit={canAnalyse} onFitted={refreshReview} />
            </Panel>
          )}
        </>
      )}

      <Panel title="Decision" description={plan.state === 'in_review' ? 'The plan is in review.' : `The plan is ${accepted ? 'accepted' : plan.state === 'on_bench' ? 'on the bench' : 'a draft'}.`}>
        <div className="space-y-4">
          {canDecide && plan.state === 'in_review' && <DecisionForm base={base} planName={plan.name} onDecided={afterDecision} />}
          {!canDecide && plan.state === 'in_review' && <p className="text-sm text-ink-600">A supervisor of the study accepts the plan or returns it to the bench.</p>}
          {review ? <DecisionHistory decisions={decisions} /> : <Skeleton label="Loading the decisions" rows={2} />}
        </div>
      </Panel>

      <Panel title="Comments" description="On the plan or on one of its points; every member of the study reads them." flush>
        <CommentsPanel studyId={studyId} planId={planId} points={points} canWrite={canComment} target={commentTarget} />
      </Panel>
    </div>
  );
}
