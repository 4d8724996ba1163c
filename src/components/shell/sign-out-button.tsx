'use client';

import { signOut } from 'next-auth/react';
import { useState } from 'react';
import { Button, type ButtonVariant } from '@/components/ui/button';

/** Ends the session and lands on the sign-in page (or `callbackUrl`, e.g. back to an invitation). */
export function SignOutButton({ callbackUrl = '/signin', label = 'Sign out', variant = 'ghost' }: { callbackUrl?: string; label?: string; variant?: ButtonVariant }) {
  const [pending, setPending] = useState(false);
  return (
    <Button
      variant={variant}
      size="sm"
      disabled={pending}
      onClick={() => {
        setPending(true);
        void signOut({ callbackUrl });
      }}
    >
      {label}
    </Button>
  );
}
