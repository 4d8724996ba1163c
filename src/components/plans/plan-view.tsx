'use client';

import Link from 'next/link';
import { useCallback, useState } from 'react';
import { useSWRConfig } from 'swr';
import { Alert } from '@/components/ui/alert';
import { Button, buttonClasses } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { Panel } from '@/components/ui/panel';
import { Skeleton } from '@/components/ui/skeleton';
import { usePlan } from '@/hooks/use-plan';
import { usePlanPoints } from '@/hooks/use-plan-points';
import { plansKey } from '@/hooks/use-plans';
import { useStudySetups } from '@/hooks/use-study-setups';
import type { Setup } from '@/lib/data/setups';
import { PlanStateBadge, PredictionBadge } from './plan-badges';
import { PlanCharts } from './plan-charts';
import { PlanDesigner } from './plan-designer';
import { PlanProgressPanel } from './plan-progress-panel';
import { PlanStateActions } from './plan-state-actions';
import { PlanSummary } from './plan-summary';
import type { Plan } from './plan-types';
import { RunSheet } from './run-sheet';

interface PlanViewProps {
  studyId: number;
  planId: number;
  allowedActions: readonly string[];
  initialSetups: Setup[];
  /** the plan as the server page read it, shown at once while SWR revalidates */
  initialPlan?: Plan;
}

/** One plan: its state and next step, predictions, charts and run sheet; a draft is editable by researchers. */
export function PlanView({ studyId, planId, allowedActions, initialSetups, initialPlan }: PlanViewProps) {
  const canEdit = allowedActions.includes('study.edit');
  const { plan, error, mutate: mutatePlan } = usePlan(studyId, planId, initialPlan);
  const { points, mutate: mutatePoints } = usePlanPoints(studyId, planId);
  const { setups } = useStudySetups(studyId, initialSetups);
  const { mutate } = useSWRConfig();
  const [editing, setEditing] = useState(false);

  const reload = useCallback(() => {
    void mutatePlan();
    void mutatePoints();
    void mutate(plansKey(studyId));
  }, [mutatePlan, mutatePoints, mutate, studyId]);

  if (error) return <Alert tone="error">{error.status === 404 ? 'This plan does not exist on this study.' : error.message}</Alert>;
  if (!plan) return <Skeleton label="Loading the plan" rows={5} />;

  const editable = canEdit && plan.state === 'draft';
  const replace = (next: Plan) => {
    void mutatePlan({ plan: next }, { revalidate: true });
    reload();
  };
  const predicted = (points ?? []).some((p) => p.predicted !== null);
  const base = `/api/studies/${studyId}/plans/${plan.id}`;

  return (
    <div className="space-y-6">
      <PageHeader
        title={plan.name}
        description={
          <span className="flex flex-wrap items-center gap-2">
            <PlanStateBadge state={plan.state} />
            <span>
              {plan.pointCount.toLocaleString('en')} points · prediction <PredictionBadge status={plan.prediction.status} />
            </span>
          </span>
        }
        actions={<PlanStateActions studyId={studyId} plan={plan} allowedActions={allowedActions} onChanged={replace} />}
      />

      {editing && editable ? (
        <PlanDesigner
          studyId={studyId}
          initialSetups={initialSetups}
          plan={plan}
          onSaved={(saved) => {
            setEditing(false);
            replace(saved);
          }}
          onCancel={() => setEditing(false)}
        />
      ) : (
        <Panel
          title="Plan"
          description={plan.state === 'draft' ? 'A draft: its axes can still change.' : 'Frozen: only a draft changes its axes.'}
          actions={
            editable ? (
              <Button size="sm" onClick={() => setEditing(true)}>
                Edit plan
              </Button>
            ) : (
              plan.state !== 'draft' && (
                <>
                  <Link href={`/studies/${studyId}/plans/${plan.id}/logbook`} className={buttonClasses('primary', 'sm')}>
                    Open the logbook
                  </Link>
                  <Link href={`/studies/${studyId}/plans/${plan.id}/review`} className={buttonClasses('secondary', 'sm')}>
                    Open the review
                  </Link>
                </>
              )
            )
          }
        >
          <PlanSummary plan={plan} setups={setups} />
        </Panel>
      )}

      <Panel title="Predictions">
        <PlanProgressPanel studyId={studyId} plan={plan} canEdit={canEdit} onChanged={reload} />
      </Panel>

      {predicted && points && (
        <Panel title="Charts" description="Predicted values over the plan's axes; other axes held at their first value.">
          <PlanCharts axes={plan.axes} points={points} planName={plan.name} />
        </Panel>
      )}

      <Panel
        title="Run sheet"
        description="Every point in measurement order."
        flush
        actions={
          <>
            <a href={`${base}/points.csv`} download className={buttonClasses('secondary', 'sm')}>
              Download CSV
            </a>
            <Link href={`/studies/${studyId}/plans/${plan.id}/print`} className={buttonClasses('secondary', 'sm')}>
              Printable run sheet
            </Link>
          </>
        }
      >
        {points ? <RunSheet axes={plan.axes} points={points} /> : <Skeleton label="Loading the points" className="p-5" />}
      </Panel>
    </div>
  );
}
