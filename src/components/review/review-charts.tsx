'use client';

import dynamic from 'next/dynamic';
import { Skeleton } from '@/components/ui/skeleton';

/** ECharts loads in the browser only, and only on the review page. */
export const ReviewCharts = dynamic(() => import('./review-charts-view'), {
  ssr: false,
  loading: () => <Skeleton label="Loading the charts" rows={6} />,
});
