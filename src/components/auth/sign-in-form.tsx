'use client';

import { signIn } from 'next-auth/react';
import { useRouter } from 'next/navigation';
import { useState, type FormEvent } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';

/**
 * E-mail and password sign-in. The server's messages are shown as they come (wrong password,
 * disabled account, "Too many failed sign-ins ..."): they are written for the user.
 */
export function SignInForm({ callbackUrl, defaultEmail = '' }: { callbackUrl?: string; defaultEmail?: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    setPending(true);
    setError(null);
    try {
      const result = await signIn('credentials', {
        email: String(form.get('email') ?? ''),
        password: String(form.get('password') ?? ''),
        redirect: false,
      });
      if (!result || result.error) {
        setError(result?.error ?? 'Sign-in did not complete. Try again.');
        setPending(false);
        return;
      }
      router.push(callbackUrl || '/dashboard');
      router.refresh();
    } catch {
      setError('Couplet could not be reached. Check your connection and try again.');
      setPending(false);
    }
  }

  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      {error && <Alert tone="error">{error}</Alert>}
      <TextField
        label="E-mail"
        name="email"
        type="email"
        autoComplete="username"
        defaultValue={defaultEmail}
        required
        autoFocus={!defaultEmail}
      />
      <TextField label="Password" name="password" type="password" autoComplete="current-password" required autoFocus={Boolean(defaultEmail)} />
      <Button type="submit" variant="primary" className="w-full" disabled={pending}>
        {pending ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
