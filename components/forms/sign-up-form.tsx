'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { api } from '@/lib/api-client';
import { signInWithPassword } from '@/lib/auth/client-sign-in';
import { safeNext } from '@/lib/auth/safe-next';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { ErrorNote } from '@/components/ui/panel';

export function SignUpForm({ next, email: fixedEmail }: { next: string; email?: string }) {
  const router = useRouter();
  const [form, setForm] = useState({ name: '', email: fixedEmail ?? '', password: '' });
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  return (
    <form
      className="space-y-4"
      onSubmit={async (e) => {
        e.preventDefault();
        setBusy(true);
        setError(null);
        try {
          await api('/api/account/signup', { method: 'POST', json: form });
          const problem = await signInWithPassword(form.email, form.password);
          if (problem) throw new Error(problem);
          router.push(safeNext(next));
          router.refresh();
        } catch (err) {
          setError(err instanceof Error ? err.message : String(err));
          setBusy(false);
        }
      }}
    >
      <TextField
        label="Name"
        name="name"
        autoComplete="name"
        required
        value={form.name}
        onChange={(e) => setForm({ ...form, name: e.target.value })}
      />
      <TextField
        label="E-mail"
        type="email"
        name="email"
        autoComplete="email"
        required
        readOnly={!!fixedEmail}
        value={form.email}
        onChange={(e) => setForm({ ...form, email: e.target.value })}
      />
      <TextField
        label="Password"
        type="password"
        name="password"
        autoComplete="new-password"
        required
        minLength={10}
        hint="At least 10 characters."
        value={form.password}
        onChange={(e) => setForm({ ...form, password: e.target.value })}
      />
      <ErrorNote>{error}</ErrorNote>
      <Button type="submit" disabled={busy} className="w-full">
        {busy ? 'Creating account…' : 'Create account'}
      </Button>
    </form>
  );
}
