'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { api } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { ErrorNote, Panel } from '@/components/ui/panel';

type Role = 'owner' | 'editor' | 'viewer';
type Members = {
  members: { userId: string; email: string; name: string; role: Role; since: string }[];
  invitations: { id: string; email: string; role: Role; expiresAt: string }[];
};

export function TeamManager({
  projectId,
  myId,
  isOwner,
}: {
  projectId: string;
  myId: string;
  isOwner: boolean;
}) {
  const qc = useQueryClient();
  const key = ['members', projectId];
  const { data } = useQuery({
    queryKey: key,
    queryFn: () => api<Members>(`/api/projects/${projectId}/members`),
  });
  const [email, setEmail] = useState('');
  const [role, setRole] = useState<Role>('editor');
  const [error, setError] = useState<string | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const act = useMutation({
    mutationFn: (fn: () => Promise<unknown>) => fn(),
    onSuccess: () => qc.invalidateQueries({ queryKey: key }),
    onError: (e) => setError(e.message),
  });
  const run = (fn: () => Promise<unknown>) => {
    setError(null);
    act.mutate(fn);
  };
  // A refused role change is told beside the select it came from, which snaps back to the role.
  const [roleError, setRoleError] = useState<{ userId: string; message: string } | null>(null);
  const roleChange = useMutation({
    mutationFn: ({ userId, role }: { userId: string; role: string }) =>
      api(`/api/projects/${projectId}/members/${userId}`, { method: 'PATCH', json: { role } }),
    onSuccess: () => qc.invalidateQueries({ queryKey: key }),
    onError: (e, { userId }) => setRoleError({ userId, message: e.message }),
  });
  const changeRole = (userId: string, role: string) => {
    setRoleError(null);
    setError(null);
    roleChange.mutate({ userId, role });
  };
  return (
    <div className="space-y-6">
      {isOwner && (
        <Panel title="Invite a colleague">
          <form
            className="flex flex-wrap items-end gap-3"
            onSubmit={(e) => {
              e.preventDefault();
              setNotice(null);
              run(async () => {
                await api(`/api/projects/${projectId}/members`, {
                  method: 'POST',
                  json: { email, role },
                });
                setNotice(`Invitation sent to ${email}.`);
                setEmail('');
              });
            }}
          >
            <div className="min-w-64 flex-1">
              <TextField
                label="E-mail"
                type="email"
                name="inviteEmail"
                required
                value={email}
                onChange={(e) => setEmail(e.target.value)}
              />
            </div>
            <SelectField
              label="Role"
              name="inviteRole"
              value={role}
              onChange={(e) => setRole(e.target.value as Role)}
            >
              <option value="viewer">viewer</option>
              <option value="editor">editor</option>
              <option value="owner">owner</option>
            </SelectField>
            <Button type="submit">Send invitation</Button>
          </form>
          {notice && <p className="mt-2 text-sm text-ok">{notice}</p>}
        </Panel>
      )}
      <ErrorNote>{error}</ErrorNote>
      <Panel title="Members">
        <table className="w-full text-sm">
          <thead className="text-left text-xs uppercase tracking-wide text-ink-soft">
            <tr>
              <th className="py-1">Name</th>
              <th>E-mail</th>
              <th>Role</th>
              <th />
            </tr>
          </thead>
          <tbody className="divide-y divide-rule">
            {data?.members.map((m) => (
              <tr key={m.userId}>
                <td className="py-2">{m.name}</td>
                <td>{m.email}</td>
                <td>
                  {isOwner ? (
                    <>
                      <select
                        aria-label={`Role of ${m.email}`}
                        aria-describedby={
                          roleError?.userId === m.userId ? `role-error-${m.userId}` : undefined
                        }
                        aria-invalid={roleError?.userId === m.userId || undefined}
                        className="rounded border border-rule bg-white px-2 py-1"
                        value={m.role}
                        onChange={(e) => changeRole(m.userId, e.target.value)}
                      >
                        <option value="viewer">viewer</option>
                        <option value="editor">editor</option>
                        <option value="owner">owner</option>
                      </select>
                      {roleError?.userId === m.userId && (
                        <p
                          id={`role-error-${m.userId}`}
                          role="alert"
                          className="mt-1 max-w-xs text-xs text-danger"
                        >
                          {roleError.message}
                        </p>
                      )}
                    </>
                  ) : (
                    m.role
                  )}
                </td>
                <td className="text-right">
                  {(isOwner || m.userId === myId) && (
                    <Button
                      variant="quiet"
                      onClick={() => {
                        if (
                          confirm(
                            m.userId === myId
                              ? 'Leave this project?'
                              : `Remove ${m.email} from the project?`,
                          )
                        )
                          run(() =>
                            api(`/api/projects/${projectId}/members/${m.userId}`, {
                              method: 'DELETE',
                            }),
                          );
                      }}
                    >
                      {m.userId === myId ? 'Leave' : 'Remove'}
                    </Button>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </Panel>
      {!!data?.invitations.length && (
        <Panel title="Pending invitations">
          <ul className="divide-y divide-rule text-sm">
            {data.invitations.map((i) => (
              <li key={i.id} className="flex items-center justify-between py-2">
                <span>
                  {i.email} — {i.role}, until {new Date(i.expiresAt).toLocaleDateString()}
                </span>
                {isOwner && (
                  <Button
                    variant="quiet"
                    onClick={() =>
                      run(() =>
                        api(`/api/projects/${projectId}/invitations/${i.id}`, { method: 'DELETE' }),
                      )
                    }
                  >
                    Revoke
                  </Button>
                )}
              </li>
            ))}
          </ul>
        </Panel>
      )}
    </div>
  );
}
