'use client';

import dynamic from 'next/dynamic';
import { useId, useState } from 'react';
import { Button } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { Skeleton } from '@/components/ui/skeleton';

/**
 * The form (with zod and react-hook-form, about a sixth of the dashboard's script) loads when someone
 * opens it, not with every visit to the dashboard.
 */
const StudyCreateForm = dynamic(() => import('./study-create-form').then((m) => m.StudyCreateForm), {
  ssr: false,
  loading: () => <Skeleton label="Opening the new study form…" rows={4} />,
});

/**
 * The dashboard heading. For people who may start studies it also holds the "New study" button,
 * which opens the form in place under the heading.
 */
export function StudiesHeader({ canCreate }: { canCreate: boolean }) {
  const [open, setOpen] = useState(false);
  const formId = useId();

  return (
    <div className="space-y-6">
      <PageHeader
        title="My studies"
        description="Studies you are a member of, with your role on each."
        actions={
          canCreate && !open ? (
            <Button variant="primary" aria-expanded={false} aria-controls={formId} onClick={() => setOpen(true)}>
              New study
            </Button>
          ) : null
        }
      />
      {canCreate && open && (
        <div id={formId}>
          <StudyCreateForm onCancel={() => setOpen(false)} />
        </div>
      )}
    </div>
  );
}
