import Link from 'next/link';

/**
 * notFound() inside the signed-in pages: a study that does not exist and a study the viewer is not on
 * read the same, so neither discloses the other.
 */
export default function AppNotFound() {
  return (
    <div className="mx-auto max-w-lg space-y-4 py-16 text-center">
      <h1 className="text-xl font-semibold text-ink-900">Not found</h1>
      <p className="text-sm text-ink-600">This page does not exist, or you do not have access to it.</p>
      <Link href="/dashboard" className="text-sm font-medium text-flux-700 hover:underline">
        Back to your studies
      </Link>
    </div>
  );
}
