'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { signInWithPassword } from '@/lib/auth/client-sign-in';
import { safeNext } from '@/lib/auth/safe-next';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { ErrorNote } from '@/components/ui/panel';

export function SignInForm({ next, email: initialEmail = '' }: { next: string; email?: string }) {
  const router = useRouter();
  const [email, setEmail] = useState(initialEmail);
  const [password, setPassword] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  return (
    <form
      className="space-y-4"
      onSubmit={async (e) => {
        e.preventDefault();
        setBusy(true);
        setError(null);
        const problem = await signInWithPassword(email, password);
        setBusy(false);
        if (problem) setError(problem);
        else {
          router.push(safeNext(next));
          router.refresh();
        }
      }}
    >
      <TextField
        label="E-mail"
        type="email"
        name="email"
        autoComplete="email"
        required
        value={email}
        onChange={(e) => setEmail(e.target.value)}
      />
      <TextField
        label="Password"
        type="password"
        name="password"
        autoComplete="current-password"
        required
        value={password}
        onChange={(e) => setPassword(e.target.value)}
      />
      <ErrorNote>{error}</ErrorNote>
      <Button type="submit" disabled={busy} className="w-full">
        {busy ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
