'use client';

import { useActionState } from 'react';
import type { JoinState } from '@/app/invite/[token]/actions';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';

type Action = (state: JoinState, formData: FormData) => Promise<JoinState>;

/** One button for a signed-in invitee; `action` is the server action with the token bound. */
export function JoinStudyForm({ action }: { action: Action }) {
  const [state, formAction, pending] = useActionState(action, {});
  return (
    <form action={formAction} className="space-y-4">
      {state.message && <Alert tone="error">{state.message}</Alert>}
      <Button type="submit" variant="primary" className="w-full" disabled={pending}>
        Join study
      </Button>
    </form>
  );
}
