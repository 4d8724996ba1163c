import Link from 'next/link';

/** "Studies / <study> / <page>": every step but the last is a link back. */
export function StudyBreadcrumb({ studyId, studyName, page }: { studyId: number; studyName: string; page?: string }) {
  return (
    <nav aria-label="Breadcrumb" className="text-sm text-ink-500">
      <Link href="/dashboard" className="hover:text-ink-800 hover:underline">
        Studies
      </Link>
      <span aria-hidden="true"> / </span>
      {page ? (
        <>
          <Link href={`/studies/${studyId}`} className="hover:text-ink-800 hover:underline">
            {studyName}
          </Link>
          <span aria-hidden="true"> / </span>
          <span className="text-ink-700">{page}</span>
        </>
      ) : (
        <span className="text-ink-700">{studyName}</span>
      )}
    </nav>
  );
}
