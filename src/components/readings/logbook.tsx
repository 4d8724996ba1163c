'use client';

import Link from 'next/link';
import { useMemo, useState } from 'react';
import { Alert } from '@/components/ui/alert';
import { Badge } from '@/components/ui/badge';
import { buttonClasses } from '@/components/ui/button';
import { cn } from '@/components/ui/cn';
import { PageHeader } from '@/components/ui/page-header';
import { Panel } from '@/components/ui/panel';
import { Skeleton } from '@/components/ui/skeleton';
import { PlanStateBadge } from '@/components/plans/plan-badges';
import { PlanStateActions } from '@/components/plans/plan-state-actions';
import { STATE_LABEL, type Plan, type PlanPoint } from '@/components/plans/plan-types';
import { useCautionAcknowledgement } from '@/hooks/use-caution-acknowledgement';
import { usePlan } from '@/hooks/use-plan';
import { usePlanPoints } from '@/hooks/use-plan-points';
import { usePlanReadings } from '@/hooks/use-plan-readings';
import { AttachmentsPanel } from './attachments-panel';
import { CautionAcknowledgement } from './caution-acknowledgement';
import { CsvImport } from './csv-import';
import { formatQuantityValue } from './format-measured';
import { PointComments } from './point-comments';
import { PointReadings } from './point-readings';
import { poseLabel } from './pose-label';
import { INITIAL_CIRCUMSTANCES, ReadingForm, type BenchCircumstances } from './reading-form';
import { MEASUREMENT_METHODS, type MeasurementMethod, type Reading } from './reading-types';

/** Short tags for the point list, so a glance shows which methods a point already has. */
const METHOD_TAG: Record<MeasurementMethod, string> = {
  open_circuit: 'Voc',
  aiding_opposing: 'La/Lo',
  short_open: 'Lsc/Loc',
  two_port: 'Z',
  split_peaks: 'fl/fh',
  direct_power: 'P',
};

interface LogbookProps {
  studyId: number;
  planId: number;
  viewerId: number;
  allowedActions: readonly string[];
  /** the plan as the server page read it, shown at once while SWR revalidates */
  initialPlan?: Plan;
}

type Filter = 'all' | 'open';

function PointList({ points, loggedByPoint, selectedId, onSelect }: {
  points: PlanPoint[];
  loggedByPoint: Map<number, MeasurementMethod[]>;
  selectedId: number | null;
  onSelect: (id: number) => void;
}) {
  const [filter, setFilter] = useState<Filter>('all');
  const shown = filter === 'all' ? points : points.filter((p) => !loggedByPoint.has(p.id));
  return (
    <div>
      <div className="flex gap-1 border-b border-ink-100 px-4 py-2" role="group" aria-label="Which points">
        {(['all', 'open'] as const).map((f) => (
          <button
            key={f}
            type="button"
            aria-pressed={filter === f}
            onClick={() => setFilter(f)}
            className={cn('rounded-md px-2.5 py-1 text-xs font-medium', filter === f ? 'bg-ink-800 text-white' : 'text-ink-600 hover:bg-ink-100')}
          >
            {f === 'all' ? `All ${points.length}` : `Without readings ${points.filter((p) => !loggedByPoint.has(p.id)).length}`}
          </button>
        ))}
      </div>
      <ol className="max-h-[36rem] overflow-y-auto" aria-label="Points in measurement order">
        {shown.map((point) => {
          const logged = loggedByPoint.get(point.id) ?? [];
          const selected = point.id === selectedId;
          return (
            <li key={point.id}>
              <button
                type="button"
                onClick={() => onSelect(point.id)}
                aria-current={selected ? 'true' : undefined}
                className={cn(
                  'flex w-full items-start gap-3 border-b border-ink-100 px-4 py-2 text-left text-sm',
                  selected ? 'bg-copper-50' : 'hover:bg-ink-50',
                )}
              >
                <span className="w-9 shrink-0 font-mono text-xs tabular-nums text-ink-500">#{point.seq}</span>
                <span className="min-w-0 flex-1">
                  <span className="block truncate text-ink-900">{poseLabel(point.pose)}</span>
                  <span className="mt-0.5 flex flex-wrap gap-1">
                    {point.isReference && <Badge tone="flux">reference</Badge>}
                    {point.repeatIndex > 1 && <Badge>repeat {point.repeatIndex}</Badge>}
                    {logged.map((m) => (
                      <Badge key={m} tone="copper">
                        {METHOD_TAG[m]}
                      </Badge>
                    ))}
                  </span>
                </span>
              </button>
            </li>
          );
        })}
        {shown.length === 0 && <li className="px-4 py-6 text-sm text-ink-600">Every point has a reading.</li>}
      </ol>
    </div>
  );
}

function PredictedLine({ point }: { point: PlanPoint }) {
  if (!point.predicted) return <p className="text-sm text-ink-600">Not predicted yet.</p>;
  const p = point.predicted;
  return (
    <p className="text-sm text-ink-700">
      Predicted: M {formatQuantityValue(p.mutualInductance, 'mutualInductance')} · k {formatQuantityValue(p.coupling, 'coupling')} · efficiency{' '}
      {formatQuantityValue(p.efficiency, 'efficiency')}
    </p>
  );
}

/**
 * The bench's logbook for one plan: pick a point, log what the instruments read, see the derived values
 * next to the prediction, correct with a reason, import a CSV, attach photos and files, and send the
 * plan for review. Supervisors and admins see the same page read-only.
 */
export function Logbook({ studyId, planId, viewerId, allowedActions, initialPlan }: LogbookProps) {
  const canLog = allowedActions.includes('readings.log');
  const { plan, error, mutate: mutatePlan } = usePlan(studyId, planId, initialPlan);
  const { points } = usePlanPoints(studyId, planId);
  const { readings, mutate: mutateReadings } = usePlanReadings(studyId, planId);
  const { acknowledgement, mutate: mutateAcknowledgement } = useCautionAcknowledgement(studyId, planId);
  const [selectedId, setSelectedId] = useState<number | null>(null);
  const [correcting, setCorrecting] = useState<Reading | null>(null);
  const [circumstances, setCircumstances] = useState<BenchCircumstances>(INITIAL_CIRCUMSTANCES);
  const [saved, setSaved] = useState<string | null>(null);

  const loggedByPoint = useMemo(() => {
    const map = new Map<number, MeasurementMethod[]>();
    for (const r of readings ?? []) {
      const list = map.get(r.pointId) ?? [];
      if (!list.includes(r.method)) map.set(r.pointId, [...list, r.method]);
    }
    // tags in the methods' own order, whatever order they were logged in
    for (const [id, list] of map) map.set(id, MEASUREMENT_METHODS.filter((m) => list.includes(m)));
    return map;
  }, [readings]);

  if (error) return <Alert tone="error">{error.status === 404 ? 'This plan does not exist on this study.' : error.message}</Alert>;
  if (!plan || !points) return <Skeleton label="Loading the logbook" rows={6} />;

  const onBench = plan.state === 'on_bench';
  const acknowledged = Boolean(acknowledgement?.acknowledgedAt);
  const mayLogNow = canLog && onBench && acknowledged;
  // by default: the next point to measure for those who log, the first measured one for those who read
  const selected =
    points.find((p) => p.id === selectedId) ??
    points.find((p) => (mayLogNow ? !loggedByPoint.has(p.id) : loggedByPoint.has(p.id))) ??
    points[0];
  const pointReadings = (readings ?? []).filter((r) => r.pointId === selected?.id);
  const canCorrect = (first: Reading) => mayLogNow && first.createdBy.id === viewerId;
  const refresh = () => {
    void mutateReadings();
    void mutatePlan();
  };

  return (
    <div className="space-y-6">
      <PageHeader
        title={`Logbook: ${plan.name}`}
        description={
          <span className="flex flex-wrap items-center gap-2">
            <PlanStateBadge state={plan.state} />
            <span>
              {loggedByPoint.size.toLocaleString('en')} of {points.length.toLocaleString('en')} points have readings
            </span>
            <Link href={`/studies/${studyId}/plans/${planId}`} className="font-medium text-copper-700 hover:underline">
              Plan and predictions
            </Link>
            <Link href={`/studies/${studyId}/plans/${planId}/review`} className="font-medium text-copper-700 hover:underline">
              Review
            </Link>
          </span>
        }
        actions={<PlanStateActions studyId={studyId} plan={plan} allowedActions={allowedActions} onChanged={(next: Plan) => void mutatePlan({ plan: next })} />}
      />

      {!onBench && (
        <Alert tone="info">
          This plan is {STATE_LABEL[plan.state]}: readings are logged only while it is on the bench. What was logged is shown below.
        </Alert>
      )}
      {onBench && !canLog && <Alert tone="info">Your role on this study shows the readings; students and researchers log them.</Alert>}
      {canLog && onBench && acknowledgement && !acknowledged && (
        <CautionAcknowledgement studyId={studyId} planId={planId} onAcknowledged={(a) => void mutateAcknowledgement({ acknowledgement: a })} />
      )}

      <div className="grid gap-6 lg:grid-cols-[minmax(0,22rem)_minmax(0,1fr)]">
        <Panel title="Points" description="In measurement order." flush>
          <PointList
            points={points}
            loggedByPoint={loggedByPoint}
            selectedId={selected?.id ?? null}
            onSelect={(id) => {
              setSelectedId(id);
              setCorrecting(null);
              setSaved(null);
            }}
          />
        </Panel>

        {selected && (
          <div className="space-y-6">
            <Panel title={`Point ${selected.seq}`} description={poseLabel(selected.pose)}>
              <div className="space-y-4">
                <PredictedLine point={selected} />
                {saved && (
                  <Alert tone="success">
                    <span role="status">{saved}</span>
                  </Alert>
                )}
                <PointComments studyId={studyId} planId={planId} pointId={selected.id} />
                <PointReadings
                  readings={pointReadings}
                  predicted={selected.predicted}
                  canCorrect={canCorrect}
                  onCorrect={(reading) => {
                    setCorrecting(reading);
                    setSaved(null);
                  }}
                />
              </div>
            </Panel>

            {mayLogNow && (
              <Panel
                title={correcting ? `Correct version ${correcting.version}` : 'Log a reading'}
                description={correcting ? 'The correction becomes a new version; this one stays in the history.' : `At point ${selected.seq}.`}
              >
                <ReadingForm
                  key={`${selected.id}-${correcting?.id ?? 'new'}`}
                  studyId={studyId}
                  planId={planId}
                  point={selected}
                  loggedMethods={loggedByPoint.get(selected.id) ?? []}
                  correcting={correcting ?? undefined}
                  circumstances={circumstances}
                  onCancel={correcting ? () => setCorrecting(null) : undefined}
                  onSaved={(reading, used) => {
                    // stay on this point: the next reading is often another method at the same pose
                    setSelectedId(selected.id);
                    setCircumstances(used);
                    setCorrecting(null);
                    setSaved(
                      reading.version > 1
                        ? `Saved version ${reading.version} of the reading at point ${selected.seq}.`
                        : `Saved the reading at point ${selected.seq}.`,
                    );
                    refresh();
                  }}
                />
              </Panel>
            )}
          </div>
        )}
      </div>

      {mayLogNow && (
        <Panel title="Import readings from a CSV file" description="Many readings at once: map the columns, check every row, then import all of them or none.">
          <CsvImport studyId={studyId} planId={planId} canImport={mayLogNow} onImported={refresh} />
        </Panel>
      )}

      <AttachmentsPanel
        studyId={studyId}
        planId={planId}
        points={points.map((p) => ({ id: p.id, seq: p.seq, label: `#${p.seq} · ${poseLabel(p.pose)}` }))}
        canUpload={canLog && onBench}
        selectedPointId={selected?.id ?? null}
      />

      <p className={cn('text-xs text-ink-500')}>
        <Link href={`/studies/${studyId}/plans/${planId}`} className={buttonClasses('ghost', 'sm')}>
          Back to the plan
        </Link>
      </p>
    </div>
  );
}
