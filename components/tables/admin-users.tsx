'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { api } from '@/lib/api-client';
import { ErrorNote } from '@/components/ui/panel';

type U = {
  id: string;
  email: string;
  name: string;
  siteRole: 'admin' | 'member';
  createdAt: string;
};

export function AdminUsers({ myId }: { myId: string }) {
  const qc = useQueryClient();
  const [error, setError] = useState<string | null>(null);
  const { data } = useQuery({
    queryKey: ['admin-users'],
    queryFn: () => api<{ users: U[] }>('/api/admin/users'),
  });
  const setRole = useMutation({
    mutationFn: (v: { id: string; siteRole: string }) =>
      api(`/api/admin/users/${v.id}`, { method: 'PATCH', json: { siteRole: v.siteRole } }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['admin-users'] }),
    onError: (e) => setError(e.message),
  });
  return (
    <>
      <ErrorNote>{error}</ErrorNote>
      <table className="w-full rounded-lg border border-rule bg-white/70 text-sm">
        <thead className="text-left text-xs text-ink-soft">
          <tr>
            <th className="px-3 py-2">Name</th>
            <th>E-mail</th>
            <th>Site role</th>
            <th>Joined</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-rule">
          {data?.users.map((u) => (
            <tr key={u.id}>
              <td className="px-3 py-2">{u.name}</td>
              <td>{u.email}</td>
              <td>
                <select
                  aria-label={`Site role of ${u.email}`}
                  disabled={u.id === myId}
                  className="rounded border border-rule bg-white px-2 py-1"
                  value={u.siteRole}
                  onChange={(e) => setRole.mutate({ id: u.id, siteRole: e.target.value })}
                >
                  <option value="member">member</option>
                  <option value="admin">admin</option>
                </select>
              </td>
              <td className="num pr-3">{new Date(u.createdAt).toISOString().slice(0, 10)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </>
  );
}
