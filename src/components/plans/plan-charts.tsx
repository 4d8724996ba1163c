'use client';

import dynamic from 'next/dynamic';
import { Skeleton } from '@/components/ui/skeleton';

/** ECharts loads in the browser only, and only on plan pages. */
export const PlanCharts = dynamic(() => import('./plan-charts-view'), {
  ssr: false,
  loading: () => <Skeleton label="Loading the charts" rows={6} />,
});
