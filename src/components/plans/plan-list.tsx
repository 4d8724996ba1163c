'use client';

import Link from 'next/link';
import { Alert } from '@/components/ui/alert';
import { Panel } from '@/components/ui/panel';
import { Skeleton } from '@/components/ui/skeleton';
import { Table, Td, Th } from '@/components/ui/table';
import { usePlans } from '@/hooks/use-plans';
import { AXIS_INFO } from './axis-units';
import { PlanStateBadge, PredictionBadge } from './plan-badges';
import { formatBenchTime } from './plan-count';

/** The study's plans with their state, size and prediction status. */
export function PlanList({ studyId }: { studyId: number }) {
  const { plans, error, isLoading } = usePlans(studyId);
  if (error) return <Alert tone="error">{error.message}</Alert>;
  if (isLoading || !plans) return <Skeleton label="Loading plans" />;
  if (plans.length === 0) {
    return (
      <Panel>
        <p className="text-sm text-ink-600">No sweep plans yet.</p>
      </Panel>
    );
  }
  return (
    <Panel flush>
      <Table caption="Sweep plans of this study">
        <thead>
          <tr>
            <Th>Plan</Th>
            <Th>State</Th>
            <Th>Axes</Th>
            <Th className="text-right">Points</Th>
            <Th className="text-right">Bench time</Th>
            <Th>Prediction</Th>
          </tr>
        </thead>
        <tbody>
          {plans.map((plan) => (
            <tr key={plan.id}>
              <Td>
                <Link href={`/studies/${studyId}/plans/${plan.id}`} className="font-medium text-flux-700 hover:underline">
                  {plan.name}
                </Link>
              </Td>
              <Td>
                <PlanStateBadge state={plan.state} />
              </Td>
              <Td className="text-ink-600">{plan.axes.map((a) => AXIS_INFO[a.quantity].label.toLowerCase()).join(' × ')}</Td>
              <Td className="text-right tabular-nums">{plan.pointCount.toLocaleString('en')}</Td>
              <Td className="text-right tabular-nums">{formatBenchTime(plan.estimatedMinutes)}</Td>
              <Td>
                <PredictionBadge status={plan.prediction.status} />
              </Td>
            </tr>
          ))}
        </tbody>
      </Table>
    </Panel>
  );
}
