'use client';

import Link from 'next/link';
import { useState } from 'react';
import { api } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { ErrorNote } from '@/components/ui/panel';
import { RESET_CONSEQUENCES } from '@/lib/schemas/account';

export function ResetRequestForm() {
  const [email, setEmail] = useState('');
  const [sent, setSent] = useState(false);
  const [error, setError] = useState<string | null>(null);
  if (sent)
    return (
      <p className="text-sm">
        If an account uses <b>{email}</b>, a reset link is on its way. It works once, for one hour.
      </p>
    );
  return (
    <form
      className="space-y-4"
      onSubmit={async (e) => {
        e.preventDefault();
        try {
          await api('/api/account/password-reset', { method: 'POST', json: { email } });
          setSent(true);
        } catch (err) {
          setError(err instanceof Error ? err.message : String(err));
        }
      }}
    >
      <TextField
        label="E-mail"
        type="email"
        name="email"
        required
        value={email}
        onChange={(e) => setEmail(e.target.value)}
      />
      <p className="text-sm text-ink-soft">{RESET_CONSEQUENCES}</p>
      <ErrorNote>{error}</ErrorNote>
      <Button type="submit" className="w-full">
        Send reset link
      </Button>
    </form>
  );
}

export function ResetConfirmForm({ token }: { token: string }) {
  const [password, setPassword] = useState('');
  const [done, setDone] = useState(false);
  const [error, setError] = useState<string | null>(null);
  if (done)
    return (
      <p className="text-sm">
        Your password is changed. Every session has ended and your API tokens are revoked.{' '}
        <Link className="text-accent underline" href="/signin">
          Sign in
        </Link>
      </p>
    );
  return (
    <form
      className="space-y-4"
      onSubmit={async (e) => {
        e.preventDefault();
        try {
          await api('/api/account/password-reset/confirm', {
            method: 'POST',
            json: { token, password },
          });
          setDone(true);
        } catch (err) {
          setError(err instanceof Error ? err.message : String(err));
        }
      }}
    >
      <TextField
        label="New password"
        type="password"
        name="password"
        minLength={10}
        required
        value={password}
        onChange={(e) => setPassword(e.target.value)}
        hint="At least 10 characters."
      />
      <p className="text-sm text-ink-soft">{RESET_CONSEQUENCES}</p>
      <ErrorNote>{error}</ErrorNote>
      <Button type="submit" className="w-full">
        Set new password
      </Button>
    </form>
  );
}
