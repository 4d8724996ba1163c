import Link from 'next/link';
import { StandalonePage } from '@/components/shell/standalone-page';

/** Unknown addresses, outside the signed-in shell. */
export default function NotFound() {
  return (
    <StandalonePage>
      <div className="space-y-4">
        <h1 className="text-xl font-semibold text-ink-900">Page not found</h1>
        <p className="text-sm text-ink-600">There is nothing at this address. It may have been mistyped, or the link is out of date.</p>
        <Link href="/dashboard" className="text-sm font-medium text-flux-700 hover:underline">
          Go to your studies
        </Link>
      </div>
    </StandalonePage>
  );
}
