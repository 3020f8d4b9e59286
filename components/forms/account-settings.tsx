'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { api } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { ErrorNote, Panel } from '@/components/ui/panel';
import { formatDate, formatDateTime } from '@/lib/format/dates';

type Token = {
  id: string;
  name: string;
  prefix: string;
  createdAt: string;
  lastUsedAt: string | null;
};

export function AccountSettings({ notifyRunEmails }: { notifyRunEmails: boolean }) {
  const qc = useQueryClient();
  const tokens = useQuery({
    queryKey: ['tokens'],
    queryFn: () => api<{ tokens: Token[] }>('/api/tokens'),
  });
  const [name, setName] = useState('');
  const [fresh, setFresh] = useState<string | null>(null);
  const [notify, setNotify] = useState(notifyRunEmails);
  const [error, setError] = useState<string | null>(null);
  const create = useMutation({
    mutationFn: () => api<{ token: string }>('/api/tokens', { method: 'POST', json: { name } }),
    onSuccess: (r) => {
      setFresh(r.token);
      setName('');
      qc.invalidateQueries({ queryKey: ['tokens'] });
    },
    onError: (e) => setError(e.message),
  });
  const router = useRouter();
  const endSessions = useMutation({
    mutationFn: () => api('/api/account/sessions/revoke', { method: 'POST' }),
    onSuccess: () => {
      router.push('/signin');
      router.refresh();
    },
    onError: (e) => setError(e.message),
  });
  const revoke = useMutation({
    mutationFn: (id: string) => api(`/api/tokens/${id}`, { method: 'DELETE' }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['tokens'] }),
  });
  return (
    <div className="space-y-6">
      <Panel title="Personal API tokens">
        <p className="mb-3 text-sm text-ink-soft">
          Scripts and notebooks send a token as{' '}
          <code className="font-mono">Authorization: Bearer …</code>. A token acts with your roles
          in every project; revoke it when it is no longer needed.
        </p>
        <form
          className="flex items-end gap-3"
          onSubmit={(e) => {
            e.preventDefault();
            setError(null);
            create.mutate();
          }}
        >
          <div className="flex-1">
            <TextField
              label="Token name"
              name="tokenName"
              placeholder="e.g. analysis notebook"
              required
              value={name}
              onChange={(e) => setName(e.target.value)}
            />
          </div>
          <Button type="submit">Create token</Button>
        </form>
        {fresh && (
          <div className="mt-3 rounded-md border border-ok/40 bg-ok/5 p-3 text-sm">
            <p className="font-medium">Copy it now — it is shown only once:</p>
            <code data-testid="new-token" className="mt-1 block break-all font-mono">
              {fresh}
            </code>
          </div>
        )}
        <ErrorNote>{error}</ErrorNote>
        <ul className="mt-4 divide-y divide-rule text-sm">
          {tokens.data?.tokens.map((t) => (
            <li key={t.id} className="flex items-center justify-between py-2">
              <span>
                <b>{t.name}</b> <code className="font-mono text-ink-soft">{t.prefix}…</code>{' '}
                <span className="text-ink-soft">
                  created {formatDate(t.createdAt)}
                  {t.lastUsedAt ? `, last used ${formatDateTime(t.lastUsedAt)}` : ''}
                </span>
              </span>
              <Button variant="quiet" onClick={() => revoke.mutate(t.id)}>
                Revoke
              </Button>
            </li>
          ))}
        </ul>
      </Panel>
      <Panel title="Sessions">
        <p className="mb-3 text-sm text-ink-soft">
          Ends every session of this account on every device, this one too. Personal API tokens keep
          working (revoke them above); a password reset ends sessions and revokes tokens.
        </p>
        <Button
          variant="quiet"
          onClick={() => endSessions.mutate()}
          disabled={endSessions.isPending}
        >
          Sign out everywhere
        </Button>
      </Panel>
      <Panel title="Notifications">
        <label className="flex items-center gap-2 text-sm">
          <input
            type="checkbox"
            checked={notify}
            onChange={async (e) => {
              setNotify(e.target.checked);
              await api('/api/account', {
                method: 'PATCH',
                json: { notifyRunEmails: e.target.checked },
              });
            }}
          />
          E-mail me when a link run I started ends after running for more than a minute.
        </label>
      </Panel>
    </div>
  );
}
