import { Skeleton } from '@/components/ui/skeleton';

/** Shown inside the app shell while a signed-in page renders on the server. */
export default function AppLoading() {
  return (
    <div className="space-y-6">
      <div aria-hidden="true" className="h-7 w-56 animate-pulse rounded bg-ink-200" />
      <div className="rounded-lg border border-ink-200 bg-white px-5 py-5 shadow-panel">
        <Skeleton label="Loading…" rows={4} />
      </div>
    </div>
  );
}
