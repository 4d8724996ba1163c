import type { ReactNode } from 'react';
import { StudyBreadcrumb } from './study-breadcrumb';
import { StudyNav } from './study-nav';

interface StudyPageFrameProps {
  study: { id: number; name: string };
  /** The sub-page's name in the breadcrumb; none on the study's overview. */
  page?: string;
  /** What stands under the breadcrumb: the page header and any facts beside it. */
  header?: ReactNode;
  /** Vertical rhythm between header, tabs and content. */
  className?: string;
  children: ReactNode;
}

/** The frame every page of a study shares: breadcrumb, header, the study's tabs, then the page itself. */
export function StudyPageFrame({ study, page, header, className = 'space-y-8', children }: StudyPageFrameProps) {
  return (
    <div className={className}>
      <div className="space-y-3">
        <StudyBreadcrumb studyId={study.id} studyName={study.name} page={page} />
        {header}
      </div>
      <StudyNav studyId={study.id} />
      {children}
    </div>
  );
}
