'use client';

import { useId, useState } from 'react';
import { Button } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { StudyCreateForm } from './study-create-form';

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
